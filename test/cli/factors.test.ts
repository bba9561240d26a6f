/**
 * `skyspan factors` through runCli: tables in four formats with provenance,
 * overwrite protection, bad options. The numbers themselves are checked
 * against healpy in test/scaling/; here the source of each expectation is the
 * command's own contract (common practice, no source) and SHA-256 of the
 * inputs recomputed with node:crypto.
 */
import { mkdirSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { analyticTemplate } from '../scaling/fixtures.js';
import { tempDir } from '../helpers/tempDir.js';

function capture() {
  const out: string[] = [], err: string[] = [];
  return { io: { out: (t: string) => { out.push(t); }, err: (t: string) => { err.push(t); } }, out, err };
}

const dir = tempDir('skyspan-factors-');
const regions = join(dir, 'regions.yaml');
writeFileSync(regions, `frame: galactic
regions:
  survey:
    all:
      - site: { latDeg: 33, maxZenithDeg: 45 }
      - box: { lonDeg: [20, 110], latDeg: [-4, 4] }
    except: { disc: { atDeg: [52, -1], radiusDeg: 1 } }
  strip: { band: { absLatDeg: [0, 4] } }
  sky: { sky: true }
  nowhere: { disc: { atDeg: [10, 80], radiusDeg: 0.001 } }
`);
const models = join(dir, 'models');
const a = analyticTemplate(16);
const b = analyticTemplate(16);
b.planes[0] = b.planes[0].map((v) => v * v);

mkdirSync(models);
writeMapFile(join(models, 'alpha.fits'), a, { dtype: 'float32' });
writeMapFile(join(models, 'beta.fits'), b, { dtype: 'float32' });
const sha = (p: string) => createHash('sha256').update(readFileSync(p)).digest('hex');

describe('skyspan factors', () => {
  const out = join(dir, 'out');
  mkdirSync(out);
  const argv = ['factors', '--regions', regions, '--measured', 'survey', '--target', 'strip', 'sky', '--templates', models, '--centre', '-o', out];

  it('writes CSV, Markdown, JSON and LaTeX tables, each with provenance and the assumption', async () => {
    const c = capture();
    expect(await runCli(argv, c.io)).toBe(0);
    const csv = readFileSync(join(out, 'factors.csv'), 'utf8');
    const lines = csv.split('\n');
    expect(lines.find((l) => l.includes(`alpha.fits sha256 ${sha(join(models, 'alpha.fits'))}`))).toMatch(/^# input \(template\)/);
    expect(csv).toContain(`regions.yaml sha256 ${sha(regions)}`);
    expect(csv).toMatch(/^# made by skyspan 0\.1\.0 on \d{4}-\d\d-\d\dT/);
    expect(csv).toContain('# assumption: The sky outside the measured region is assumed to look like each template');
    expect(csv).toMatch(/# Nside: 16; frame: galactic/);
    const header = lines.find((l) => !l.startsWith('#'))!.split(',');
    expect(header).toContain('kI');
    const body = lines.filter((l) => l && !l.startsWith('#')).slice(1);
    expect(body).toHaveLength(2 * 2); // 2 templates x 2 targets
    const summary = readFileSync(join(out, 'factors-summary.csv'), 'utf8');
    expect(summary).toMatch(/\nstrip,1,,kI,2,/);
    const json = JSON.parse(readFileSync(join(out, 'factors.json'), 'utf8'));
    expect(json.provenance.inputs.map((i: { sha256: string }) => i.sha256)).toContain(sha(join(models, 'beta.fits')));
    expect(json.provenance.regionSpec.regions.strip).toEqual({ band: { absLatDeg: [0, 4] } });
    expect(json.rows[0].template).toBe('alpha');
    const tex = readFileSync(join(out, 'factors.tex'), 'utf8');
    expect(tex).toMatch(/\\toprule[\s\S]*\\midrule[\s\S]*\\bottomrule/);
    expect(tex).toMatch(/^% made by skyspan/m);
    const md = readFileSync(join(out, 'factors.md'), 'utf8');
    expect(md).toContain('> The sky outside the measured region is assumed');
    expect(md).toMatch(/\| template \| plane \|/);
    expect(c.out.join('')).toMatch(/k_I survey -> strip: median/);
  });

  it('refuses to replace tables without --force, replaces them with it', async () => {
    const c = capture();
    expect(await runCli([...argv, '--format', 'json'], c.io)).toBe(1);
    expect(c.err.join('')).toMatch(/factors\.json: exists already \(pass --force/);
    expect(await runCli([...argv, '--format', 'json', '--force'], capture().io)).toBe(0);
  });

  it('prints JSON with --json and a Markdown table without -o', async () => {
    const c = capture();
    expect(await runCli(argv.slice(0, -2).concat(['--json']), c.io)).toBe(0);
    const j = JSON.parse(c.out.join(''));
    expect(j.rows).toHaveLength(4);
    expect(j.written).toEqual([]);
    const m = capture();
    expect(await runCli(argv.slice(0, -2), m.io)).toBe(0);
    expect(m.out.join('')).toMatch(/^# Extrapolation factors: survey to strip, sky/);
  });

  it('an empty region is one clear error line, exit 1, and no table is written', async () => {
    const c = capture();
    const o2 = join(dir, 'out2');
    mkdirSync(o2);
    expect(await runCli(['factors', '--regions', regions, '--measured', 'nowhere', '--target', 'sky', '--templates', models, '--centre', '-o', o2], c.io)).toBe(1);
    expect(c.err.join('')).toMatch(/^skyspan: region 'nowhere' is empty at Nside 16 in galactic coordinates \(centre mode\)/);
    expect(existsSync(join(o2, 'factors.csv'))).toBe(false);
  });

  it('bad options exit 2 with a message', async () => {
    const c = capture();
    expect(await runCli([...argv, '--format', 'xls'], c.io)).toBe(2);
    expect(c.err.join('')).toMatch(/--format 'xls' is not one of csv, md, json, tex/);
    expect(await runCli([...argv, '--weights', '1'], capture().io)).toBe(2);
  });

  it('--help shows an example', async () => {
    const c = capture();
    expect(await runCli(['factors', '--help'], c.io)).toBe(0);
    expect(c.out.join('')).toMatch(/Example:\n  skyspan factors --regions/);
  });
});
