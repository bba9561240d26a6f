import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { angularDistance, kahanSum, CompensatedSum, wrapTwoPi, acosClamped } from '../../src/core/math.js';

describe('angularDistance', () => {
  it('matches the spherical law of cosines away from 0 and pi (spherical trigonometry, common knowledge)', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 6.28, noNaN: true }), fc.double({ min: -1.5, max: 1.5, noNaN: true }),
      fc.double({ min: 0, max: 6.28, noNaN: true }), fc.double({ min: -1.5, max: 1.5, noNaN: true }),
      (l1, b1, l2, b2) => {
        const c = Math.sin(b1) * Math.sin(b2) + Math.cos(b1) * Math.cos(b2) * Math.cos(l2 - l1);
        const ref = acosClamped(c);
        return Math.abs(angularDistance(l1, b1, l2, b2) - ref) < 1e-7;
      }), { seed: 1, numRuns: 500 });
  });
  it('is exact for tiny separations where acos loses digits', () => {
    expect(Math.abs(angularDistance(0, 0, 1e-10, 0) / 1e-10 - 1)).toBeLessThan(1e-12);
  });
});

describe('compensated sums (Neumaier 1974, ZAMM 54, 39)', () => {
  it('recovers the small terms a naive sum loses', () => {
    const x = [1e16, 1, -1e16, 1];
    expect(kahanSum(x)).toBe(2);
    const s = new CompensatedSum();
    x.forEach((v) => s.add(v));
    expect(s.value()).toBe(2);
  });
});

describe('wrapTwoPi', () => {
  it('maps into [0, 2pi)', () => {
    expect(wrapTwoPi(-0.5)).toBeCloseTo(2 * Math.PI - 0.5, 15);
    expect(wrapTwoPi(2 * Math.PI)).toBe(0);
    expect(wrapTwoPi(-0)).toBe(0);
    expect(wrapTwoPi(7 * Math.PI)).toBeCloseTo(Math.PI, 14);
  });
});
