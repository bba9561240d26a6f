/**
 * Numbers that cannot be trusted are never printed as results: blank or NaN
 * pixels inside the measured region are excluded and counted (the count is
 * in every table), a region smaller than a pixel gives a marked warning, a
 * template that is zero, negative or blank over a region is a ComputeError
 * with no table written, and a Monte Carlo whose samples are mostly
 * non-finite is a ComputeError. No table the CLI writes holds NaN or Infinity.
 * The factor values themselves are checked against healpy in test/scaling/;
 * here the expectations are the counts we put in (by construction) and the
 * error contract (common practice, no source).
 */
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { ComputeError } from '../../src/core/errors.js';
import { monteCarlo } from '../../src/compare/propagate.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { testMap } from '../io/fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const NSIDE = 16;
const root = tempDir('skyspan-untrusted-');
const regions = join(root, 'regions.yaml');
writeFileSync(regions, `frame: galactic
regions:
  survey: { box: { lonDeg: [20, 110], latDeg: [-10, 10] } }
  sky: { sky: true }
  speck: { disc: { atDeg: [60, 3], radiusDeg: 0.05 } }
`);

/** Pixels whose centre is in the survey box at NSIDE (centre mode), from the region layer itself. */
const surveyPixels: number[] = (() => {
  const w = evaluateRegion(parseRegionDocument(readFileSync(regions, 'utf8'), regions), 'survey', { nside: NSIDE, frame: 'galactic', mode: 'centre' });
  const out: number[] = [];
  w.fraction.forEach((f, i) => { if (f > 0) out.push(i); });
  return out;
})();

async function cli(argv: string[]) {
  let out = '', err = '';
  const code = await runCli(argv, { out: (t) => { out += t; }, err: (t) => { err += t; } });
  return { code, out, err };
}

/** Writes a template folder with one map whose plane is `plane` and returns the folder. */
function templateFolder(name: string, plane: Float32Array): string {
  const d = join(root, name);
  mkdirSync(d);
  writeMapFile(join(d, `${name}.fits`), testMap(NSIDE, { planes: [plane], frame: 'galactic' }), { dtype: 'float32' });
  return d;
}

const smooth = () => Float32Array.from(testMap(NSIDE).planes[0]);
const allText = (dir: string) => readdirSync(dir).map((f) => [f, readFileSync(join(dir, f), 'utf8')] as const);

function expectNoNonFinite(dir: string): void {
  for (const [f, text] of allText(dir)) {
    expect(text, `${f} holds NaN`).not.toMatch(/\bNaN\b/);
    expect(text, `${f} holds Infinity`).not.toMatch(/Infinity|\binf\b/i);
  }
}

describe('blank and NaN pixels inside the measured region', () => {
  // 5 BLANK and 4 NaN pixels placed inside the survey box: 9 excluded pixels, by construction.
  const plane = smooth();
  const blanks = [0, 3, 7, 11, 19].map((k) => surveyPixels[k]);
  const nans = [2, 5, 13, 23].map((k) => surveyPixels[k]);
  for (const p of blanks) plane[p] = BLANK;
  for (const p of nans) plane[p] = NaN;
  const templates = templateFolder('holey', plane);
  const out = join(root, 'holey-out');
  mkdirSync(out);

  it('are excluded, counted (9) in every table and in a marked warning; no table shows NaN or Infinity', async () => {
    expect(surveyPixels.length).toBeGreaterThan(30);
    const r = await cli(['factors', '--regions', regions, '--measured', 'survey', '--target', 'sky', '--templates', templates, '--centre', '-o', out]);
    expect(r.code).toBe(0);
    expect(r.err, 'stderr').toMatch(/^skyspan: WARNING: template 'holey' plane 0: 9 blank pixels in measured region 'survey' excluded$/m);
    const json = JSON.parse(readFileSync(join(out, 'factors.json'), 'utf8'));
    const text = JSON.stringify(json);
    expect(text).toMatch(/"blankMeasured":9/);
    expect(Number.isFinite(json.rows[0].kI) && json.rows[0].kI > 0).toBe(true);
    const csv = readFileSync(join(out, 'factors.csv'), 'utf8');
    const lines = csv.split('\n').filter((l) => l && !l.startsWith('#'));
    const header = lines[0].split(',');
    expect(lines[1].split(',')[header.indexOf('blankMeasured')]).toBe('9');
    for (const [f, t] of allText(out)) expect(t, `${f} lacks the warning`).toContain('9 blank pixels');
    expectNoNonFinite(out);
  });
});

