/**
 * The two-piece log-normal of a gamma-ray point (compare/logNormalPoint.ts): its median and
 * Phi(-1) / Phi(+1) quantiles are the quoted value - errLow, value, value + errHigh by
 * construction (common practice, no source; Phi(+-1) = 0.158655 / 0.841345 from
 * scipy.stats.norm.cdf, computed). 10^6 seeded draws must reproduce them to 1e-3 relative.
 */
import { describe, expect, it } from 'vitest';
import { drawLogNormalPoint, logNormalPointQuantile, logNormalWidths } from '../../src/compare/logNormalPoint.js';
import { predictNeutrinos, component } from '../../src/compare/predict.js';
import { Random } from '../../src/compare/random.js';
import { ComputeError } from '../../src/core/errors.js';
import { quantileSorted } from '../../src/scaling/quantiles.js';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const PHI_M1 = 0.15865525393145707, PHI_P1 = 0.8413447460685429;

describe('log-normal gamma-ray draws', () => {
  const [v, lo, hi] = [2e-9, 0.4e-9, 0.6e-9];
  const w = logNormalWidths([v], [lo], [hi], [1e4]);

  it('closed form: quantiles at Phi(-1), 1/2, Phi(+1) are value - errLow, value, value + errHigh', () => {
    expect(rel(logNormalPointQuantile(PHI_M1, v, w.sLow[0], w.sHigh[0]), v - lo)).toBeLessThan(1e-12);
    expect(rel(logNormalPointQuantile(0.5, v, w.sLow[0], w.sHigh[0]), v)).toBeLessThan(1e-15);
    expect(rel(logNormalPointQuantile(PHI_P1, v, w.sLow[0], w.sHigh[0]), v + hi)).toBeLessThan(1e-12);
  });

  it('10^6 seeded draws: median and 15.87 / 84.13 % points match to 1e-3 relative; all positive', () => {
    const rng = new Random(12345), n = 1_000_000, x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = drawLogNormalPoint(v, w.sLow[0], w.sHigh[0], rng);
    x.sort();
    expect(x[0]).toBeGreaterThan(0);
    expect(rel(quantileSorted(x, 0.5), v)).toBeLessThan(1e-3);
    expect(rel(quantileSorted(x, PHI_M1), v - lo)).toBeLessThan(1e-3);
    expect(rel(quantileSorted(x, PHI_P1), v + hi)).toBeLessThan(1e-3);
  });

  it('very uncertain points never give a non-finite or negative draw; errLow >= value is named in a note', () => {
    const e = Float64Array.from([300, 1000, 3000, 10000]);
    const val = e.map((x) => 1e-12 * Math.pow(x / 1e3, -2.7));
    const pts = { energyGeV: e, value: val, errLow: val.map((x) => 1.2 * x), errHigh: val.map((x) => 0.8 * x), upperLimit: new Uint8Array(4) };
    const p = predictNeutrinos({ gamma: { kind: 'points', points: pts }, factors: [{ template: 't', kI: 1 }], e0GeV: 500, methods: ['kpi'], samples: 5000, seed: 1 });
    expect(p.warnings.join(' ')).not.toMatch(/non-finite/);
    expect(p.combinedAtE0.every((x) => x > 0 && Number.isFinite(x))).toBe(true);
    expect(p.notes.join(' ')).toMatch(/gamma-ray point at 300 GeV: errLow >= value/);
    // at a point (2 E0 = 1 TeV) the median is the value (K_pi rule: 6 I(2 E0)), not pulled up by dropped draws
    expect(rel(component(p, 'gamma')!.atE0.median, 6 * 1e-12)).toBeLessThan(0.05);
  });

  it('a draw that overflows is a ComputeError naming the point', () => {
    const e = Float64Array.from([1000, 3000]), val = Float64Array.from([1e300, 1e299]);
    const pts = { energyGeV: e, value: val, errLow: val.map((x) => 0.1 * x), errHigh: Float64Array.from([1e306, 1e298]), upperLimit: new Uint8Array(2) };
    expect(() => predictNeutrinos({ gamma: { kind: 'points', points: pts }, factors: [{ template: 't', kI: 1 }], e0GeV: 600, methods: ['kpi'], samples: 5000, seed: 1 }))
      .toThrow(ComputeError);
    expect(() => predictNeutrinos({ gamma: { kind: 'points', points: pts }, factors: [{ template: 't', kI: 1 }], e0GeV: 600, methods: ['kpi'], samples: 5000, seed: 1 }))
      .toThrow(/gamma-ray point at 1000 GeV/);
  });
});
