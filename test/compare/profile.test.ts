/**
 * Neutrino measurements as likelihoods (compare/profile.ts, tension.ts). References:
 * the Gaussian tension |P - mu| / sigma and P(chi^2_1 >= q) = 2 (1 - Phi(sqrt q)) (Wilks 1938,
 * Ann. Math. Stat. 9, 60; common knowledge); one-sided p of an upper limit at 90 %:
 * 1 - Phi(2 z_0.9) = 0.005187061 (scipy.stats.norm.sf(2 * norm.ppf(0.9)));
 * binomial Monte Carlo bounds: chi2.ppf(0.95, 12) = 21.02607 and its two-sided sigma 2.30752 (scipy).
 * Each number is printed by scripts/compare_reference.py ("constants"); normal.test.ts checks that.
 */
import { describe, expect, it } from 'vitest';
import { parseMeasurement } from '../../src/compare/measurement.js';
import { predictNeutrinos } from '../../src/compare/predict.js';
import { signedRoot } from '../../src/compare/profile.js';
import { compareAtReference, tensionFromLikelihood, tensionFromSamples } from '../../src/compare/tension.js';
import { normalQuantile } from '../../src/compare/normal.js';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const MU = 1.3e-18, SIG = 0.4e-18;
const grid = Array.from({ length: 9 }, (_, i) => 0.2e-18 + 0.3e-18 * i); // does not contain MU
const parabola = (x: number) => ((x - MU) / SIG) ** 2;

describe('likelihood profile', () => {
  it('a parabolic profile reproduces the Gaussian tension to 1e-6, inside and beyond the table', () => {
    const sr = signedRoot({ kind: 'profile', norm: Float64Array.from(grid), deltaTs: Float64Array.from(grid, (x) => parabola(x) + 3) });
    expect(rel(sr.best, MU)).toBeLessThan(1e-12);
    for (const P of [0.4e-18, 1.0e-18, 2.1e-18, 3.5e-18]) {
      const t = tensionFromLikelihood(sr, new Float64Array(1000).fill(P));
      expect(rel(t.sigma, Math.abs(P - MU) / SIG)).toBeLessThan(1e-6);
      expect(t.sided).toBe('two');
      expect(t.direction).toBe(P > MU ? 'below' : 'above');
    }
  });

  it('the prediction\'s spread is integrated: Gaussian prediction draws give |muP - mu| / sqrt(sigma^2 + sigmaP^2) (1e-3)', () => {
    const sr = signedRoot({ kind: 'profile', norm: Float64Array.from(grid), deltaTs: Float64Array.from(grid, parabola) });
    const n = 20000, muP = 0.5e-18, sP = 0.3e-18;
    const P = Float64Array.from({ length: n }, (_, i) => muP + sP * normalQuantile((i + 0.5) / n));
    const t = tensionFromLikelihood(sr, P);
    expect(rel(t.sigma, (MU - muP) / Math.hypot(SIG, sP))).toBeLessThan(1e-3);
    expect(t.pValueStdError).toBeGreaterThan(0);
    expect(t.decidingDraws).toBe(n);
  });

  it('an upper limit alone gives a one-sided p-value: 1 - CL at the limit, 0.005187 at twice it', () => {
    const sr = signedRoot({ kind: 'upperLimit', limit: 2e-18, confidence: 0.9 });
    const at = (P: number) => tensionFromLikelihood(sr, new Float64Array(100).fill(P));
    expect(rel(at(2e-18).pValue, 0.1)).toBeLessThan(1e-9);
    expect(at(2e-18).sided).toBe('one');
    expect(rel(at(4e-18).pValue, 0.005187061403669972)).toBeLessThan(1e-6);
    expect(rel(at(4e-18).sigma, 2 * 1.2815515655446004)).toBeLessThan(1e-6);
  });

  it('from the measurement file: a ts profile and an upper limit, compared with a prediction without spread', () => {
    const base = { kind: 'normalisation', energyUnit: 'TeV', valueUnit: 'GeV^-1 cm^-2 s^-1 sr^-1', e0: 1, index: 2.7 };
    const ts = grid.map((x) => 25 - parabola(x)); // test statistic against zero flux: -2 Delta lnL = max(ts) - ts
    const m = parseMeasurement({ ...base, profile: { norm: grid, ts } }, 'nu.yaml');
    if (m.kind !== 'normalisation') throw new Error('kind');
    expect(rel(m.norm.value, MU)).toBeLessThan(1e-9);
    expect(rel(m.norm.errHigh, SIG)).toBeLessThan(1e-9);
    const e = Float64Array.from([1e3, 2e3, 4e3]);
    const pts = { energyGeV: e, value: e.map((x) => 1e-15 * Math.pow(x / 2e3, -2.7)), errLow: new Float64Array(3), errHigh: new Float64Array(3), upperLimit: new Uint8Array(3) };
    const p = predictNeutrinos({ gamma: { kind: 'points', points: pts }, factors: [{ template: 't', kI: 1e-3 / 6 }], e0GeV: 1000, methods: ['kpi'], samples: 500, seed: 1 });
    const P = p.combinedAtE0[0]; // 1e-18, the same in every draw
    const c = compareAtReference(p, m);
    expect(rel(c.tension.sigma, Math.abs(P - MU) / SIG)).toBeLessThan(1e-6);
    expect(c.measuredDefinition).toMatch(/confidence distribution/);
    const ul = parseMeasurement({ ...base, upperLimit: P, cl: 0.95 }, 'nu.yaml');
    const cu = compareAtReference(p, ul);
    expect(rel(cu.tension.pValue, 0.05)).toBeLessThan(1e-6);
    expect(() => parseMeasurement({ ...base, upperLimit: 1, norm: 1, err: 1 }, 'nu.yaml')).toThrow(/nu\.yaml, key upperLimit: upperLimit given together/);
    expect(() => parseMeasurement({ ...base, profile: { norm: [1, 2, 3], deltaTs: [1, 0, 2, 5] } }, 'nu.yaml')).toThrow(/key profile/);
  });
});

describe('Monte Carlo p-value uncertainty', () => {
  it('5 of 1000 draws cross: p = 0.01, binomial error 2 sqrt(q (1 - q) / N), 95 % upper bound chi2_12(0.95) / N = 0.021026', () => {
    const meas = new Float64Array(1000).fill(1), pred = Float64Array.from({ length: 1000 }, (_, i) => (i < 5 ? 2 : 0));
    const t = tensionFromSamples(meas, pred);
    expect(t.decidingDraws).toBe(5);
    expect(rel(t.pValue, 0.01)).toBeLessThan(1e-12);
    expect(rel(t.pValueStdError, 2 * Math.sqrt(0.005 * 0.995 / 1000))).toBeLessThan(1e-12);
    expect(rel(t.pValueUpper95!, 21.02606981748307 / 1000)).toBeLessThan(1e-9);
    expect(rel(t.sigmaLower95!, 2.3075160269237824)).toBeLessThan(1e-6);
  });
});
