/**
 * Factor kernels and the ensemble computation, with region weights made by
 * hand (no regions layer). Sources named beside each check.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { computeFactorsWith, type FactorTemplate } from '../../src/scaling/ensembleFactors.js';
import { ComputeError, InputError } from '../../src/core/errors.js';
import { pixelAreaSr, nside2npix } from '../../src/sphere/nside.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { requirePython, runPython, skipWithoutPython } from '../helpers/python.js';
import { analyticTemplate, fixedEvaluator, uniformTemplate, weightsFromPixels, weightsFromPredicate, wholeSky } from './fixtures.js';

const NSIDE = 32;
const DEG = Math.PI / 180;
// A Galactic box l 20..110 deg, |b| < 10 deg, and the strip |b| < 10 deg, by pixel centre.
const box = weightsFromPredicate(NSIDE, 'box', (th, ph) => Math.abs(Math.PI / 2 - th) < 10 * DEG && ph >= 20 * DEG && ph <= 110 * DEG);
const strip = weightsFromPredicate(NSIDE, 'strip', (th) => Math.abs(Math.PI / 2 - th) < 10 * DEG);
const sky = wholeSky(NSIDE);
const evaluate = fixedEvaluator([box, strip, sky]);
const count = (w: { fraction: Float32Array }) => w.fraction.reduce((s, f) => s + f, 0);

function run(templates: FactorTemplate[], extra: Partial<Parameters<typeof computeFactorsWith>[0]> = {}, ev = evaluate) {
  return computeFactorsWith({ templates, measured: 'box', targets: ['strip', 'sky'], mode: 'centre', ...extra }, ev);
}

describe('uniform template (definition of the factors; common practice, no source)', () => {
  it('k_I = 1, k_F = Omega_B in pixel terms, 4 pi factor = 1, covered fraction = pixel ratio', () => {
    for (const ordering of ['RING', 'NESTED'] as const) {
      const r = run([{ name: 'flat', map: uniformTemplate(NSIDE, 2.5, ordering) }]);
      const [s, k] = r.rows;
      expect(s.kI).toBe(1);
      expect(s.kFSr).toBe(count(strip) * pixelAreaSr(NSIDE));
      expect(k.kFSr).toBe(4 * Math.PI);
      expect(s.fourPiFactor).toBe(1);
      expect(s.coveredFluxFraction).toBeCloseTo(count(box) / count(strip), 14);
      expect(k.coveredFluxFraction).toBeCloseTo(count(box) / nside2npix(NSIDE), 14);
      expect(s.solidAngleMeasuredSr).toBeCloseTo(count(box) * pixelAreaSr(NSIDE), 14);
    }
  });

  it('fractional weights and an exposure leave k_I = 1 and give k_F = sum(f_B) x pixel area', () => {
    const n = nside2npix(NSIDE);
    const pix = Array.from({ length: 200 }, (_, i) => (i * 37) % n);
    const frac = pix.map((_, i) => 0.05 + (i % 19) / 20);
    const a = weightsFromPixels(NSIDE, 'box', pix, { fraction: frac, exposure: frac.map((f) => 1 - f / 2) });
    const b = weightsFromPixels(NSIDE, 'strip', pix.slice(50), { fraction: frac.slice(50) });
    const r = run([{ name: 'flat', map: uniformTemplate(NSIDE) }], {}, fixedEvaluator([a, b, sky]));
    expect(r.rows[0].kI).toBe(1);
    expect(r.rows[0].kFSr).toBeCloseTo(frac.slice(50).reduce((s, f) => s + Math.fround(f), 0) * pixelAreaSr(NSIDE), 13);
    expect(r.exposureWeighted).toBe(true);
  });
});

describe('identities (property, seeded; follow from the definitions, no source)', () => {
  it('factors do not depend on the template normalisation; k_F = k_I Omega_B', () => {
    const base = run([{ name: 't', map: analyticTemplate(NSIDE) }]).rows;
    fc.assert(fc.property(fc.double({ min: 1e-20, max: 1e20, noNaN: true }), (c) => {
      const m = analyticTemplate(NSIDE);
      const p = m.planes[0];
      for (let i = 0; i < p.length; i++) p[i] *= c;
      const rows = run([{ name: 't', map: m }]).rows;
      rows.forEach((r, i) => {
        expect(r.kI).toBeCloseTo(base[i].kI, 12);
        expect(r.kFSr / (r.kI * r.solidAngleTargetSr)).toBeCloseTo(1, 13);
        expect(r.coveredFluxFraction).toBeCloseTo(base[i].coveredFluxFraction, 12);
      });
    }), { seed: 7, numRuns: 20 });
  });
});

describe('against healpy + numpy (scripts/factor_reference.py)', () => {
  const job = {
    nside: 128, site_lat_deg: 33, zenith_max_deg: 45, box_l_deg: [20, 110], box_b_deg: [-4, 4],
    discs_deg: [[35, 0.5, 1.5], [52, -1, 1], [78.5, 2, 2], [96, 0, 1.2]], strip_b_deg: 4, blank_stride: 101, pixels: true,
  };
  it.skipIf(skipWithoutPython)('footprint, box and discs, blank pixels counted, unweighted and exposure-weighted: factors to 1e-6', () => {
    requirePython(); // under CI=true a missing reference fails here
    const refs = JSON.parse(runPython('scripts/factor_reference.py', [], JSON.stringify({ jobs: [{ ...job, exposure: false }, { ...job, exposure: true }] })));
    for (const exposure of [false, true]) {
      const ref = refs[exposure ? 1 : 0];
      const ns = job.nside;
      const a = weightsFromPixels(ns, 'survey', ref.pixelsMeasured, exposure ? { exposure: ref.exposureMeasured } : {});
      const b = weightsFromPixels(ns, 'strip', ref.pixelsStrip);
      const ev = fixedEvaluator([a, b, wholeSky(ns)]);
      for (const [ordering, blank] of [['RING', NaN], ['NESTED', BLANK]] as const) {
        const r = computeFactorsWith({ templates: [{ name: 't', map: analyticTemplate(ns, ordering, job.blank_stride, blank) }],
          measured: 'survey', targets: ['strip', 'sky'], mode: 'centre' }, ev);
        // The exposure went through Float32 on our side: 1e-6 relative covers it.
        const tol = (x: number, y: number) => expect(Math.abs(x / y - 1)).toBeLessThan(exposure ? 1e-6 : 1e-12);
        expect(r.rows.length).toBeGreaterThan(0);
        for (const row of r.rows) {
          const t = ref.targets[row.target === 'strip' ? 'strip' : 'sky'];
          tol(row.meanMeasured, ref.meanMeasured);
          tol(row.fourPiFactor, ref.fourPiFactor);
          tol(row.solidAngleMeasuredSr, ref.solidAngleMeasuredSr);
          tol(row.meanTarget, t.meanTarget);
          tol(row.kI, t.kI);
          tol(row.kFSr, t.kFSr);
          tol(row.solidAngleTargetSr, t.solidAngleTargetSr);
          tol(row.coveredFluxFraction, t.coveredFluxFraction);
          expect(row.blankMeasured).toBe(ref.blankMeasured);
          expect(row.blankTarget).toBe(t.blankTarget);
        }
        expect(ref.blankMeasured).toBeGreaterThan(0);
        expect(r.warnings.some((w) => w.includes(`${ref.blankMeasured} blank pixels in measured region`))).toBe(true);
      }
    }
  });
});

describe('results that cannot be trusted are refused (common practice, no source)', () => {
  it('an empty region is a ComputeError naming it', () => {
    const empty = weightsFromPixels(NSIDE, 'box', []);
    expect(() => run([{ name: 't', map: analyticTemplate(NSIDE) }], {}, fixedEvaluator([empty, strip, sky])))
      .toThrow(/region 'box' is empty at Nside 32/);
  });
  it('a template zero, negative on average, or blank over the measured region is a ComputeError', () => {
    const inBox = (v: number) => {
      const m = analyticTemplate(NSIDE);
      box.fraction.forEach((f, p) => { if (f > 0) m.planes[0][p] = v; });
      return m;
    };
    expect(() => run([{ name: 'zero', map: inBox(0) }])).toThrow(ComputeError);
    expect(() => run([{ name: 'zero', map: inBox(0) }])).toThrow(/template 'zero' plane 0 .* has mean 0 over region 'box'/);
    expect(() => run([{ name: 'neg', map: inBox(-1) }])).toThrow(/mean -1/);
    expect(() => run([{ name: 'gone', map: inBox(NaN) }])).toThrow(/blank over all of region 'box'/);
    expect(() => run([{ name: 'gone', map: inBox(BLANK) }])).toThrow(/blank over all of region 'box'/);
  });
  it('no table value is ever non-finite: Infinity pixels count as blank', () => {
    const m = analyticTemplate(NSIDE);
    const p = box.fraction.findIndex((f) => f > 0);
    m.planes[0][p] = Infinity;
    const r = run([{ name: 't', map: m }]);
    expect(r.rows[0].blankMeasured).toBe(1);
    for (const row of r.rows) for (const v of Object.values(row)) if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
  });
  it('negative pixels and a sub-pixel region give marked warnings', () => {
    const m = analyticTemplate(NSIDE);
    const p = box.fraction.findIndex((f) => f > 0);
    m.planes[0][p] = -0.01;
    expect(run([{ name: 't', map: m }]).warnings.some((w) => /^WARNING: .*1 negative pixels in measured region 'box'/.test(w))).toBe(true);
    const tiny = weightsFromPixels(NSIDE, 'box', [p], { fraction: [0.25] });
    const r = run([{ name: 't', map: analyticTemplate(NSIDE) }], {}, fixedEvaluator([tiny, strip, sky]));
    expect(r.warnings.some((w) => /region 'box' covers 0.250 of a pixel/.test(w))).toBe(true);
  });
  it('refuses before allocating when the memory estimate exceeds the limit, naming it and the way out', () => {
    expect(() => run([{ name: 't', map: analyticTemplate(NSIDE) }], { memoryLimitBytes: 1000 }))
      .toThrow(/at Nside 32 needs about 192 KiB, more than the 1 KiB \(limit given as an option\); lower the working Nside \(e.g. --nside 16\)/);
  });
});

describe('ensembles, geometry notes and input checks', () => {
  it('every template x plane x target, and a summary with median/p16/p84/min/max', () => {
    const ts = [0.5, 1, 2, 4].map((s, i) => {
      const m = analyticTemplate(NSIDE);
      const p = m.planes[0];
      for (let k = 0; k < p.length; k++) p[k] = Math.pow(p[k], s); // different shapes
      return { name: `t${i}`, map: { ...m, planes: [p, p.map((v) => v + 0.1 * i)], energiesGeV: new Float64Array([1e3, 1e4]) } };
    });
    const r = run(ts);
    expect(r.rows).toHaveLength(4 * 2 * 2);
    expect(r.summary).toHaveLength(2 * 2 * 4);
    const kI = r.rows.filter((x) => x.target === 'strip' && x.plane === 0).map((x) => x.kI).sort((a, b) => a - b);
    const s = r.summary.find((x) => x.target === 'strip' && x.plane === 0 && x.quantity === 'kI')!;
    expect(s.median).toBeCloseTo((kI[1] + kI[2]) / 2, 14); // type 7 with n = 4 (Hyndman & Fan 1996)
    expect(s.min).toBe(kI[0]);
    expect(s.max).toBe(kI[3]);
    expect(s.p16).toBeCloseTo(kI[0] + 0.48 * (kI[1] - kI[0]), 14); // h = 3 x 0.16 = 0.48
    expect(s.energyGeV).toBe(1e3);
    const w = run(ts.map((t, i) => ({ ...t, weight: i === 3 ? 0 : 1 })));
    expect(w.summary.find((x) => x.quantity === 'kI')!.max).toBe(Math.max(...w.rows.filter((x) => x.template !== 't3' && x.target === 'strip' && x.plane === 0).map((x) => x.kI)));
  });
  it('a template at another Nside or frame than requested gets a note; unknown frame needs one stated', () => {
    const r = run([{ name: 't', map: analyticTemplate(NSIDE) }], { requested: { nside: 64, frame: 'galactic' } });
    expect(r.notes.join('\n')).toMatch(/template 't' is at Nside 32 in galactic coordinates \(requested Nside 64, galactic\); its regions were evaluated at Nside 32/);
    const unknown = { ...analyticTemplate(NSIDE), frame: 'unknown' as const };
    expect(() => run([{ name: 'u', map: unknown }])).toThrow(InputError);
    expect(run([{ name: 'u', map: unknown }], { assumeFrame: 'galactic' }).rows).toHaveLength(2);
  });
  it('rejects duplicate names, partial weights and no targets', () => {
    const m = analyticTemplate(NSIDE);
    expect(() => run([{ name: 'a', map: m }, { name: 'a', map: m }])).toThrow(/two templates are named 'a'/);
    expect(() => run([{ name: 'a', map: m, weight: 1 }, { name: 'b', map: m }])).toThrow(/weights given for 1 of 2/);
    expect(() => computeFactorsWith({ templates: [{ name: 'a', map: m }], measured: 'box', targets: [] }, evaluate)).toThrow(/no target/);
  });
});
