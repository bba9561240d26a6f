#!/usr/bin/python3
"""Reference values for skyspan's HEALPix tests, from Debian's python3-healpy.

Prints one JSON document on stdout: pixel centres (pix2ang) and ring2nest for
small Nside, ang2pix for seeded random and edge directions at Nside up to 8192,
get_interp_weights, ud_grade (with blanks), and Rotator.rotate_map_pixel of a
smooth map. Run: /usr/bin/python3 scripts/healpy_reference.py
"""
import json
import sys

import healpy as hp
import numpy as np

rng = np.random.default_rng(20261202)
out = {"healpy": hp.__version__}

# Pixel centres and RING -> NESTED for every pixel.
out["pix2ang"] = {}
for nside in (1, 2, 4, 8, 16):
    ipix = np.arange(hp.nside2npix(nside))
    th, ph = hp.pix2ang(nside, ipix)
    out["pix2ang"][str(nside)] = {
        "theta": th.tolist(), "phi": ph.tolist(),
        "ring2nest": hp.ring2nest(nside, ipix).tolist(),
    }

# Directions: uniform on the sphere, plus poles, phi wrap and ring boundaries.
n = 400
theta = np.arccos(rng.uniform(-1, 1, n))
phi = rng.uniform(0, 2 * np.pi, n)
edge_t = [0.0, 1e-9, np.pi, np.pi - 1e-9, np.arccos(2 / 3), np.arccos(-2 / 3), np.pi / 2, np.pi / 2, 1.0, 2.0]
edge_p = [0.0, 1.0, 0.0, 4.0, 0.3, 5.0, 0.0, 2 * np.pi - 1e-12, 2 * np.pi - 1e-9, 1e-12]
theta = np.concatenate([theta, edge_t])
phi = np.concatenate([phi, edge_p])
out["directions"] = {"theta": theta.tolist(), "phi": phi.tolist()}
out["ang2pix"] = {}
for nside in (1, 4, 64, 1024, 8192):
    out["ang2pix"][str(nside)] = {
        "ring": hp.ang2pix(nside, theta, phi).tolist(),
        "nest": hp.ang2pix(nside, theta, phi, nest=True).tolist(),
    }

# Bilinear interpolation weights (RING).
out["interp"] = {}
for nside in (1, 4, 32):
    p, w = hp.get_interp_weights(nside, theta, phi)
    out["interp"][str(nside)] = {"pix": p.T.tolist(), "w": w.T.tolist()}

# ud_grade of a map with blanks (RING and NESTED input), degrade and upgrade.
nside_in = 8
npix = hp.nside2npix(nside_in)
base = np.cos(np.arange(npix) * 0.37) * 3 + np.arange(npix) * 0.01
blanked = base.copy()
blanked[rng.choice(npix, 90, replace=False)] = hp.UNSEEN
blanked[hp.nest2ring(nside_in, np.arange(16))] = hp.UNSEEN  # a whole Nside-2 parent is blank
out["udgrade"] = {
    "nside": nside_in,
    "base": base.tolist(),
    "blanked": blanked.tolist(),
    "ring_to_2": hp.ud_grade(blanked, 2).tolist(),
    "ring_to_4": hp.ud_grade(blanked, 4).tolist(),
    "ring_to_16": hp.ud_grade(blanked, 16).tolist(),
    "ring_to_2_power_m2_base": hp.ud_grade(base, 2, power=-2).tolist(),
    "ring_to_2_power_m2_blanked": hp.ud_grade(blanked, 2, power=-2).tolist(),
    "ring_to_32_power_m2_base": hp.ud_grade(base, 32, power=-2).tolist(),
    "nest_to_4": hp.ud_grade(hp.reorder(blanked, r2n=True), 4, order_in="NESTED").tolist(),
}

# Rotation of a smooth map (dipole + quadrupole) from Galactic to equatorial.
nside_r = 32
th, ph = hp.pix2ang(nside_r, np.arange(hp.nside2npix(nside_r)))
z = np.cos(th)
smooth = 0.6 * np.sin(th) * np.cos(ph) - 0.3 * np.sin(th) * np.sin(ph) + 0.5 * z + 0.4 * (3 * z * z - 1) / 2
rot = hp.Rotator(coord=["G", "C"])
out["rotate"] = {"nside": nside_r, "input": smooth.tolist(), "output": rot.rotate_map_pixel(smooth).tolist()}

# Spot values written out in test/sphere/healpixGeometry.test.ts and reference.test.ts.
out["spot"] = {
    "pix2ang_4_0": [float(v) for v in hp.pix2ang(4, 0)],
    "ang2pix_4_equator_phi0": [int(hp.ang2pix(4, np.pi / 2, 0.0)), int(hp.ang2pix(4, np.pi / 2, 0.0, nest=True))],
    "pixarea_1024": float(hp.nside2pixarea(1024)),
    "resol_1024_arcmin": float(hp.nside2resol(1024, arcmin=True)),
    "interp_4_001_03": [[int(v) for v in hp.get_interp_weights(4, 0.01, 0.3)[0]],
                        [float(v) for v in hp.get_interp_weights(4, 0.01, 0.3)[1]]],
    "unseen": float(hp.UNSEEN),
}

json.dump(out, sys.stdout)
