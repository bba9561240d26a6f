/**
 * Survival maps reduced through the row-block stream (plan/survivalStream.ts)
 * give, per plane, the same bits as the whole-map path (regionSurvival on
 * the decoded map, the path runs took before): float32 and float64, plain
 * and gzip, IMPLICIT and EXPLICIT tables, NESTED, blank, zero and negative
 * survival pixels, fractional coverage and exposure, blocks of a few rows.
 * Each value is also checked against the formula evaluated directly in the
 * test, P_A = sum(f w S T) / sum(f w T) (docs/plan.md; common practice, no
 * source). Refusals: a survival map without energies, or on another Nside.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { createSkyMap } from '../../src/maps/create.js';
import type { RegionWeights } from '../../src/regions/types.js';
import { nside2npix } from '../../src/sphere/nside.js';
import { streamRegionSurvival, wholeRegionSurvival } from '../../src/plan/survivalStream.js';
import { analyticTemplate, weightsFromPixels } from '../scaling/fixtures.js';
import { readSkyMap } from '../../src/io/mapFile.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { loadPlan } from '../../src/plan/loadPlan.js';
import { runPlan } from '../../src/plan/runPlan.js';
import { survivalPathFor } from '../../src/templates/writeTemplate.js';
import { makePlanFixture } from './fixture.js';
import { tempDir } from '../helpers/tempDir.js';

const NSIDE = 16, NPIX = nside2npix(NSIDE), ENERGIES = [3e4, 1e5, 3e5, 1e6];
const dir = tempDir('skyspan-survival-');

/** Invented survival planes in (0, 1], with a few blank (NaN), zero and negative pixels. */
function survivalPlanes(): Float64Array[] {
  return ENERGIES.map((e, k) => Float64Array.from({ length: NPIX }, (_, p) => {
    if (p % 97 === 5) return NaN;
    if (p % 89 === 7) return 0;
    if (p % 113 === 9 && k === 1) return -0.5;
    return Math.exp(-(e / 1e6) * (0.3 + 0.7 * Math.abs(Math.sin(0.37 * p + k))));
  }));
}

function weights(): RegionWeights {
  const pixels: number[] = [], fraction: number[] = [], exposure: number[] = [];
  for (let p = 0; p < NPIX; p += 3) { pixels.push(p); fraction.push(p % 2 ? 1 : 0.25 + (p % 7) / 10); exposure.push(0.2 + (p % 11) / 11); }
  return weightsFromPixels(NSIDE, 'patch', pixels, { fraction, exposure }) as RegionWeights;
}

function template(ordering: 'RING' | 'NESTED') {
  const m = analyticTemplate(NSIDE, ordering);
  return { ...m, planes: [m.planes[0], Float64Array.from(m.planes[0], (v) => v * v + 0.1)] };
}

/** P_A = sum(f w S T) / sum(f w T) straight from the definition (pixels with S <= 0 or blank left out). */
function direct(s: Float64Array, t: ArrayLike<number>, w: RegionWeights, useExposure: boolean): number {
  let num = 0, den = 0;
  for (let p = 0; p < NPIX; p++) {
    if (!(s[p] > 0) || w.fraction[p] === 0) continue;
    const ww = w.fraction[p] * (useExposure ? w.exposure![p] : 1);
    num += ww * s[p] * t[p];
    den += ww * t[p];
  }
  return num / den;
}

describe('survival maps through the row-block stream', () => {
  const cases: [string, 'RING' | 'NESTED', { dtype?: 'float32' | 'float64'; layout?: 'implicit' | 'explicit' }][] = [
    ['f32.fits', 'RING', { dtype: 'float32' }],
    ['f64.fits.gz', 'RING', { dtype: 'float64' }],
    ['explicit.fits', 'RING', { layout: 'explicit' }],
    ['nested.fits', 'NESTED', { dtype: 'float32' }],
  ];
  for (const [name, ordering, opts] of cases) {
    it(`${name}: the same bits as the whole-map path, with and without exposure`, async () => {
      const file = join(dir, name);
      const planes = survivalPlanes();
      writeMapFile(file, createSkyMap({ nside: NSIDE, ordering, frame: 'galactic', column: 'SURVIVAL', unit: '', planes,
        energiesGeV: Float64Array.from(ENERGIES) }), opts);
      const t = template(ordering), w = weights();
      for (const useExposure of [true, false]) {
        const whole = wholeRegionSurvival(file, t, () => w, useExposure);
        for (const blockBytes of [undefined, 200]) {
          const streamed = await streamRegionSurvival(file, t, () => w, useExposure, undefined, blockBytes);
          expect(Array.from(streamed.energiesGeV)).toEqual(ENERGIES);
          expect(Array.from(streamed.survival)).toEqual(Array.from(whole.survival));
        }
        whole.survival.forEach((p, k) => {
          const stored = opts.dtype === 'float32' ? Float64Array.from(Float32Array.from(planes[k])) : planes[k];
          expect(Math.abs(p / direct(stored, t.planes[Math.min(k, 1)], w, useExposure) - 1)).toBeLessThan(1e-12);
          expect(p > 0 && p < 1).toBe(true);
        });
      }
    });
  }

  it('refuses a survival map without energies, or on another Nside than the template, naming the file', async () => {
    const noE = join(dir, 'no-energies.fits');
    writeMapFile(noE, createSkyMap({ nside: NSIDE, ordering: 'RING', frame: 'galactic', column: 'SURVIVAL', unit: '', planes: survivalPlanes().slice(0, 1) }));
    await expect(streamRegionSurvival(noE, template('RING'), () => weights(), true)).rejects.toThrow(/no-energies\.fits.*states no energies/);
    const coarse = join(dir, 'coarse.fits');
    writeMapFile(coarse, createSkyMap({ nside: 8, ordering: 'RING', frame: 'galactic', column: 'SURVIVAL', unit: '',
      planes: [new Float64Array(nside2npix(8)).fill(0.5)], energiesGeV: Float64Array.from([1e5]) }));
    const err = await streamRegionSurvival(coarse, template('RING'), () => weights(), true).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InputError);
    expect(String((err as Error).message)).toMatch(/coarse\.fits.*Nside 8, the template at 16/);
  });

  it('a plan run\'s survival table holds, per template and energy, the whole-map value at the nearest survival plane', async () => {
    const fx = makePlanFixture({ samples: 200 });
    const r = await runPlan(fx.plan, { outDir: join(fx.dir, 'out'), cache: false });
    const table = r.computation.survival!;
    const doc = loadPlan(fx.plan).regions;
    for (const name of ['narrow', 'wide']) {
      const file = join(fx.templates, `${name}.fits`);
      const whole = wholeRegionSurvival(survivalPathFor(file), readSkyMap(file), (nside, frame) => evaluateRegion(doc, 'measured', { nside, frame, mode: 'fraction' }), true);
      const logE = Array.from(whole.energiesGeV, Math.log);
      const expected = table.energiesGeV.map((e) => {
        const k = logE.reduce((best, x, i) => (Math.abs(x - Math.log(e)) < Math.abs(logE[best] - Math.log(e)) ? i : best), 0);
        return Math.min(1, whole.survival[k]);
      });
      expect(table.byTemplate[name]).toEqual(expected);
      expect(new Set(expected).size).toBeGreaterThan(1);
    }
  }, 120_000);
});
