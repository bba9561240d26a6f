/**
 * Every cache entry proves itself before use: entries of each kind
 * (template, survival, region weights) are damaged as a failing disk, an
 * interrupted copy or a careless user would (bytes flipped in the middle,
 * the file truncated, the file replaced by the entry of another key, the
 * path made unreadable); each rerun discards the entry, says so in one line,
 * recomputes and rewrites it, and its outputs equal a --no-cache run's
 * number for number. Expectations: the cache contract (a cache may change
 * the time a run takes, never its results), common practice, no source.
 */
import { mkdirSync, readFileSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { discardNote } from '../../src/plan/cache.js';
import { runPlan } from '../../src/plan/runPlan.js';
import { differingOutputs, entriesByKind, makeCachePlanFixture } from './cacheFixture.js';

const fx = makeCachePlanFixture();
const date = new Date('2026-01-01T00:00:00Z');
const reference = join(fx.dir, 'reference');
let good: Map<string, Buffer>;
let byKind: Record<string, string[]>;

/** Puts every good entry back and removes anything else from the cache folder. */
function restoreCache(): void {
  rmSync(fx.cacheDir, { recursive: true, force: true });
  mkdirSync(fx.cacheDir);
  for (const [p, bytes] of good) writeFileSync(p, bytes);
}

const damage = {
  'flipped bytes': (p: string) => {
    const b = Buffer.from(good.get(p)!);
    const mid = b.length >> 1;
    for (let i = 0; i < 8; i++) b[mid + i] ^= 0xff;
    writeFileSync(p, b);
  },
  truncated: (p: string) => truncateSync(p, Math.floor(good.get(p)!.length * 0.6)),
  'the entry of another key': (p: string) => {
    // template <-> survival (same shape: one plane per energy), region <-> another region
    const kind = /\/([a-z]+)-[0-9a-f]{64}\.bin$/.exec(p)![1];
    const other = kind === 'region' ? byKind.region.find((q) => q !== p)! : byKind[kind === 'template' ? 'survival' : 'template'][0];
    writeFileSync(p, good.get(other)!);
  },
};

describe('a damaged cache entry', () => {
  beforeAll(async () => {
    await runPlan(fx.plan, { outDir: reference, cache: false, date });
    const cold = await runPlan(fx.plan, { outDir: join(fx.dir, 'cold'), cacheDir: fx.cacheDir, date });
    expect(cold.cache.stored.length).toBe(6); // template, survival, region measured and plane at Nside 8 and 32
    byKind = entriesByKind(fx.cacheDir);
    good = new Map(Object.values(byKind).flat().map((p) => [p, readFileSync(p)]));
  }, 120_000);

  it('a run through an intact cache equals the --no-cache run', async () => {
    expect(Object.keys(byKind).sort()).toEqual(['region', 'survival', 'template']);
    expect(byKind.region.length).toBeGreaterThan(1);
    expect(differingOutputs(reference, join(fx.dir, 'cold'))).toEqual([]);
    restoreCache();
    const warm = await runPlan(fx.plan, { outDir: join(fx.dir, 'warm'), cacheDir: fx.cacheDir, date });
    expect(warm.cache.misses).toEqual([]);
    expect(differingOutputs(reference, join(fx.dir, 'warm'))).toEqual([]);
  }, 60_000);

  for (const kind of ['template', 'survival', 'region']) {
    for (const [how, apply] of Object.entries(damage)) {
      it(`${kind} entry, ${how}: discarded, recomputed, rewritten; outputs equal the --no-cache run`, async () => {
        restoreCache();
        const target = byKind[kind][0];
        apply(target);
        expect(readFileSync(target).equals(good.get(target)!)).toBe(false);
        const out = join(fx.dir, `run-${kind}-${how.replace(/ /g, '-')}`);
        const r = await runPlan(fx.plan, { outDir: out, cacheDir: fx.cacheDir, date });
        expect(r.cache.discarded).toEqual([target]);
        expect(differingOutputs(reference, out)).toEqual([]);
        expect(readFileSync(target).equals(good.get(target)!)).toBe(true); // rewritten, byte for byte as first stored
        const again = await runPlan(fx.plan, { outDir: out, cacheDir: fx.cacheDir, date, force: true });
        expect(again.cache.discarded).toEqual([]);
        expect(again.cache.misses).toEqual([]);
      }, 60_000);
    }
  }

  it('an unreadable entry (a folder at its path) is discarded and recomputed; the failed store is a note, not a failure', async () => {
    restoreCache();
    const target = byKind.region[0];
    rmSync(target);
    mkdirSync(join(target, 'x'), { recursive: true });
    const out = join(fx.dir, 'run-unreadable');
    const r = await runPlan(fx.plan, { outDir: out, cacheDir: fx.cacheDir, date });
    expect(r.cache.discarded).toEqual([target]);
    expect(r.cache.notes.length).toBe(1);
    expect(r.cache.notes[0]).toMatch(/^cache: could not store region /);
    expect(differingOutputs(reference, out)).toEqual([]);
  }, 60_000);

  it('the command line says so in one line on stderr and exits 0', async () => {
    restoreCache();
    const target = byKind.region[1];
    damage['flipped bytes'](target);
    let out = '', err = '';
    const code = await runCli(['run', fx.plan, '-o', join(fx.dir, 'cli'), '--cache-dir', fx.cacheDir], { out: (t) => { out += t; }, err: (t) => { err += t; } });
    expect(code).toBe(0);
    expect(err).toBe(`${discardNote(target)}\n`);
    expect(err).toBe(`cache: discarded damaged entry ${target}, recomputed\n`);
    expect(out).toMatch(/report: /);
  }, 60_000);
});
