#!/usr/bin/python3
"""Reference for `skyspan remap` tests: reads a map with healpy.read_map,
degrades or upgrades it with healpy.ud_grade (averaging, blanks excluded:
pess=False) and reorders it, printing the values as JSON (null for NaN).
Arguments: input file, output Nside, output ordering (RING or NESTED)."""
import json
import sys
import warnings

import healpy as hp
import numpy as np

path, nside_out, order_out = sys.argv[1], int(sys.argv[2]), sys.argv[3]
with warnings.catch_warnings():
    warnings.simplefilter("ignore")
    m, h = hp.read_map(path, nest=None, h=True, dtype=np.float64)
    order_in = dict(h)["ORDERING"].strip()
    out = hp.ud_grade(m, nside_out, pess=False, order_in=order_in, order_out=order_out)
print(json.dumps([None if not np.isfinite(v) else float(v) for v in out]))
