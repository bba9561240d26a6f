#!/usr/bin/python3
"""Galactic <-> ICRS reference conversions from Debian's python3-astropy.

astropy defines its Galactic frame from FK4 (B1950) through its own chain of
transformations, not from the rounded Hipparcos matrix, so skyspan agrees with
it only to about 1e-5 deg. Prints JSON on stdout.
Run: /usr/bin/python3 scripts/astropy_frames.py
"""
import json
import sys

import astropy
import astropy.units as u
import numpy as np
from astropy.coordinates import SkyCoord

rng = np.random.default_rng(7)
n = 200
lon = np.concatenate([[0.0, 0.0, 90.0, 180.0, 359.999], rng.uniform(0, 360, n)])
lat = np.concatenate([[0.0, 90.0, 0.0, -89.9, 10.0], np.degrees(np.arcsin(rng.uniform(-1, 1, n)))])
gal = SkyCoord(l=lon * u.deg, b=lat * u.deg, frame="galactic").icrs
eq = SkyCoord(ra=lon * u.deg, dec=lat * u.deg, frame="icrs").galactic
json.dump({
    "astropy": astropy.__version__,
    "lonDeg": lon.tolist(), "latDeg": lat.tolist(),
    "galToEq": {"raDeg": gal.ra.deg.tolist(), "decDeg": gal.dec.deg.tolist()},
    "eqToGal": {"lDeg": eq.l.deg.tolist(), "bDeg": eq.b.deg.tolist()},
}, sys.stdout)
