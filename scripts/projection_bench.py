#!/usr/bin/python3
"""Reference timing for bench/projection.ts: the acceptance-weighted projection
N = sum(a p t) / sum(a t^2) over n pixels with numpy (float64, pairwise sums),
on the same made-up arrays the benchmark builds:
t_i = 1 + 0.5 sin(0.001 i), p_i = 2 t_i + 0.1 cos(0.003 i), a_i = 0.5 + 0.5 sin(0.0007 i)^2.
Argument: n. Prints JSON {"seconds": best of 5 (the sums only), "N": value}.
"""
import json
import sys
import time

import numpy as np

n = int(sys.argv[1])
i = np.arange(n, dtype=np.float64)
t = 1 + 0.5 * np.sin(0.001 * i)
p = 2 * t + 0.1 * np.cos(0.003 * i)
a = 0.5 + 0.5 * np.sin(0.0007 * i) ** 2
best = float("inf")
for _ in range(5):
    t0 = time.perf_counter()
    at = a * t
    N = np.sum(at * p) / np.sum(at * t)
    best = min(best, time.perf_counter() - t0)
print(json.dumps({"seconds": best, "N": float(N)}))
