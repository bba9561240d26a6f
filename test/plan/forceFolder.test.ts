/**
 * `skyspan run --force` over an existing output folder replaces it as a
 * whole: the new files go into a temporary sibling folder that is swapped in
 * at the end. An interrupted rerun (SIGINT or SIGTERM while the new files are
 * being written, through the test-only preload helpers/killHook.cjs) leaves
 * the old folder complete and matching its provenance.json, and no sibling
 * behind; a failing disk does the same; a finished rerun leaves only the new
 * run's files. Expectations: the nothing-lost rule (temporary + rename),
 * common practice, no source; exit codes 128 + signal number, POSIX shell
 * convention (from memory).
 */
import { createHash } from 'node:crypto';
import { cpSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { writeFolderAtomic } from '../../src/io/atomicFolder.js';
import { runPlan } from '../../src/plan/runPlan.js';
import { makeCachePlanFixture } from './cacheFixture.js';
import { spawnRun } from './helpers/spawnRun.js';

const fx = makeCachePlanFixture();
const out = join(fx.dir, 'out');

/** The problems found when `dir` is compared with its provenance.json (none: one run's complete output). */
function provenanceMismatches(dir: string): string[] {
  const prov = JSON.parse(readFileSync(join(dir, 'provenance.json'), 'utf8')) as { outputs: { file: string; sha256: string }[] };
  const listed = [...prov.outputs.map((o) => o.file), 'provenance.json'].sort();
  const present = readdirSync(dir).sort();
  const bad = [...present.filter((f) => !listed.includes(f)).map((f) => `unlisted ${f}`), ...listed.filter((f) => !present.includes(f)).map((f) => `missing ${f}`)];
  for (const o of prov.outputs) {
    if (present.includes(o.file) && createHash('sha256').update(readFileSync(join(dir, o.file))).digest('hex') !== o.sha256) bad.push(`changed ${o.file}`);
  }
  return bad;
}
const siblings = (dir: string) => readdirSync(dirname(dir)).filter((f) => f.startsWith(`.${basename(dir)}.`));
const created = (dir: string) => (JSON.parse(readFileSync(join(dir, 'provenance.json'), 'utf8')) as { createdUtc: string }).createdUtc;

describe('run --force over an existing output folder', () => {
  beforeAll(async () => {
    await runPlan(fx.plan, { outDir: out, cacheDir: fx.cacheDir, date: new Date('2026-01-01T00:00:00Z') });
    for (const copy of ['out-int', 'out-term']) cpSync(out, join(fx.dir, copy), { recursive: true });
  }, 120_000);

  it('the first run wrote one complete folder and nothing beside it', () => {
    expect(provenanceMismatches(out)).toEqual([]);
    expect(siblings(out)).toEqual([]);
  });

  it('SIGINT or SIGTERM while the new files are written: the old folder stays complete, no temporary sibling is left', async () => {
    const runs = await Promise.all((['SIGINT', 'SIGTERM'] as const).map((signal) =>
      spawnRun(['run', fx.plan, '-o', join(fx.dir, signal === 'SIGINT' ? 'out-int' : 'out-term'), '--force', '--cache-dir', fx.cacheDir],
        { mode: 'output-folder', signal })));
    expect(runs.map((r) => r.code)).toEqual([130, 143]);
    for (const [r, dir, sig] of [[runs[0], join(fx.dir, 'out-int'), 'SIGINT'], [runs[1], join(fx.dir, 'out-term'), 'SIGTERM']] as const) {
      expect(r.stderr).toMatch(new RegExp(`^skyspan: interrupted by ${sig}; no output was finished; removed the partial file .*/\\.${basename(dir)}\\.[^/]*\\.tmp; `, 'm'));
      expect(provenanceMismatches(dir)).toEqual([]);
      expect(created(dir)).toBe('2026-01-01T00:00:00.000Z'); // still the first run's folder
      expect(siblings(dir)).toEqual([]);
    }
  }, 240_000);

  it('a disk failing half-way leaves the old folder as it was and no sibling', () => {
    const before = readdirSync(out).map((f) => [f, readFileSync(join(out, f))] as const);
    let n = 0;
    const failing = () => { if (++n === 3) throw Object.assign(new Error('no space left'), { code: 'ENOSPC' }); };
    expect(() => writeFolderAtomic(out, before.map(([name]) => ({ name, data: 'new' })), { force: true, writer: failing }))
      .toThrow(/^.*\/out: writing failed: ENOSPC \(free disk space or choose another folder; the previous outputs are intact\)$/);
    for (const [f, bytes] of before) expect(readFileSync(join(out, f)).equals(bytes)).toBe(true);
    expect(readdirSync(out).length).toBe(before.length);
    expect(siblings(out)).toEqual([]);
  });

  it('refuses a folder that holds files no run wrote, and changes nothing', async () => {
    const dir = join(fx.dir, 'out-mixed');
    cpSync(out, dir, { recursive: true });
    writeFileSync(join(dir, 'notes.txt'), 'my notes');
    await expect(runPlan(fx.plan, { outDir: dir, cacheDir: fx.cacheDir, force: true }))
      .rejects.toThrow(/out-mixed: holds 'notes.txt', which is not an output of the run that wrote this folder \(--force replaces the whole folder/);
    expect(readFileSync(join(dir, 'notes.txt'), 'utf8')).toBe('my notes');
    expect(provenanceMismatches(dir)).toEqual(['unlisted notes.txt']);
  }, 60_000);

  it('a finished rerun leaves only the new run\'s files (an output the new plan no longer makes is gone)', async () => {
    expect(readdirSync(out)).toContain('report.html');
    writeFileSync(fx.plan, readFileSync(fx.plan, 'utf8').replace('outputs:\n', 'outputs:\n  report: false\n'));
    await runPlan(fx.plan, { outDir: out, cacheDir: fx.cacheDir, force: true, date: new Date('2026-02-01T00:00:00Z') });
    expect(readdirSync(out)).not.toContain('report.html');
    expect(provenanceMismatches(out)).toEqual([]);
    expect(created(out)).toBe('2026-02-01T00:00:00.000Z');
    expect(siblings(out)).toEqual([]);
  }, 60_000);
});