describe('a region smaller than a pixel', () => {
  it('fraction mode: a marked warning on stderr and in the tables, finite numbers', async () => {
    const templates = templateFolder('plain', smooth());
    const out = join(root, 'speck-out');
    mkdirSync(out);
    const r = await cli(['factors', '--regions', regions, '--measured', 'speck', '--target', 'sky', '--templates', templates, '-o', out]);
    expect(r.code).toBe(0);
    expect(r.err, 'stderr').toMatch(/^skyspan: WARNING: region 'speck' covers .* of a pixel at Nside 16; factors rest on sub-pixel coverage$/m);
    for (const [f, t] of allText(out)) expect(t, `${f} lacks the warning`).toMatch(/WARNING: region 'speck' covers/);
    expectNoNonFinite(out);
  });

  it('centre mode, where it holds no pixel centre: a ComputeError, and no table written', async () => {
    const templates = join(root, 'plain');
    const out = join(root, 'speck-centre-out');
    mkdirSync(out);
    const r = await cli(['factors', '--regions', regions, '--measured', 'speck', '--target', 'sky', '--templates', templates, '--centre', '-o', out]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/^skyspan: region 'speck' is empty at Nside 16 .*no factor can be formed\n$/);
    expect(readdirSync(out)).toEqual([]);
  });
});

describe('a template that is zero, negative or blank over a region', () => {
  const cases: [string, (p: Float32Array) => void, RegExp][] = [
    ['zero over the measured region', (p) => { for (const i of surveyPixels) p[i] = 0; }, /has mean 0 over region 'survey'; factors need a template that is positive there/],
    ['negative over the measured region', (p) => { for (const i of surveyPixels) p[i] = -1; }, /has mean -1 over region 'survey'; factors need a template that is positive there/],
    ['blank over all of the measured region', (p) => { for (const i of surveyPixels) p[i] = BLANK; }, /is blank over all of region 'survey' \(\d+ blank pixels\); no factor can be formed/],
    ['NaN over all of the measured region', (p) => { for (const i of surveyPixels) p[i] = NaN; }, /is blank over all of region 'survey'/],
    ['zero over the whole sky', (p) => p.fill(0), /has mean 0 over region/],
  ];
  it.each(cases)('%s: a ComputeError on one line, exit 1, no table written', async (name, edit, message) => {
    const plane = smooth();
    edit(plane);
    const templates = templateFolder(`t-${name.replace(/\W+/g, '-')}`, plane);
    const out = join(root, `out-${name.replace(/\W+/g, '-')}`);
    mkdirSync(out);
    const r = await cli(['factors', '--regions', regions, '--measured', 'survey', '--target', 'sky', '--templates', templates, '--centre', '-o', out]);
    expect(r.code).toBe(1);
    const lines = r.err.trimEnd().split('\n');
    expect(lines[lines.length - 1]).toMatch(message);
    expect(lines[lines.length - 1]).toMatch(/^skyspan: /);
    expect(r.err).not.toMatch(/^\s+at /m);
    expect(readdirSync(out)).toEqual([]);
  });
});

describe('a Monte Carlo whose samples are mostly non-finite', () => {
  it('is a ComputeError naming the count, not a summary of NaN', () => {
    // 70 % of the samples (u < 0.7) give NaN: far above the tolerated half.
    let err: unknown;
    try {
      monteCarlo({ u: { kind: 'uniform', low: 0, high: 1 } }, (x) => (x.u < 0.7 ? NaN : x.u), { samples: 1000, seed: 4, label: 'the test quantity' });
    } catch (e) { err = e; }
    expect(err).toBeInstanceOf(ComputeError);
    expect((err as Error).message).toMatch(/^Monte Carlo of the test quantity: \d+ of 1000 samples are non-finite/);
    const bad = Number(/: (\d+) of 1000/.exec((err as Error).message)![1]);
    expect(bad).toBeGreaterThan(650);
    expect(bad).toBeLessThan(750);
  });

  it('infinite samples count as non-finite too', () => {
    expect(() => monteCarlo({ u: { kind: 'uniform', low: 0, high: 1 } }, (x) => 1 / (x.u < 0.8 ? 0 : x.u), { samples: 500, seed: 2 }))
      .toThrow(ComputeError);
  });

  it('a few non-finite samples (10 %) are tolerated and the summary is finite', () => {
    const r = monteCarlo({ u: { kind: 'uniform', low: 0, high: 1 } }, (x) => (x.u < 0.1 ? NaN : x.u), { samples: 2000, seed: 5 });
    expect(Number.isFinite(r.summary.median)).toBe(true);
    expect(r.summary.median).toBeGreaterThan(0.5);
  });

  it('through compare: factors that make the prediction non-finite give one clear line and no table', async () => {
    // An invented factors file whose templates have k_I = 0 or non-positive survival: nothing finite can be predicted.
    const d = mkdtempSync(join(root, 'compare-'));
    const points = join(d, 'points.csv');
    writeFileSync(points, '# invented\n# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err_low,err_high,ul\n'
      + [1, 3, 10, 30].map((e) => { const v = 1e-12 * e ** -2.7; return `${e},${v},${0.1 * v},${0.12 * v},0`; }).join('\n') + '\n');
    const factors = join(d, 'factors.json');
    writeFileSync(factors, JSON.stringify({ templates: [{ name: 'a', kI: 0 }, { name: 'b', kI: -1 }] }));
    const out = join(d, 'out');
    mkdirSync(out);
    const r = await cli(['compare', '--gamma', points, '--factors', factors, '--samples', '500', '-o', out]);
    expect(r.code).toBe(1);
    expect(r.err.trimEnd().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/^skyspan: .*(kI|k_I|factor)/);
    expect(readdirSync(out)).toEqual([]);
  });
});
