import { describe, expect, it } from 'vitest';
import { splitNormalCdf, splitNormalQuantile } from '../../src/compare/splitNormal.js';
import { requirePython, runPython, skipWithoutPython } from '../helpers/python.js';

describe('split normal closed forms (Wallis 2014, Statistical Science 29, 106, eq. 1)', () => {
  it.skipIf(skipWithoutPython)('quantiles match numerical integration of the density (scipy, scripts/compare_reference.py)', () => {
    requirePython(); // under CI=true a missing reference fails here
    const ref = JSON.parse(runPython('scripts/compare_reference.py')).splitNormal;
    for (const [p, q] of ref.quantiles as [number, number][]) {
      expect(splitNormalQuantile(p, ref.mode, ref.sigmaLow, ref.sigmaHigh)).toBeCloseTo(q, 9);
    }
  });

  it('CDF and quantile are inverse; the mode sits at sigma_low / (sigma_low + sigma_high)', () => {
    for (const p of [1e-6, 0.01, 0.2, 0.25, 0.3, 0.5, 0.9, 0.999999]) {
      expect(splitNormalCdf(splitNormalQuantile(p, 5, 1, 3), 5, 1, 3)).toBeCloseTo(p, 12);
    }
    expect(splitNormalCdf(5, 5, 1, 3)).toBeCloseTo(0.25, 14);
    expect(splitNormalQuantile(0.25, 5, 1, 3)).toBeCloseTo(5, 12);
    expect(splitNormalQuantile(1.5, 5, 1, 3)).toBeNaN();
  });
});
