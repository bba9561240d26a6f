#!/usr/bin/python3
"""Reference quantiles for skyspan's ensemble summary (test/scaling/quantiles.test.ts).

Reads JSON {"values": [...], "weights": [...] or null, "q": [...]} on stdin and
prints {"linear": [...], "weighted": [...] or null}:
- linear: numpy.percentile(values, 100 q) with numpy's default method
  ('linear', Hyndman & Fan 1996 type 7);
- weighted: skyspan's documented weighted generalisation, evaluated with
  numpy.interp: sorted values, normalised weights w, cumulative C,
  u_i = (C_i - w_i/2 - w_1/2) / (1 - w_1/2 - w_n/2), x interpolated in u.
"""
import json
import sys

import numpy as np

job = json.load(sys.stdin)
x = np.asarray(job["values"], dtype=float)
q = np.asarray(job["q"], dtype=float)
out = {"linear": np.percentile(x, 100 * q).tolist(), "weighted": None}
if job.get("weights") is not None:
    w = np.asarray(job["weights"], dtype=float)
    keep = w > 0
    x, w = x[keep], w[keep]
    order = np.argsort(x, kind="stable")
    x, w = x[order], w[order] / w.sum()
    c = np.cumsum(w)
    u = (c - w / 2 - w[0] / 2) / (1 - w[0] / 2 - w[-1] / 2)
    out["weighted"] = np.interp(q, u, x).tolist()
json.dump(out, sys.stdout)
