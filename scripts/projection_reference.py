#!/usr/bin/python3
"""Reference for skyspan's template projection (test/scaling/templateProjection.test.ts).

Reads JSON {"p": [...], "t": [...], "a": [...] or null} on stdin (no blanks)
and prints {"weighted": N_w, "unweighted": N_u}: the least-squares
normalisation N minimising sum a (p - N t)^2, solved by numpy.linalg.lstsq on
the rows scaled by sqrt(a) (weighted; a = 1 when null), and the plain
numpy.linalg.lstsq of p on t (unweighted). An independent route to
N = sum(a p t) / sum(a t^2).
"""
import json
import sys

import numpy as np

job = json.load(sys.stdin)
p = np.asarray(job["p"], dtype=float)
t = np.asarray(job["t"], dtype=float)
a = np.ones_like(t) if job.get("a") is None else np.asarray(job["a"], dtype=float)
w = np.sqrt(a)
nw = np.linalg.lstsq((w * t)[:, None], w * p, rcond=None)[0][0]
nu = np.linalg.lstsq(t[:, None], p, rcond=None)[0][0]
json.dump({"weighted": float(nw), "unweighted": float(nu)}, sys.stdout)
