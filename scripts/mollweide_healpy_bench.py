#!/usr/bin/python3
"""Reference timing for bench/render.ts: healpy's Mollweide projector
(healpy.projector.MollweideProj, xsize 2048 -> 2048 x 1024 image) applied to a
full-sky Nside 2048 map, the projector's grid built once and the projection
timed alone. Prints JSON: {"gridSeconds": ..., "projectSeconds": ..., "width": ..., "height": ...}.
Usage: /usr/bin/python3 scripts/mollweide_healpy_bench.py [nside] [xsize]
"""
import json
import sys
import time

import healpy as hp
import numpy as np

nside = int(sys.argv[1]) if len(sys.argv) > 1 else 2048
xsize = int(sys.argv[2]) if len(sys.argv) > 2 else 2048
m = np.arange(hp.nside2npix(nside), dtype=np.float32)
t0 = time.perf_counter()
proj = hp.projector.MollweideProj(xsize=xsize)
f = lambda x, y, z: hp.vec2pix(nside, x, y, z)
img = proj.projmap(m, f)  # first call: builds the grid of directions
t1 = time.perf_counter()
img = proj.projmap(m, f)  # second call: the per-image work
t2 = time.perf_counter()
print(json.dumps({"gridSeconds": t1 - t0, "projectSeconds": t2 - t1, "width": int(img.shape[1]), "height": int(img.shape[0])}))
