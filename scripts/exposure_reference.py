#!/usr/bin/python3
"""Reference values for the relative exposure of a ground-based array versus
declination, by direct numerical integration with scipy (no closed form).

For a site at latitude a0 accepting zenith angles up to theta_m, running
uniformly in sidereal time, the cos(zenith)-weighted exposure of declination
delta is proportional to one half of the integral over hour angle h of
cos(zenith(h)) where zenith(h) < theta_m, with
cos(zenith) = sin(a0) sin(delta) + cos(a0) cos(delta) cos(h)
(spherical astronomy; compare Sommers 2001, Astropart. Phys. 14, 271, whose
closed form skyspan implements). The time-weighted exposure is one half of the
length of that hour-angle range.

The edges of the hour-angle range are found with scipy.optimize.brentq on
cos(zenith(h)) - cos(theta_m), the integral with scipy.integrate.quad.

Usage: /usr/bin/python3 scripts/exposure_reference.py > out.json
Output (JSON): {"grid": [[latDeg, cutDeg, decDeg, zenithWeighted, timeWeighted], ...],
                "spot": {"latDeg": 30, "cutDeg": 45, "values": {dec: normalised}, "maxDecDeg": ..., "maxRaw": ...}}
"""
import json
import math
import sys

from scipy import integrate, optimize


def cos_zenith(h, a0, dec):
    return math.sin(a0) * math.sin(dec) + math.cos(a0) * math.cos(dec) * math.cos(h)


def hour_angle_edge(a0, dec, cut):
    """Largest h in [0, pi] with zenith < cut, found numerically (0 if never, pi if always)."""
    c = math.cos(cut)
    f = lambda h: cos_zenith(h, a0, dec) - c
    if f(0.0) <= 0:
        return 0.0
    if f(math.pi) >= 0:
        return math.pi
    return optimize.brentq(f, 0.0, math.pi, xtol=1e-15, rtol=1e-15, maxiter=500)


def exposure(a0, dec, cut):
    h = hour_angle_edge(a0, dec, cut)
    if h == 0.0:
        return 0.0, 0.0
    val, _ = integrate.quad(lambda x: cos_zenith(x, a0, dec), 0.0, h, epsabs=1e-14, epsrel=1e-13, limit=200)
    # one half of the integral over [-h, h] is the integral over [0, h]
    return val, h


def main():
    d = math.radians
    grid = []
    for lat in (-35.0, 0.0, 19.0, 33.0, 60.0):
        for cut in (30.0, 45.0, 60.0, 70.0):
            for k in range(-90, 91, 3):
                dec = float(k)
                z, t = exposure(d(lat), d(dec), d(cut))
                grid.append([lat, cut, dec, z, t])
    a0, cut = d(30.0), d(45.0)
    res = optimize.minimize_scalar(lambda x: -exposure(a0, x, cut)[0], bounds=(d(0.0), d(75.0)), method='bounded',
                                   options={'xatol': 1e-12})
    max_raw = -res.fun
    values = {str(v): exposure(a0, d(v), cut)[0] / max_raw for v in (-20, 0, 30, 60, 75)}
    out = {"grid": grid, "spot": {"latDeg": 30, "cutDeg": 45, "values": values,
                                  "maxDecDeg": math.degrees(res.x), "maxRaw": max_raw}}
    json.dump(out, sys.stdout)


if __name__ == '__main__':
    main()
