import { describe, expect, it } from 'vitest';
import { Random, splitMix64 } from '../../src/compare/random.js';
import { splitNormalQuantile, splitNormalMean, splitNormalVariance } from '../../src/compare/splitNormal.js';
import { quantileSorted as percentileSorted } from '../../src/scaling/quantiles.js';

describe('xoshiro128** and SplitMix64', () => {
  it('reproduces the xoshiro128** reference vector', () => {
    // Test vector of the authors' C reference (Blackman & Vigna 2021), as published in the
    // public repository edorfaus/xoshiro-6502, test-rom/testdata.asm: initial state words
    // (little-endian) and the first four xoshiro128** outputs, then the state after them.
    const r = new Random([0x964d4a0c, 0xd40ab895, 0xad7fdecb, 0x3006f0f0]);
    const out = [0, 1, 2, 3].map(() => r.nextUint32());
    expect(out).toEqual([0xf1391922, 0x6fe53806, 0xa5be2840, 0xf510ee70]);
    expect(r.state()).toEqual([0xfc65379c, 0x52006d70, 0x87487639, 0xf1908343]);
  });

  it('reproduces the SplitMix64 reference sequence for seed 1234567', () => {
    // Rosetta Code, "Pseudo-random numbers/Splitmix64" (Steele, Lea & Flood 2014 algorithm).
    let s = 1234567n;
    const out: bigint[] = [];
    for (let i = 0; i < 5; i++) { const [n, o] = splitMix64(s); s = n; out.push(o); }
    expect(out).toEqual([6457827717110365317n, 3203168211198807973n, 9817491932198370423n,
      4593380528125082431n, 16408922859458223821n]);
  });

  it('same seed, same stream; other seed or stream, other numbers', () => {
    const a = new Random(42), b = new Random(42), c = new Random(43), d = new Random(42, 1);
    const xa = Array.from({ length: 50 }, () => a.uniform());
    const xb = Array.from({ length: 50 }, () => b.uniform());
    expect(xb).toEqual(xa);
    expect(Array.from({ length: 50 }, () => c.uniform())).not.toEqual(xa);
    expect(Array.from({ length: 50 }, () => d.uniform())).not.toEqual(xa);
  });

  it('rejects a bad seed and the all-zero state', () => {
    expect(() => new Random(-1)).toThrow(/seed/);
    expect(() => new Random(1.5)).toThrow(/seed/);
    expect(() => new Random(NaN)).toThrow(/seed/);
    expect(() => new Random([0, 0, 0, 0])).toThrow(/all zero/);
  });

  it('uniforms are in [0, 1) with mean 1/2 and variance 1/12', () => {
    // Moments of U(0,1) (common knowledge); 1e5 draws: standard errors 9e-4 and 3e-4.
    const r = new Random(7);
    const n = 100000;
    let s = 0, s2 = 0, min = 1, max = 0;
    for (let i = 0; i < n; i++) { const u = r.uniform(); s += u; s2 += u * u; min = Math.min(min, u); max = Math.max(max, u); }
    expect(min).toBeGreaterThanOrEqual(0);
    expect(max).toBeLessThan(1);
    expect(s / n).toBeCloseTo(0.5, 2);
    expect(s2 / n - (s / n) ** 2).toBeCloseTo(1 / 12, 3);
  });

  it('integer(n) is uniform over 0..n-1', () => {
    // Chi-square of 10 equal bins, 1e5 draws: below 27.9 (the 0.1 % point of chi2 with 9 dof, 27.877, rounded up; printed by
    // scripts/compare_reference.py, "constants", checked in normal.test.ts).
    const r = new Random(3);
    const counts = new Array(10).fill(0);
    for (let i = 0; i < 100000; i++) counts[r.integer(10)]++;
    const chi2 = counts.reduce((a, c) => a + (c - 10000) ** 2 / 10000, 0);
    expect(chi2).toBeLessThan(27.9);
  });

  it('normal deviates have the moments and quantiles of N(0, 1)', () => {
    // Phi(-1) = 0.158655, Phi(1.959964) = 0.975 (common knowledge); 2e5 draws.
    const r = new Random(11);
    const n = 200000;
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = r.normal();
    x.sort();
    let s = 0, s2 = 0, s4 = 0;
    for (const v of x) { s += v; s2 += v * v; s4 += v ** 4; }
    expect(s / n).toBeCloseTo(0, 2);
    expect(s2 / n).toBeCloseTo(1, 2);
    expect(s4 / n).toBeGreaterThan(2.9); // kurtosis 3
    expect(s4 / n).toBeLessThan(3.1);
    expect(percentileSorted(x, 0.158655)).toBeCloseTo(-1, 1);
    expect(percentileSorted(x, 0.975)).toBeCloseTo(1.959964, 1);
  });
});

describe('split-normal sampling (Wallis 2014, Statistical Science 29, 106)', () => {
  it('draws reproduce the stated quantiles, mean and variance', () => {
    const mode = 10, lo = 1, hi = 3;
    const r = new Random(5);
    const n = 400000;
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = r.splitNormal(mode, lo, hi);
    x.sort();
    // The closed-form quantiles of splitNormal.ts; their own check against numerical
    // integration of the density is in splitNormal.test.ts.
    // Tolerance: 4 standard errors of a sample quantile, sqrt(p (1 - p) / n) / f(x_p)
    // (asymptotic variance of a sample quantile; common knowledge).
    const A = Math.sqrt(2 / Math.PI) / (lo + hi);
    const pdf = (v: number) => A * Math.exp(-((v - mode) ** 2) / (2 * (v < mode ? lo : hi) ** 2));
    for (const p of [0.02275, 0.1, 0.15865, 0.25, 0.5, 0.75, 0.84135, 0.97725]) {
      const q = splitNormalQuantile(p, mode, lo, hi);
      const se = Math.sqrt(p * (1 - p) / n) / pdf(q);
      expect(Math.abs(percentileSorted(x, p) - q)).toBeLessThan(4 * se);
    }
    // Probability below the mode is sigma_low / (sigma_low + sigma_high) = 0.25 (Wallis 2014, eq. 1).
    let below = 0;
    for (const v of x) if (v < mode) below++;
    expect(below / n).toBeCloseTo(0.25, 2);
    let s = 0, s2 = 0;
    for (const v of x) { s += v; s2 += v * v; }
    // 4 standard errors of the mean, sqrt(var / n).
    const v = splitNormalVariance(lo, hi);
    expect(Math.abs(s / n - splitNormalMean(mode, lo, hi))).toBeLessThan(4 * Math.sqrt(v / n));
    expect(s2 / n - (s / n) ** 2).toBeCloseTo(v, 1);
  });

  it('equal sigmas give the normal distribution; zero sigmas give the mode', () => {
    const r = new Random(9);
    const x = Float64Array.from({ length: 100000 }, () => r.splitNormal(2, 0.5, 0.5)).sort();
    expect(percentileSorted(x, 0.8413447)).toBeCloseTo(2.5, 1);
    expect(new Random(1).splitNormal(3, 0, 0)).toBe(3);
  });
});
