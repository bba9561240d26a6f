#!/usr/bin/python3
"""Reference values for skyspan's template tests, from numpy/scipy (Debian).

Usage: templates_reference.py gauss N1 N2 ... -> JSON list of {x, w} of numpy.polynomial.legendre.leggauss(N)
       templates_reference.py i0e X1 X2 ...   -> JSON list of scipy.special.i0e(x)
       templates_reference.py dlcolumn        -> JSON {pole_cm2, n0}: Dickey & Lockman 1990 profile
                                                 (Ferriere 2001 eq. 8) integrated by scipy.integrate.quad
"""
import json
import sys

import numpy as np
from scipy import integrate, special

PC_CM = 3.085677581491367e18  # IAU 2015 parsec in cm


def dl(z_pc):
    return (0.395 * np.exp(-z_pc**2 / (2 * 90.0**2)) + 0.107 * np.exp(-z_pc**2 / (2 * 225.0**2))
            + 0.064 * np.exp(-abs(z_pc) / 403.0))


def main():
    mode = sys.argv[1]
    if mode == 'gauss':
        out = []
        for n in sys.argv[2:]:
            x, w = np.polynomial.legendre.leggauss(int(n))
            out.append({'x': x.tolist(), 'w': w.tolist()})
        print(json.dumps(out))
    elif mode == 'i0e':
        print(json.dumps([float(special.i0e(float(v))) for v in sys.argv[2:]]))
    elif mode == 'dlcolumn':
        col, _ = integrate.quad(dl, 0, 30000.0, limit=500, epsabs=0, epsrel=1e-12, points=[90, 225, 403, 2000])
        print(json.dumps({'pole_cm2': col * PC_CM, 'n0': float(dl(0.0))}))
    else:
        raise SystemExit('unknown mode ' + mode)


if __name__ == '__main__':
    main()
