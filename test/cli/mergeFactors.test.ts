/**
 * `skyspan factors --shard K/N` and `skyspan merge-factors` through runCli:
 * four shards merged give every number of the single run's JSON (rows,
 * summary, regions, notes and warnings) exactly, with a provenance listing
 * each template and each shard; shards of different jobs are refused in one
 * line. Source of each expectation: the command's contract (a merge equals
 * the single run; common practice, no source) and SHA-256 recomputed with
 * node:crypto.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { analyticTemplate } from '../scaling/fixtures.js';

function capture() {
  const out: string[] = [], err: string[] = [];
  return { io: { out: (t: string) => { out.push(t); }, err: (t: string) => { err.push(t); } }, out, err };
}

const dir = mkdtempSync(join(tmpdir(), 'skyspan-merge-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const regions = join(dir, 'regions.yaml');
writeFileSync(regions, `frame: galactic
regions:
  survey:
    all:
      - site: { latDeg: 33, maxZenithDeg: 45 }
      - box: { lonDeg: [20, 110], latDeg: [-4, 4] }
  strip: { band: { absLatDeg: [0, 4] } }
  sky: { sky: true }
`);
const models = join(dir, 'models');
mkdirSync(models);
for (let i = 0; i < 7; i++) {
  const m = analyticTemplate(16, i % 2 ? 'NESTED' : 'RING', i === 2 ? 7 : 0);
  const planes = [0, 1].map((j) => Float64Array.from(m.planes[0], (v) => v ** (1 + 0.1 * i) + 0.01 * j));
  writeMapFile(join(models, `m${i}.fits${i === 5 ? '.gz' : ''}`), { ...m, planes, energiesGeV: Float64Array.from([10, 100]) }, { dtype: 'float32' });
}
const base = ['factors', '--regions', regions, '--measured', 'survey', '--target', 'strip', 'sky', '--templates', models, '--weights', '1,2,1,1,3,1,1'];
const sha = (p: string) => createHash('sha256').update(readFileSync(p)).digest('hex');

async function shards(out: string, extra: string[] = []): Promise<string[]> {
  mkdirSync(out, { recursive: true });
  const files: string[] = [];
  for (let k = 1; k <= 4; k++) {
    const c = capture();
    expect(await runCli([...base, ...extra, '--shard', `${k}/4`, '-o', out], c.io)).toBe(0);
    files.push(join(out, `factors-shard-${k}-of-4.json`));
  }
  return files;
}

describe('shards and merge-factors', () => {
  it('four shards merged equal the single run in every number of the JSON table', async () => {
    const single = capture();
    expect(await runCli([...base, '--json'], single.io)).toBe(0);
    const one = JSON.parse(single.out.join(''));
    const parts = await shards(join(dir, 'parts'));
    const merged = capture();
    expect(await runCli(['merge-factors', ...[...parts].reverse(), '--json'], merged.io)).toBe(0);
    const m = JSON.parse(merged.out.join(''));
    expect(one.rows.length).toBe(7 * 2 * 2);
    expect(one.provenance.warnings.length).toBeGreaterThan(0);
    for (const key of ['rows', 'summary', 'regions'] as const) expect(m[key]).toEqual(one[key]);
    for (const key of ['notes', 'warnings', 'nsides', 'frames', 'measured', 'targets', 'mode', 'exposureWeighted', 'assumption'] as const) {
      expect(m.provenance[key]).toEqual(one.provenance[key]);
    }
    const templates = one.provenance.inputs.filter((i: { role: string }) => i.role === 'template');
    expect(m.provenance.inputs.filter((i: { role: string }) => i.role === 'template')).toEqual(templates);
    for (const t of templates) expect(t.sha256).toBe(sha(t.path));
    const listed = m.provenance.inputs.filter((i: { role: string }) => i.role.startsWith('shard'));
    expect(listed.map((i: { role: string }) => i.role).sort()).toEqual(['shard 1/4', 'shard 2/4', 'shard 3/4', 'shard 4/4']);
    for (const s of listed) expect(s.sha256).toBe(sha(s.path));
  });

  it('refuses shards of different jobs, a shard given twice and a missing shard, in one line', async () => {
    const parts = await shards(join(dir, 'p1'));
    const centre = await shards(join(dir, 'p2'), ['--centre']);
    const cases: [string[], RegExp][] = [
      [[parts[0], parts[1], parts[2], centre[3]], /factors-shard-4-of-4\.json: the mode \(centre\) differs from that of .*shard-1-of-4\.json/],
      [[parts[0], parts[1], parts[2], parts[2]], /is shard 3\/4 like/],
      [[parts[0], parts[1], parts[3]], /shard 3 of 4 missing/],
    ];
    for (const [argv, re] of cases) {
      const c = capture();
      expect(await runCli(['merge-factors', ...argv, '--json'], c.io)).toBe(1);
      expect(c.err.join('')).toMatch(re);
      expect(c.err.join('').trim().split('\n')).toHaveLength(1);
    }
    const other = JSON.parse(readFileSync(parts[3], 'utf8'));
    other.version = '0.0.1';
    writeFileSync(parts[3], JSON.stringify(other));
    const c = capture();
    expect(await runCli(['merge-factors', ...parts], c.io)).toBe(1);
    expect(c.err.join('')).toMatch(/was made by skyspan 0\.0\.1/);
  });

  it('--shard needs K/N with 1 <= K <= N', async () => {
    const c = capture();
    expect(await runCli([...base, '--shard', '5/4', '-o', join(dir, 'x')], c.io)).toBe(1);
    expect(c.err.join('')).toMatch(/--shard.*expected K\/N/);
  });
});
