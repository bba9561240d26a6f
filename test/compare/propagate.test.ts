import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../src/core/errors.js';
import { checkLinear, linearPropagate, monteCarlo } from '../../src/compare/propagate.js';
import { summariseSamples } from '../../src/compare/summary.js';
import { quantileSorted as percentileSorted } from '../../src/scaling/quantiles.js';

describe('summaries', () => {
  it('percentiles follow Hyndman & Fan 1996 definition 7 (numpy default)', () => {
    // numpy.percentile([1, 2, 3, 4], [16, 50, 84]) = 1.48, 2.5, 3.52 (definition 7: h = (n - 1) q).
    const x = [1, 2, 3, 4];
    expect(percentileSorted(x, 0.16)).toBeCloseTo(1.48, 12);
    expect(percentileSorted(x, 0.5)).toBeCloseTo(2.5, 12);
    expect(percentileSorted(x, 0.84)).toBeCloseTo(3.52, 12);
  });

  it('drops and reports a few non-finite samples; refuses mostly non-finite ones', () => {
    const x = Float64Array.from({ length: 100 }, (_, i) => (i < 3 ? NaN : i));
    const s = summariseSamples(x, { label: 'q' });
    expect(s.finite).toBe(97);
    expect(s.warnings[0]).toMatch(/3 of 100 samples .* non-finite/);
    const bad = Float64Array.from({ length: 100 }, (_, i) => (i < 60 ? Infinity : i));
    expect(() => summariseSamples(bad, { label: 'q' })).toThrow(ComputeError);
    expect(() => summariseSamples(bad, { label: 'q' })).toThrow(/60 of 100 samples are non-finite/);
    expect(() => summariseSamples(new Float64Array(10).fill(NaN))).toThrow(ComputeError);
  });
});

describe('Monte Carlo against linear propagation', () => {
  it('agree for small errors on a product and a power (first-order propagation, common knowledge)', () => {
    const f = (a: number, b: number) => a * b * b;
    const mc = monteCarlo({ a: { kind: 'normal', mean: 3, sigma: 0.03 }, b: { kind: 'normal', mean: 2, sigma: 0.01 } },
      (x) => f(x.a, x.b), { samples: 50000, seed: 4 });
    const lin = linearPropagate((x) => f(x[0], x[1]), [3, 2], [0.03, 0.01]);
    // analytic first order: sigma^2 = (b^2 sa)^2 + (2 a b sb)^2 = 0.12^2 + 0.12^2
    expect(lin.sigma).toBeCloseTo(Math.hypot(0.12, 0.12), 8);
    const c = checkLinear(lin, mc.summary);
    expect(c.valid).toBe(true);
    expect(c.agrees).toBe(true);
    expect(Math.abs(c.relativeWidthDifference)).toBeLessThan(0.03);
  });

  it('flags large errors as outside linear validity', () => {
    const mc = monteCarlo({ a: { kind: 'normal', mean: 1, sigma: 0.5 } }, (x) => Math.exp(3 * x.a), { samples: 20000, seed: 1 });
    const c = checkLinear(linearPropagate((x) => Math.exp(3 * x[0]), [1], [0.5]), mc.summary);
    expect(c.valid).toBe(false);
    expect(c.note).toMatch(/not valid/);
  });

  it('with a covariance: var(a + b) = sa^2 + sb^2 + 2 cov (common knowledge)', () => {
    const lin = linearPropagate((x) => x[0] + x[1], [1, 2], [1, 2], [1, 1.5, 1.5, 4]);
    expect(lin.sigma).toBeCloseTo(Math.sqrt(1 + 4 + 3), 8);
  });

  it('the same seed gives the same samples exactly; another seed does not', () => {
    const inputs = { a: { kind: 'splitNormal' as const, mode: 1, sigmaLow: 0.1, sigmaHigh: 0.3 }, t: { kind: 'choice' as const, values: [1, 2, 3] } };
    const r1 = monteCarlo(inputs, (x) => x.a * x.t, { samples: 1000, seed: 9 });
    const r2 = monteCarlo(inputs, (x) => x.a * x.t, { samples: 1000, seed: 9 });
    const r3 = monteCarlo(inputs, (x) => x.a * x.t, { samples: 1000, seed: 10 });
    expect(Array.from(r2.samples)).toEqual(Array.from(r1.samples));
    expect(Array.from(r3.samples)).not.toEqual(Array.from(r1.samples));
  });

  it('rejects bad sample counts and seeds', () => {
    expect(() => monteCarlo({}, () => 1, { samples: 10 })).toThrow(/sample count/);
    expect(() => monteCarlo({}, () => 1, { seed: -3 })).toThrow(/seed/);
  });
});
