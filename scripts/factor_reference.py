#!/usr/bin/python3
"""Reference extrapolation factors computed with healpy and numpy only.

Used by skyspan's tests (test/scaling/) and benchmark (bench/factors.ts) as the
outside check of the factor kernels. Reads a JSON job on stdin, prints JSON.

The job: a measured region A = (declination band seen from a site at latitude
`site_lat_deg` with zenith angle <= `zenith_max_deg`) AND (Galactic box
l in `box_l_deg`, b in `box_b_deg`) MINUS (discs `discs_deg` = [[l, b, r], ...]
in Galactic coordinates, healpy.query_disc with inclusive=False), all by pixel
centre; targets: the latitude strip |b| < `strip_b_deg` at all longitudes, and
the whole sky. Template (Galactic, RING), either from a FITS file
(`template_fits`) or from the analytic formula below evaluated at pixel centres:

    T(l, b) = (1 + 0.5 cos l) exp(-b^2 / (2 (5 deg)^2)) + 0.05 + 0.02 sin(3 l) cos b

with pixels p where p % `blank_stride` == 0 set to healpy.UNSEEN when
`blank_stride` > 0. Optional exposure weight of A: w = cos(dec - site_lat)
(an analytic stand-in, `exposure`: true).

Definitions (as in skyspan's src/scaling/factorRow.ts): means over valid
pixels; <T>_A,w = sum(w T)/sum(w) over A; k_I = <T>_B/<T>_A,w;
k_F = <T>_B Omega_B/<T>_A,w with Omega_B = pixel count x pixel area;
k_4pi = <T>_sky/<T>_A,w; covered = sum over A and B of T / sum over B of T.
"""
import json
import resource
import sys
import time

import healpy as hp
import numpy as np


def template_formula(nside):
    theta, phi = hp.pix2ang(nside, np.arange(hp.nside2npix(nside)))
    b = np.pi / 2 - theta
    sig = np.radians(5.0)
    return (1 + 0.5 * np.cos(phi)) * np.exp(-b * b / (2 * sig * sig)) + 0.05 + 0.02 * np.sin(3 * phi) * np.cos(b)


def measured_mask(nside, job):
    npix = hp.nside2npix(nside)
    theta, phi = hp.pix2ang(nside, np.arange(npix))
    l_deg = np.degrees(phi)
    b_deg = 90.0 - np.degrees(theta)
    rot = hp.Rotator(coord=["G", "C"])
    theta_eq, _ = rot(theta, phi)
    dec_deg = 90.0 - np.degrees(theta_eq)
    lat, zmax = job["site_lat_deg"], job["zenith_max_deg"]
    band = (dec_deg >= lat - zmax) & (dec_deg <= lat + zmax)
    l1, l2 = job["box_l_deg"]
    b1, b2 = job["box_b_deg"]
    box = (l_deg >= l1) & (l_deg <= l2) & (b_deg >= b1) & (b_deg <= b2)
    mask = band & box
    for l, b, r in job["discs_deg"]:
        vec = hp.ang2vec(l, b, lonlat=True)
        mask[hp.query_disc(nside, vec, np.radians(r), inclusive=False)] = False
    exposure = np.cos(np.radians(dec_deg - lat)) if job.get("exposure") else None
    strip = np.abs(b_deg) < job["strip_b_deg"]
    return mask, strip, exposure


def factors(t, mask_a, w, targets, omega_pix):
    valid = np.isfinite(t) & (t != hp.UNSEEN)
    va = mask_a & valid
    wa = np.ones_like(t) if w is None else w
    mean_a = np.sum(wa[va] * t[va]) / np.sum(wa[va])
    mean_sky = np.sum(t[valid]) / np.count_nonzero(valid)
    out = {"meanMeasured": mean_a, "fourPiFactor": mean_sky / mean_a,
           "solidAngleMeasuredSr": np.count_nonzero(mask_a) * omega_pix,
           "blankMeasured": int(np.count_nonzero(mask_a & ~valid)), "targets": {}}
    for name, m in targets.items():
        vb = m & valid
        mean_b = np.sum(t[vb]) / np.count_nonzero(vb)
        omega_b = np.count_nonzero(m) * omega_pix
        out["targets"][name] = {
            "meanTarget": mean_b, "kI": mean_b / mean_a, "kFSr": mean_b * omega_b / mean_a,
            "solidAngleTargetSr": omega_b,
            "coveredFluxFraction": np.sum(t[vb & mask_a]) / np.sum(t[vb]),
            "blankTarget": int(np.count_nonzero(m & ~valid))}
    return out


def run(job):
    c0 = time.process_time()
    t0 = time.perf_counter()
    if job.get("template_fits"):
        t = hp.read_map(job["template_fits"], dtype=np.float32, nest=False).astype(np.float64)
        nside = hp.npix2nside(t.size)
    else:
        nside = job["nside"]
        t = template_formula(nside)
    t1 = time.perf_counter()
    stride = job.get("blank_stride", 0)
    if stride:
        t[::stride] = hp.UNSEEN
    mask_a, strip, w = measured_mask(nside, job)
    targets = {"strip": strip, "sky": np.ones(t.size, dtype=bool)}
    res = factors(t, mask_a, w, targets, hp.nside2pixarea(nside))
    t2 = time.perf_counter()
    timing = {"readSeconds": t1 - t0, "computeSeconds": t2 - t1, "totalSeconds": t2 - t0,
              "cpuSeconds": time.process_time() - c0,
              "maxRssBytes": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss * 1024}
    res["nside"] = nside
    res["timing"] = timing
    if job.get("pixels"):
        res["pixelsMeasured"] = np.flatnonzero(mask_a).tolist()
        res["pixelsStrip"] = np.flatnonzero(strip).tolist()
        if w is not None:
            res["exposureMeasured"] = w[mask_a].tolist()
    return res


def main():
    """One job object in, one result out; {"jobs": [...]} in, a list out."""
    job = json.load(sys.stdin)
    json.dump([run(j) for j in job["jobs"]] if "jobs" in job else run(job), sys.stdout)


if __name__ == "__main__":
    main()
