/**
 * `skyspan run` on a small invented plan: the run's numbers equal the library
 * API's for the same inputs (computeFactors, predictNeutrinos and
 * compareAtReference called directly), the survival table equals an
 * independent sum over the region's pixels (the emission-weighted mean,
 * common practice, no source), the cache is hit on a second run with identical
 * numbers and bypassed with --no-cache, and existing outputs are refused
 * without --force.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runPlan } from '../../src/plan/runPlan.js';
import { computeFactors } from '../../src/scaling/factors.js';
import { readTemplateFiles, listTemplateFiles } from '../../src/scaling/templateFiles.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { readSkyMap } from '../../src/io/mapFile.js';
import { readSpectrumPoints } from '../../src/physics/points.js';
import { readMeasurement } from '../../src/compare/measurement.js';
import { predictNeutrinos } from '../../src/compare/predict.js';
import { compareAtReference } from '../../src/compare/tension.js';
import { survivalPathFor } from '../../src/templates/writeTemplate.js';
import { runCli } from '../../src/cli/main.js';
import { makePlanFixture } from './fixture.js';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('skyspan run', () => {
  const fx = makePlanFixture({ absorption: 'cmb' });
  const out = join(fx.dir, 'out');
  const cacheDir = join(fx.dir, 'cache');
  let first: Awaited<ReturnType<typeof runPlan>>;

  it('equals the library API for the same inputs', async () => {
    first = await runPlan(fx.plan, { outDir: out, cacheDir });
    const res = JSON.parse(readFileSync(join(out, 'results.json'), 'utf8'));
    const doc = parseRegionDocument(readFileSync(join(fx.dir, 'regions.yaml'), 'utf8'), join(fx.dir, 'regions.yaml'));
    const templates = readTemplateFiles(listTemplateFiles([fx.templates]).filter((f) => !f.includes('-survival')));
    const fr = computeFactors({ templates: templates.map((t) => ({ name: t.name, map: t.map })), regions: doc, measured: 'measured',
      targets: ['sky', 'plane'], mode: 'fraction', exposureWeighted: true });
    const sky = fr.rows.filter((r) => r.target === 'sky');
    expect(res.factorsAtE0.map((f: { template: string }) => f.template)).toEqual(sky.map((r) => r.template));
    res.factorsAtE0.forEach((f: { kI: number }, i: number) => expect(rel(f.kI, sky[i].kI)).toBeLessThan(1e-12));

    // survival: independent pixel sum over the measured region, exposure weighted
    const w = evaluateRegion(doc, 'measured', { nside: 32, frame: 'galactic', mode: 'fraction' });
    for (const t of templates) {
      const s = readSkyMap(survivalPathFor(t.file));
      const e = s.energiesGeV!;
      const k = Array.from(e).findIndex((x) => x === 200e3);
      let num = 0, den = 0;
      for (let p = 0; p < w.fraction.length; p++) {
        const ww = w.fraction[p] * w.exposure![p], T = t.map.planes[0][p];
        num += ww * T * s.planes[k][p]; den += ww * T;
      }
      const j = res.survival.energiesGeV.indexOf(200e3);
      expect(rel(res.survival.byTemplate[t.name][j], num / den)).toBeLessThan(1e-9);
    }

    // prediction at E0 and the comparison, straight from the compare layer
    const points = readSpectrumPoints(join(fx.dir, 'gamma-points.csv'));
    const m = readMeasurement(join(fx.dir, 'neutrino.yaml'));
    // the run reads survival per gamma-ray energy (the proton fit de-absorbs each point at its own energy)
    const factors = res.factorsAtE0.map((f: { template: string; kI: number }) => ({ template: f.template, kI: f.kI,
      survivalByEnergy: { energiesGeV: res.survival.energiesGeV, values: res.survival.byTemplate[f.template] } }));
    const p = predictNeutrinos({ gamma: { kind: 'points', points }, factors, e0GeV: 1e5, energiesNuGeV: [],
      samples: 2000, seed: 5, region: 'sky', methods: ['kab', 'kpi'], channel: 'pp', flavourRatio: [1, 1, 1] });
    const comb = p.components.find((c) => c.name === 'combined')!.atE0;
    const runComb = res.prediction.components.find((c: { name: string }) => c.name === 'combined').atE0;
    expect(runComb.median).toBe(comb.median);
    expect(runComb.p16).toBe(comb.p16);
    const cmp = compareAtReference(p, m);
    expect(res.comparison.ratio.median).toBe(cmp.ratio.median);
    expect(res.comparison.tension.sigma).toBe(cmp.tension.sigma);
    expect(res.headline.ratioMedian).toBe(cmp.ratio.median);
    expect(res.perEnergyPrediction).toBe(true);
    for (const f of ['report.html', 'provenance.json', 'factors.csv', 'factors.tex', 'comparison.csv', 'spectrum.svg', 'map-template.png', 'survival.csv']) {
      expect(existsSync(join(out, f)), f).toBe(true);
    }
    const prov = JSON.parse(readFileSync(join(out, 'provenance.json'), 'utf8'));
    expect(prov.seed).toBe(5);
    expect(prov.nodeVersion).toBe(process.version);
    expect(prov.inputs.find((i: { role: string }) => i.role === 'gamma-ray points').sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(prov.outputs.map((o: { file: string }) => o.file)).toContain('report.html');
  }, 60000);

  it('hits the cache on a second run with identical numbers; --no-cache recomputes', async () => {
    const again = await runPlan(fx.plan, { outDir: out, cacheDir, force: true });
    expect(again.cache.misses).toEqual([]);
    expect(again.cache.hits.length).toBeGreaterThan(0);
    expect(again.headline.ratioMedian).toBe(first.headline.ratioMedian);
    expect(again.headline.tensionSigma).toBe(first.headline.tensionSigma);
    const fresh = await runPlan(fx.plan, { outDir: join(fx.dir, 'out2'), cache: false });
    expect(fresh.cache.hits).toEqual([]);
    expect(fresh.cache.misses.length).toBeGreaterThan(0);
    expect(fresh.headline.ratioMedian).toBe(first.headline.ratioMedian);
  }, 60000);

  it('refuses existing outputs without --force and writes nothing', async () => {
    const before = readFileSync(join(out, 'results.json'));
    await expect(runPlan(fx.plan, { outDir: out, cacheDir })).rejects.toThrow(/exists already/);
    expect(readFileSync(join(out, 'results.json'))).toEqual(before);
  }, 60000);

  it('runs from the command line and prints the report path', async () => {
    let text = '', err = '';
    const code = await runCli(['run', fx.plan, '-o', join(fx.dir, 'cli'), '--cache-dir', cacheDir], { out: (t) => { text += t; }, err: (t) => { err += t; } });
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(text).toMatch(/report: .*report\.html/);
    expect(text).toMatch(/tension of/);
    const code2 = await runCli(['run', fx.plan, '-o', join(fx.dir, 'cli')], { out: () => {}, err: (t) => { err += t; } });
    expect(code2).toBe(1);
    expect(err).toMatch(/exists already/);
  }, 60000);

  it('without absorption makes one prediction equal to a single library call', async () => {
    const nf = makePlanFixture({ absorption: 'none' });
    const r = await runPlan(nf.plan, { outDir: join(nf.dir, 'out'), cache: false });
    const res = JSON.parse(readFileSync(r.results, 'utf8'));
    expect(res.perEnergyPrediction).toBe(false);
    const points = readSpectrumPoints(join(nf.dir, 'gamma-points.csv'));
    const p = predictNeutrinos({ gamma: { kind: 'points', points }, factors: res.factorsAtE0, e0GeV: 1e5, energiesNuGeV: res.energiesNuGeV,
      samples: 2000, seed: 5, region: 'sky', methods: ['kab', 'kpi'], channel: 'pp', flavourRatio: [1, 1, 1] });
    const c = p.components.find((x) => x.name === 'combined')!;
    const rc = res.prediction.components.find((x: { name: string }) => x.name === 'combined');
    expect(rc.atEnergies.map((s: { median: number }) => s.median)).toEqual(c.atEnergies.map((s) => s.median));
    expect(res.factorsAtE0.every((f: { survivalMean?: number }) => f.survivalMean === undefined)).toBe(true);
  }, 60000);

  it('runs an optional populations section through the populations layer', async () => {
    const pop = ['populations:', '  name: invented-nebulae', '  count: 300', '  spatial: { distribution: lorimer2006, scaleHeightKpc: 0.1 }',
      '  luminosity: { alpha: 1.8, minErgPerS: 1.0e32, maxErgPerS: 1.0e35 }', '  energiesTeV: [10, 50]',
      '  threshold: { fluxErgCm2S: 2.0e-12, referenceDecDeg: 30, siteLatDeg: 31, maxZenithDeg: 45 }',
      '  regions: { measured: measured, neutrino: sky }', '  realisations: 4', '  nside: 32'].join('\n');
    const pf = makePlanFixture({ absorption: 'none', extra: pop });
    const r = await runPlan(pf.plan, { outDir: join(pf.dir, 'out'), cache: false });
    const res = JSON.parse(readFileSync(r.results, 'utf8'));
    expect(res.populations.name).toBe('invented-nebulae');
    expect(existsSync(join(pf.dir, 'out', 'populations-counts.csv'))).toBe(true);
    expect(readFileSync(r.report!, 'utf8')).toContain('invented-nebulae');
    const bad = makePlanFixture({ absorption: 'none', extra: pop.replace('count: 300', 'count: -3') });
    await expect(runPlan(bad.plan, { outDir: join(bad.dir, 'out'), cache: false })).rejects.toThrow(/key populations\.count/);
  }, 60000);
  it('reports an output folder that cannot be made in one line, exit 1 (nothing-lost rule, common practice, no source)', async () => {
    // A path under a regular file cannot be a folder (ENOTDIR), even for root.
    const blocker = join(fx.dir, 'a-file');
    writeFileSync(blocker, 'not a folder');
    let err = '';
    const code = await runCli(['run', fx.plan, '-o', join(blocker, 'out'), '--no-cache'], { out: () => {}, err: (t) => { err += t; } });
    expect(code).toBe(1);
    expect(err.trim().split('\n')).toHaveLength(1);
    expect(err).toMatch(/^skyspan: .*a-file\/out: cannot create the output folder: ENOTDIR/);
  }, 60000);
});
