/**
 * Ensemble quantiles. Unweighted: numpy.percentile's default ('linear',
 * Hyndman & Fan 1996, Am. Stat. 50, 361, type 7) through
 * scripts/quantile_reference.py. Weighted: the definition documented in
 * src/scaling/quantiles.ts, recomputed independently with numpy.interp by the
 * same script; and its reduction to type 7 with equal weights (property).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quantile, quantiles } from '../../src/scaling/quantiles.js';
import { requirePython, runPython, skipWithoutPython } from '../helpers/python.js';
import { InputError } from '../../src/core/errors.js';

const Q = [0, 0.16, 0.5, 0.84, 1, 0.025, 0.975];

describe('quantiles', () => {
  it('worked example: median of 1..4 is 2.5 (numpy.percentile default; from memory)', () => {
    expect(quantile([4, 1, 3, 2], null, 0.5)).toBe(2.5);
  });

  it.skipIf(skipWithoutPython)('matches numpy.percentile (linear) and the weighted definition via numpy.interp', () => {
    requirePython(); // under CI=true a missing reference fails here
    const sets = [
      { values: [3.2, 1.1, 7.5, 2.2, 9.9, 4.4, 0.3], weights: [1, 2, 0.5, 3, 1, 0, 2] },
      { values: [10, 20], weights: [1, 3] },
      { values: [5, 5, 1, 8, 2, 2, 9, 6, 4, 3, 7], weights: [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0, 1.1] },
    ];
    for (const s of sets) {
      const ref = JSON.parse(runPython('scripts/quantile_reference.py', [], JSON.stringify({ ...s, q: Q })));
      const lin = quantiles(s.values, null, Q);
      const wtd = quantiles(s.values, s.weights, Q);
      lin.forEach((v, i) => expect(v).toBeCloseTo(ref.linear[i], 12));
      wtd.forEach((v, i) => expect(v).toBeCloseTo(ref.weighted[i], 12));
    }
  });

  it('equal weights reduce to the unweighted definition (property, seeded)', () => {
    fc.assert(fc.property(
      fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 1, maxLength: 30 }),
      fc.double({ min: 0.01, max: 100, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }),
      (xs, w, q) => {
        const a = quantile(xs, null, q);
        const b = quantile(xs, xs.map(() => w), q);
        expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * (1 + Math.abs(a)));
      }), { seed: 20261202, numRuns: 300 });
  });

  it('rejects empty sets, non-finite values and bad weights', () => {
    expect(() => quantile([], null, 0.5)).toThrow(InputError);
    expect(() => quantile([1, NaN], null, 0.5)).toThrow(/not finite/);
    expect(() => quantile([1, 2], [1, -1], 0.5)).toThrow(/weight/);
    expect(() => quantile([1, 2], [0, 0], 0.5)).toThrow(/zero weights/);
    expect(() => quantile([1, 2], null, 1.5)).toThrow(/outside 0..1/);
  });
});
