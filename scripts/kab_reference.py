#!/usr/bin/python3
"""Independent evaluation of pp emissivities with the Kelner, Aharonian &
Bugayov 2006 (Phys. Rev. D 74, 034018) functions, by scipy's adaptive quad, for
checking the quadrature in src/physics/hadronic/emissivity.ts. The functions
are transcribed separately here (same source forms: gamma rays eqs. 58-61,
electrons eqs. 62-65, muon neutrinos from pions eqs. 66-69, cross-section
eq. 79; the 2009 erratum not read), so a typo in
one copy shows up as a mismatch.

Input (stdin, JSON): [{"secondary": "gamma"|"nuMuFromPion"|"electronType", "E": GeV, "index": Gamma}, ...]
for a proton spectrum E_p^-Gamma (no normalisation, no factor c).
Output: JSON list of integral sigma_inel[mb](E_p) E_p^-Gamma F(E/E_p, E_p) dE_p/E_p over x in [1e-3, 1].

Other request kinds in the same list (for test/physics/hadronic/kab2006.test.ts):
  {"secondary": .., "x": x, "Ep": GeV}        -> F(x, E_p), the function itself
  {"fraction": .., "Ep": GeV}                 -> int_{1e-3}^{x_max} x F(x, E_p) dx, energy fraction
  {"sigma": GeV}                              -> sigma_inel in mb (eq. 79)
"""
import json
import sys

import numpy as np
from scipy.integrate import quad


def shape(y, B, b, k):
    yb = y ** b
    ly = np.log(y)
    q = 1 + k * yb * (1 - yb)
    return B * ly / y * ((1 - yb) / q) ** 4 * (1 / ly - 4 * b * yb / (1 - yb) - 4 * k * b * yb * (1 - 2 * yb) / q)


def f_gamma(x, ep):
    L = np.log(ep / 1000.0)
    return shape(x, 1.30 + 0.14 * L + 0.011 * L * L, 1 / (1.79 + 0.11 * L + 0.008 * L * L), 1 / (0.801 + 0.049 * L + 0.014 * L * L))


def f_numu1(x, ep):
    if x >= 0.427:
        return 0.0
    L = np.log(ep / 1000.0)
    return shape(x / 0.427, 1.75 + 0.204 * L + 0.010 * L * L, 1 / (1.67 + 0.111 * L + 0.0038 * L * L), 1.07 - 0.086 * L + 0.002 * L * L)


def f_e(x, ep):
    L = np.log(ep / 1000.0)
    B = 1 / (69.5 + 2.65 * L + 0.3 * L * L)
    b = (0.201 + 0.062 * L + 0.00042 * L * L) ** -0.25
    k = (0.279 + 0.141 * L + 0.0172 * L * L) / (0.3 + (2.3 + L) ** 2)
    lx = np.log(x)
    return B * (1 + k * lx * lx) ** 3 / (x * (1 + 0.3 / x ** b)) * (-lx) ** 5


def sigma_mb(ep):
    L = np.log(ep / 1000.0)
    return (34.3 + 1.88 * L + 0.25 * L * L) * (1 - (1.22 / ep) ** 4) ** 2


FUNCS = {'gamma': f_gamma, 'nuMuFromPion': f_numu1, 'electronType': f_e}


def emissivity(sec, E, G):
    F = FUNCS[sec]
    hi = np.log(0.427) if sec == 'nuMuFromPion' else 0.0
    g = lambda lx: (lambda x: sigma_mb(E / x) * (E / x) ** (-G) * F(x, E / x))(np.exp(lx))
    return quad(g, np.log(1e-3), hi, epsabs=0, epsrel=1e-11, limit=400)[0]


def energy_fraction(sec, ep):
    F = FUNCS[sec]
    hi = 0.427 if sec == 'nuMuFromPion' else 1.0
    return quad(lambda x: x * F(x, ep), 1e-3, hi, epsabs=0, epsrel=1e-11, limit=400)[0]


def one(r):
    if 'sigma' in r:
        return sigma_mb(float(r['sigma']))
    if 'fraction' in r:
        return energy_fraction(r['fraction'], float(r['Ep']))
    if 'x' in r:
        return float(FUNCS[r['secondary']](float(r['x']), float(r['Ep'])))
    return emissivity(r['secondary'], float(r['E']), float(r['index']))


def main():
    req = json.loads(sys.stdin.read())
    print(json.dumps([one(r) for r in req]))


if __name__ == '__main__':
    main()
