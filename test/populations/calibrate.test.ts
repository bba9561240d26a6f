/**
 * Calibration of the source count to a catalogue: the calibrated model yields
 * the catalogue's count on average, within the Monte Carlo error.
 */
import { describe, expect, it } from 'vitest';
import { Random } from '../../src/compare/random.js';
import { calibrateCount, resolvedInTarget } from '../../src/populations/calibrate.js';
import { calibrateLuminosityScale } from '../../src/populations/calibrateLuminosity.js';
import { scaleLuminosity } from '../../src/populations/luminosity.js';
import type { DetectionThreshold } from '../../src/populations/threshold.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { lorimerModel } from './fixtures.js';

const deg = Math.PI / 180;

describe('calibration', () => {
  const doc = parseRegionDocument('regions:\n  plane:\n    box: { frame: galactic, lonDeg: [10, 90], latDeg: [-5, 5] }\n');
  const plane = evaluateRegion(doc, 'plane', { nside: 32, frame: 'galactic' });
  const threshold: DetectionThreshold = {
    kind: 'exposure', fluxErgCm2S: 2e-12, referenceDecRad: 30 * deg, siteLatRad: 30 * deg, maxZenithRad: 45 * deg,
    weighting: 'zenith', exposurePower: 1, psfRad: null,
  };
  const target = { region: plane, fluxAboveErgCm2S: 3e-12, count: 40 };

  it('a model calibrated to N resolved sources yields a mean of N over realisations', () => {
    // Sources are independent, so the expected resolved count is proportional to the number of sources (common
    // practice, no source). Check: fresh realisations (another seed) of the calibrated model; the allowed
    // difference is three times the combined Monte Carlo error of the check and of the calibration.
    const ref = lorimerModel(4000, 0.1);
    const cal = calibrateCount(ref, threshold, target, { realisations: 60, seed: 3 });
    expect(cal.meanAtReference).toBeGreaterThan(5); // the reference count resolves enough sources to scale from
    expect(cal.poissonRelSigma).toBeCloseTo(1 / Math.sqrt(40), 12);
    const model = { ...ref, count: cal.count };
    const rng = new Random(99), M = 80, xs: number[] = [];
    for (let r = 0; r < M; r++) xs.push(resolvedInTarget(model, threshold, target, rng));
    const mean = xs.reduce((a, b) => a + b, 0) / M;
    const sd = Math.sqrt(xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (M - 1));
    const err = Math.hypot(sd / Math.sqrt(M), 40 * cal.monteCarloRelSigma);
    expect(Math.abs(mean - 40)).toBeLessThan(3 * err);
    expect(err).toBeLessThan(3); // the check has teeth: 3 sigma is below 25 % of N
  });

  it('a model calibrated by its luminosity scale yields a mean of N as well', () => {
    // With the count fixed, the expected resolved count rises monotonically with a common luminosity factor
    // (every flux scales with it; common practice, no source). Check as above, with fresh realisations.
    const ref = lorimerModel(3000, 0.1);
    const cal = calibrateLuminosityScale(ref, threshold, target, { realisations: 30, seed: 5 });
    expect(cal.slope).toBeGreaterThan(0);
    const model = { ...ref, luminosity: scaleLuminosity(ref.luminosity, cal.scale) };
    const rng = new Random(123), M = 80, xs: number[] = [];
    for (let r = 0; r < M; r++) xs.push(resolvedInTarget(model, threshold, target, rng));
    const mean = xs.reduce((a, b) => a + b, 0) / M;
    const sd = Math.sqrt(xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (M - 1));
    // Calibration's own Monte Carlo error on the count: sd / sqrt(30) at the solution.
    const err = Math.hypot(sd / Math.sqrt(M), sd / Math.sqrt(30));
    expect(Math.abs(mean - 40)).toBeLessThan(3 * err);
    expect(err).toBeLessThan(3);
  });

  it('refuses a population that resolves nothing', () => {
    const faint = { ...lorimerModel(100, 0.1), luminosity: { kind: 'powerLaw' as const, alpha: 2, minErgPerS: 1e20, maxErgPerS: 1e21 } };
    expect(() => calibrateCount(faint, threshold, target, { realisations: 4, seed: 1 })).toThrow(/no source is resolved/);
  });
});
