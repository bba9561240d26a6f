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
  it.skipIf(skipWithoutPython)('the numbers written out in the compare and physics tests are printed by scripts/compare_reference.py ("constants")', () => {
    requirePython(); // under CI=true a missing reference fails here
    const c = JSON.parse(runPython('scripts/compare_reference.py')).constants;
    // here (sigma conversions), rounded to 7 decimals: within half a unit of the 7th decimal
    const written: Record<number, number> = { 1: 0.3173105, 2: 0.0455003, 3: 0.0026998, 5: 5.733e-7 };
    for (const [s, p] of c.twoSidedP) expect(Math.abs(written[s] - p)).toBeLessThanOrEqual(5e-8);
    expect(rel(written[5], c.twoSidedP[3][1])).toBeLessThan(1e-4); // 5 sigma: 4 significant digits
    // profile.test.ts (upper-limit p at twice a 90 % limit; chi2_12(0.95); its two-sided sigma)
    expect(c.ulOneSidedP90).toBe(0.005187061403669972);
    expect(c.z90).toBe(1.2815515655446004);
    expect(c.z95).toBe(1.6448536269514722); // also test/physics/hadronic/protonFit.test.ts
    expect(c.chi2ppf[0]).toEqual([0.95, 12, 21.02606981748307]);
    expect(c.sigmaTwoSided21026).toBe(2.3075160269237824);
    // random.test.ts: the 0.1 % point of chi2 with 9 dof, written as 27.9 (rounded up)
    expect(c.chi2ppf[1][2]).toBeGreaterThan(27.87);
    expect(c.chi2ppf[1][2]).toBeLessThan(27.9);
  });
});

describe('sigma conversions (values printed by scripts/compare_reference.py, "constants", checked above)', () => {
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
