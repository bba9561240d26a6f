import { describe, expect, it } from 'vitest';
import { Random } from '../../src/compare/random.js';
import { tensionFromSamples } from '../../src/compare/tension.js';

function normals(n: number, mean: number, sigma: number, seed: number): Float64Array {
  const r = new Random(seed);
  return Float64Array.from({ length: n }, () => mean + sigma * r.normal());
}

describe('Monte Carlo tension', () => {
  // Two Gaussian quantities a +- sa and b +- sb differ by |a - b| / sqrt(sa^2 + sb^2) sigma
  // (Gaussian error propagation of a difference, common knowledge); required to 0.02 sigma.
  for (const [a, sa, b, sb] of [[10, 1, 7, 2], [5, 0.5, 5.2, 0.3], [1, 0.1, 0.7, 0.05], [3, 1, 0, 1]]) {
    it(`a = ${a} +- ${sa}, b = ${b} +- ${sb}`, () => {
      const n = 1_000_000;
      const t = tensionFromSamples(normals(n, a, sa, 1), normals(n, b, sb, 2));
      const expected = Math.abs(a - b) / Math.hypot(sa, sb);
      expect(Math.abs(t.sigma - expected)).toBeLessThan(0.02);
      expect(Math.abs(t.gaussianSigma - expected)).toBeLessThan(0.02);
      expect(t.lowerBound).toBe(false);
      expect(t.direction).toBe(a >= b ? 'above' : 'below');
    });
  }

  it('reports a lower bound when no draw crosses zero', () => {
    const t = tensionFromSamples(normals(1000, 100, 1, 1), normals(1000, 0, 1, 2));
    expect(t.lowerBound).toBe(true);
    expect(t.sigma).toBeGreaterThan(3); // z(2/1000) = 3.09
    expect(t.gaussianSigma).toBeGreaterThan(50);
  });

  it('skips non-finite pairs', () => {
    const m = normals(10000, 1, 1, 3), p = normals(10000, 0, 1, 4);
    const t1 = tensionFromSamples(m, p);
    const m2 = Float64Array.from([...m, NaN, Infinity]), p2 = Float64Array.from([...p, 0, 0]);
    expect(tensionFromSamples(m2, p2).sigma).toBe(t1.sigma);
  });
});
