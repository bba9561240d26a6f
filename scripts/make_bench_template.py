#!/usr/bin/python3
"""Writes the benchmark template of bench/factors.ts: an invented, analytic
Galactic template at Nside 2048 (float32, RING, COORDSYS G), the formula of
scripts/factor_reference.py evaluated at pixel centres, with healpy.write_map.

usage: /usr/bin/python3 scripts/make_bench_template.py OUT.fits [NSIDE]
"""
import sys

import healpy as hp
import numpy as np

sys.path.insert(0, __file__.rsplit("/", 1)[0])
from factor_reference import template_formula  # noqa: E402

out = sys.argv[1]
nside = int(sys.argv[2]) if len(sys.argv) > 2 else 2048
t = template_formula(nside).astype(np.float32)
hp.write_map(out, t, nest=False, coord="G", dtype=np.float32, overwrite=True, column_names=["T"])
