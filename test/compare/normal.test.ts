import { describe, expect, it } from 'vitest';
import { erfc, normalCdf, normalQuantile, sigmaFromTwoSidedP, twoSidedPFromSigma } from '../../src/compare/normal.js';
import { chiSquareSurvival } from '../../src/compare/chiSquare.js';
import { requirePython, runPython, skipWithoutPython } from '../helpers/python.js';

function rel(a: number, b: number): number {
  return b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b);
}

describe('normal distribution and chi-square against scipy (scripts/compare_reference.py)', () => {
  it.skipIf(skipWithoutPython)('erfc, Phi, Phi^-1 and chi2.sf agree with scipy.special / scipy.stats', () => {
    requirePython(); // under CI=true a missing reference fails here
    const ref = JSON.parse(runPython('scripts/compare_reference.py'));
    for (const [x, v] of ref.erfc) expect(rel(erfc(x), v)).toBeLessThan(1e-13);
    for (const [x, v] of ref.ndtr) expect(rel(normalCdf(x), v)).toBeLessThan(1e-13);
    for (const [p, v] of ref.ndtri) expect(Math.abs(normalQuantile(p) - v)).toBeLessThan(1e-11 * Math.max(1, Math.abs(v)));
    for (const [x, k, v] of ref.chi2sf) expect(rel(chiSquareSurvival(x, k), v)).toBeLessThan(1e-10);
  });
});

describe('sigma conversions (common knowledge)', () => {
  it('1, 2, 3, 5 sigma two-sided probabilities', () => {
    expect(twoSidedPFromSigma(1)).toBeCloseTo(0.3173105, 7);
    expect(twoSidedPFromSigma(3)).toBeCloseTo(0.0026998, 7);
    expect(sigmaFromTwoSidedP(0.3173105)).toBeCloseTo(1, 6);
    expect(sigmaFromTwoSidedP(0.0455003)).toBeCloseTo(2, 6);
    expect(sigmaFromTwoSidedP(5.733e-7)).toBeCloseTo(5, 3);
    expect(sigmaFromTwoSidedP(1)).toBe(0);
    expect(sigmaFromTwoSidedP(0)).toBe(Infinity);
    expect(sigmaFromTwoSidedP(NaN)).toBeNaN();
  });

  it('edge cases: NaN, 0, 1 and the far tails', () => {
    expect(erfc(NaN)).toBeNaN();
    expect(erfc(30)).toBe(0);
    expect(erfc(-30)).toBe(2);
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(1)).toBe(Infinity);
    expect(normalQuantile(-0.1)).toBeNaN();
    expect(rel(normalCdf(normalQuantile(1e-300)), 1e-300)).toBeLessThan(1e-10);
    expect(rel(normalCdf(normalQuantile(1e-100)), 1e-100)).toBeLessThan(1e-12);
    expect(chiSquareSurvival(-1, 2)).toBeNaN();
    expect(chiSquareSurvival(3, 0)).toBeNaN();
    expect(chiSquareSurvival(0, 3)).toBe(1);
  });
});
