/**
 * The cache survives a killed run and concurrent runs. A run is killed with
 * SIGKILL half-way through writing a cache entry (test-only preload
 * helpers/killHook.cjs); what it leaves is a temporary file that is never
 * read as an entry, and the next run equals a --no-cache run with nothing
 * discarded. Two runs started together on one empty cache folder give
 * identical outputs, equal to the --no-cache run. Expectations: the
 * atomic-write contract (temporary file and rename), common practice, no
 * source.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { runPlan } from '../../src/plan/runPlan.js';
import { differingOutputs, entriesByKind, makeCachePlanFixture } from './cacheFixture.js';
import { spawnRun } from './helpers/spawnRun.js';

const fx = makeCachePlanFixture();
const reference = join(fx.dir, 'reference');
const temporaries = (dir: string) => readdirSync(dir).filter((f) => f.endsWith('.tmp'));

describe('a cache shared with killed and concurrent runs', () => {
  beforeAll(async () => { await runPlan(fx.plan, { outDir: reference, cache: false }); }, 120_000);

  it('SIGKILL while a cache entry is written: a temporary file is left, never read; the next run is correct', async () => {
    const cacheDir = join(fx.dir, 'cache-killed');
    const r = await spawnRun(['run', fx.plan, '-o', join(fx.dir, 'killed'), '--cache-dir', cacheDir], { mode: 'cache-entry' });
    expect(r.signal).toBe('SIGKILL');
    const left = temporaries(cacheDir);
    expect(left).toHaveLength(1); // the entry being written, half of its data in it
    const complete = Object.values(entriesByKind(cacheDir)).flat();
    expect(complete).toHaveLength(1); // the first entry, renamed into place before the kill
    const partial = readFileSync(join(cacheDir, left[0]));
    expect(partial.subarray(0, 8).toString('latin1')).toBe('skyspanC'); // a preamble, as a complete entry starts
    expect(Number(partial.readBigUInt64LE(16))).toBeGreaterThan(partial.length); // but shorter than it says

    const next = await runPlan(fx.plan, { outDir: join(fx.dir, 'after-kill'), cacheDir });
    expect(next.cache.discarded).toEqual([]);
    expect(next.cache.hits.length).toBeGreaterThan(0); // the complete entry was used
    expect(differingOutputs(reference, join(fx.dir, 'after-kill'))).toEqual([]);

    let out = '';
    expect(await runCli(['cache', cacheDir, '--json'], { out: (t) => { out += t; }, err: () => {} })).toBe(0);
    expect(JSON.parse(out).temporaries.count).toBe(1);
    out = '';
    expect(await runCli(['cache', cacheDir, '--remove-all', '--json'], { out: (t) => { out += t; }, err: () => {} })).toBe(0);
    expect(JSON.parse(out).removed.temporaries).toBe(1);
    expect(temporaries(cacheDir)).toEqual([]);
  }, 180_000);

  it('two runs started together on one empty cache folder give identical outputs, equal to --no-cache', async () => {
    const cacheDir = join(fx.dir, 'cache-shared');
    const [a, b] = await Promise.all(['one', 'two'].map((n) => spawnRun(['run', fx.plan, '-o', join(fx.dir, n), '--cache-dir', cacheDir])));
    expect([a.code, b.code, a.stderr, b.stderr]).toEqual([0, 0, '', '']);
    expect(differingOutputs(join(fx.dir, 'one'), join(fx.dir, 'two'))).toEqual([]);
    expect(differingOutputs(reference, join(fx.dir, 'one'))).toEqual([]);
    expect(temporaries(cacheDir)).toEqual([]);
    const after = await runPlan(fx.plan, { outDir: join(fx.dir, 'three'), cacheDir });
    expect(after.cache.misses).toEqual([]);
    expect(after.cache.discarded).toEqual([]);
    expect(differingOutputs(reference, join(fx.dir, 'three'))).toEqual([]);
  }, 180_000);
});
