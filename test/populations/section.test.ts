/**
 * The plan-file section end to end: schema errors with key paths, identities
 * between the outputs, the correction term, tables and the SVG.
 */
import { describe, expect, it } from 'vitest';
import { parseRegionDocument } from '../../src/regions/document.js';
import { correctScaledInput } from '../../src/populations/correction.js';
import { parsePopulationSection } from '../../src/populations/section.js';
import { runPopulationSection } from '../../src/populations/runSection.js';
import { column } from '../../src/populations/run.js';

const regions = parseRegionDocument(`regions:
  survey:
    all:
      - box: { frame: galactic, lonDeg: [20, 80], latDeg: [-4, 4] }
      - site: { latDeg: 30, maxZenithDeg: 45 }
  nu:
    box: { frame: galactic, lonDeg: [-180, 180], latDeg: [-5, 5] }
  sky:
    sky: true
`);

const base = {
  name: 'invented-nebulae', count: 3000,
  spatial: { distribution: 'lorimer2006', scaleHeightKpc: 0.1 },
  luminosity: { alpha: 1.8, minErgPerS: 1e32, maxErgPerS: 1e35 },
  spectrum: { pivotTeV: 10, index: 2.3, indexSpread: 0.2, cutoffTeV: 300 },
  size: { minPc: 1, maxPc: 20 },
  energiesTeV: [3, 10, 30],
  threshold: { fluxErgCm2S: 2e-12, referenceDecDeg: 30, siteLatDeg: 30, maxZenithDeg: 45, psfDeg: 0.3 },
  regions: { measured: 'survey', neutrino: 'nu', counts: ['survey'] },
  realisations: 12, seed: 4, nside: 16,
};

describe('populations section', () => {
  it('reports the first schema problem with its key path', () => {
    expect(() => parsePopulationSection({ ...base, count: -3 }, 'plan.yaml')).toThrow(/plan\.yaml, key populations\.count/);
    expect(() => parsePopulationSection({ ...base, extra: 1 }, 'plan.yaml')).toThrow(/key populations/);
    expect(() => runPopulationSection({ ...base, luminosity: { alpha: 2, minErgPerS: 1e32 } }, { regions, file: 'plan.yaml' }))
      .toThrow(/populations\.luminosity\.maxErgPerS: is missing/);
    expect(() => runPopulationSection({ ...base, threshold: { fluxErgCm2S: 1e-12 } }, { regions }))
      .toThrow(/populations\.threshold\.referenceDecDeg/);
  });

  it('with nothing resolved and one region for both, the unresolved and the all-source intensities agree and the term vanishes', () => {
    // Identity (common practice, no source): U_A = T_B when A = B and no source is resolved; Delta = T_B - 1 x U_A = 0.
    const r = runPopulationSection({ ...base, threshold: { ...base.threshold, fluxErgCm2S: 1e30 }, regions: { measured: 'nu', neutrino: 'nu' } }, { regions });
    for (let e = 0; e < 3; e++) {
      expect(r.unresolvedMeasured![e].mean).toBeGreaterThan(0);
      expect(r.unresolvedMeasured![e].mean).toBe(r.neutrinoAll![e].mean);
    }
    const c = correctScaledInput({ energiesGeV: [3e3, 1e4, 3e4], intensity: [1e-9, 1e-10, 1e-11], factor: 1 }, r.term!);
    expect(Array.from(c.intensity)).toEqual([1e-9, 1e-10, 1e-11]);
    expect(c.sigmaTerm.every((s) => s === 0)).toBe(true);
  });

  it('runs a calibrated population with variants and writes consistent tables and an SVG', () => {
    const r = runPopulationSection({
      ...base,
      calibration: { region: 'survey', fluxAboveErgCm2S: 2e-12, count: 25, realisations: 10 },
      variants: [{ label: 'steep', alpha: 2.0 }, { label: 'flat', alpha: 1.6 }],
      catalogue: [{ region: 'survey', fluxErgCm2S: 4e-12, count: 15 }],
    }, { regions });
    expect(r.variants.map((v) => v.label)).toEqual(['steep', 'flat']);
    expect(r.realisations).toBe(12);
    // A flatter luminosity function needs fewer sources to give the same resolved count (more bright ones).
    expect(r.variants[1].count).toBeLessThan(r.variants[0].count);
    // Sources resolved in the survey are a subset of all sources there, at every flux.
    const sv = r.counts.find((c) => c.region === 'survey')!;
    sv.all.forEach((a, k) => expect(sv.resolved[k].mean).toBeLessThanOrEqual(a.mean + 1e-12));
    // N(>S) never rises with S.
    for (let k = 1; k < sv.all.length; k++) expect(sv.all[k].mean).toBeLessThanOrEqual(sv.all[k - 1].mean);
    // The resolved count above the calibration flux is near the catalogue's 25 (spread: realisations, Poisson, variants).
    const k20 = 20; // the default grid runs from threshold / 100 to threshold x 100 in 41 points: grid[20] = 2e-12
    expect(r.grid[k20] / 2e-12).toBeCloseTo(1, 9);
    expect(Math.abs(sv.resolved[k20].mean - 25)).toBeLessThan(8); // about 3 sigma of the Monte Carlo and calibration errors
    const sky = r.counts.find((c) => c.region === '(sky)')!;
    expect(sky.all[0].mean).toBeGreaterThan(sv.all[0].mean);
    expect(r.unresolvedMeasured![1].mean).toBeGreaterThan(0);
    expect(r.term!.samples).toBe(12);
    const corr = correctScaledInput({ energiesGeV: r.energiesGeV, intensity: [1e-12, 1e-13, 1e-14], factor: 2.5, sigma: [1e-13, 1e-14, 1e-15] }, r.term!);
    const d1 = column(r.term!.neutrino, 3, 1), u1 = column(r.term!.measured, 3, 1);
    const meanDelta = d1.reduce((s, x, i) => s + x - 2.5 * u1[i], 0) / d1.length;
    expect(corr.intensity[1] / (1e-13 + meanDelta)).toBeCloseTo(1, 12);
    expect(corr.sigmaTotal![1]).toBeGreaterThanOrEqual(1e-14);
    expect(r.catalogue[0].modelMean).toBeGreaterThan(0);
    expect(r.tables.counts.split('\n')[1]).toBe('region,flux_erg_cm2_s,all_mean,all_p16,all_p84,resolved_mean,resolved_p16,resolved_p84');
    expect(r.tables.counts.trim().split('\n').length).toBe(2 + 2 * 41);
    expect(r.tables.intensities.trim().split('\n').length).toBe(2 + 3);
    expect(r.svg.startsWith('<svg')).toBe(true);
    expect(r.svg).toContain('<polyline');
    expect(r.svg).toContain('<circle');
    expect(r.svg).not.toMatch(/NaN|undefined|<script/);
    expect(() => correctScaledInput({ energiesGeV: [1, 2, 3], intensity: [1, 1, 1], factor: 1 }, r.term!)).toThrow(/differs from the population/);
  });
});
