#!/usr/bin/python3
"""numpy-vectorised reference of skyspan's template integrand, for bench/templates.ts.

Reads a folder written by the bench: params.json, grid.f32 (model values[((iR*nU)+iU)*nE+e]),
s.f64 and w.f64 (sample distances and weights, kpc), surv.f64 (exp(-s_k/lambda_e) at [k*nE+e]).
Integrates every RING pixel centre (healpy.pix2ang) with the same samples, bilinear interpolation in
(R, u = z/(|z|+z_s)) and absorption weights, writes out.f64 (absorbed, plane-major) and prints
{"seconds": compute time} as JSON.
"""
import json
import sys
import time

import healpy as hp
import numpy as np


def main():
    d = sys.argv[1]
    p = json.load(open(f'{d}/params.json'))
    nR, nU, nE, nside = p['nR'], p['nU'], p['nE'], p['nside']
    grid = np.fromfile(f'{d}/grid.f32', dtype=np.float32).reshape(nR, nU, nE)
    s = np.fromfile(f'{d}/s.f64')
    w = np.fromfile(f'{d}/w.f64')
    surv = np.fromfile(f'{d}/surv.f64').reshape(len(s), nE)
    t0 = time.perf_counter()
    npix = hp.nside2npix(nside)
    theta, phi = hp.pix2ang(nside, np.arange(npix))
    cb, sb = np.sin(theta), np.cos(theta)
    dx, dy = -cb * np.cos(phi), -cb * np.sin(phi)
    inv_dr, zs, inv_du = 1.0 / p['dRKpc'], p['zScaleKpc'], (nU - 1) / 2.0
    out = np.empty((nE, npix))
    ws = w[:, None] * surv  # (K, nE)
    chunk = 1024
    for a in range(0, npix, chunk):
        b = min(a + chunk, npix)
        x = p['rSunKpc'] + s[None, :] * dx[a:b, None]
        y = s[None, :] * dy[a:b, None]
        z = p['zSunKpc'] + s[None, :] * sb[a:b, None]
        fr = np.sqrt(x * x + y * y) * inv_dr
        ir = fr.astype(np.int64)
        ok = ir < nR - 1
        ir = np.where(ok, ir, 0)
        tr = np.where(ok, fr - ir, 0.0)
        fu = (z / (np.abs(z) + zs) + 1.0) * inv_du
        iu = np.minimum(fu.astype(np.int64), nU - 2)
        tu = fu - iu
        v = ((1 - tr) * (1 - tu))[..., None] * grid[ir, iu] + ((1 - tr) * tu)[..., None] * grid[ir, iu + 1] \
            + (tr * (1 - tu))[..., None] * grid[ir + 1, iu] + (tr * tu)[..., None] * grid[ir + 1, iu + 1]
        v *= ok[..., None]
        out[:, a:b] = np.einsum('pke,ke->ep', v, ws)
    seconds = time.perf_counter() - t0
    out.tofile(f'{d}/out.f64')
    print(json.dumps({'seconds': seconds}))


if __name__ == '__main__':
    main()
