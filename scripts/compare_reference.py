#!/usr/bin/python3
"""Reference values for skyspan's compare/ layer, from Debian's python3-scipy.

Prints one JSON object:
  erfc, ndtr, ndtri     scipy.special at fixed arguments
  chi2sf                scipy.stats.chi2.sf(x, k) at fixed (x, k)
  splitNormalQuantiles  quantiles of a split normal (mode 10, sigma_low 1, sigma_high 3),
                        found by integrating its density (Wallis 2014, Statistical
                        Science 29, 106, eq. 1) with scipy.integrate.quad and solving
                        CDF(x) = p with scipy.optimize.brentq: independent of the
                        closed form used in src/compare/splitNormal.ts.
  constants             the numbers written out in test/compare/*.test.ts, so each one is a
                        printed output of this script: twoSidedP (2 norm.sf(s), s = 1, 2, 3, 5),
                        ulOneSidedP90 (norm.sf(2 norm.ppf(0.9))), z90 and z95 (norm.ppf),
                        chi2ppf ([q, k, chi2.ppf(q, k)]), sigmaTwoSided21026 (norm.isf(chi2.ppf(0.95, 12) / 1000 / 2)).
Run: /usr/bin/python3 scripts/compare_reference.py
"""
import json
import math
from scipy import special, stats, integrate, optimize

xs = [-8.0, -3.0, -1.0, -0.2, 0.0, 0.3, 1.0, 2.4, 2.6, 4.0, 6.0, 10.0, 20.0]
ps = [1e-12, 1e-6, 0.00135, 0.0227501, 0.158655, 0.3, 0.5, 0.7, 0.841345, 0.99, 0.999999]
chi = [(0.5, 1), (1.0, 1), (4.0, 1), (9.0, 1), (3.0, 2), (10.0, 3), (2.0, 5), (20.0, 7), (40.0, 10), (5.0, 30), (100.0, 50)]

mode, slo, shi = 10.0, 1.0, 3.0
A = math.sqrt(2 / math.pi) / (slo + shi)


def pdf(x):
    s = slo if x < mode else shi
    return A * math.exp(-(x - mode) ** 2 / (2 * s * s))


def cdf(x):
    if x <= mode:
        return integrate.quad(pdf, -math.inf, x, epsabs=1e-14, epsrel=1e-12)[0]
    return slo / (slo + shi) + integrate.quad(pdf, mode, x, epsabs=1e-14, epsrel=1e-12)[0]


qp = [0.02275, 0.1, 0.15865, 0.25, 0.5, 0.75, 0.84135, 0.97725]
qs = [optimize.brentq(lambda x: cdf(x) - p, mode - 20, mode + 40, xtol=1e-13) for p in qp]

print(json.dumps({
    'erfc': [[x, float(special.erfc(x))] for x in xs],
    'ndtr': [[x, float(special.ndtr(x))] for x in xs],
    'ndtri': [[p, float(special.ndtri(p))] for p in ps],
    'chi2sf': [[x, k, float(stats.chi2.sf(x, k))] for x, k in chi],
    'splitNormal': {'mode': mode, 'sigmaLow': slo, 'sigmaHigh': shi,
                    'quantiles': [[p, q] for p, q in zip(qp, qs)]},
    'constants': {
        'twoSidedP': [[sg, float(2 * stats.norm.sf(sg))] for sg in (1.0, 2.0, 3.0, 5.0)],
        'ulOneSidedP90': float(stats.norm.sf(2 * stats.norm.ppf(0.9))),
        'z90': float(stats.norm.ppf(0.9)), 'z95': float(stats.norm.ppf(0.95)),
        'chi2ppf': [[q, k, float(stats.chi2.ppf(q, k))] for q, k in ((0.95, 12), (0.999, 9))],
        'sigmaTwoSided21026': float(stats.norm.isf(stats.chi2.ppf(0.95, 12) / 1000 / 2)),
    },
}))
