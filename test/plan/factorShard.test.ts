/**
 * `skyspan run PLAN --shard K/N` (plan/factorShard.ts) and merge-factors:
 * the shards of a plan's factor stage, merged, give every number of the
 * factor table of the whole run (rows, summary, regions, notes, warnings),
 * with weights and with CMB absorption (survival maps beside the template
 * files); shards of different plans are refused in one line. Source of each
 * expectation: the command's contract (a merge equals the single run;
 * common practice, no source).
 */
import { mkdirSync, readFileSync, writeFileSync, copyFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { readSkyMap, writeMapFile } from '../../src/io/mapFile.js';
import { runPlan } from '../../src/plan/runPlan.js';
import { survivalPathFor } from '../../src/templates/writeTemplate.js';
import { makePlanFixture } from './fixture.js';

function capture() {
  const out: string[] = [], err: string[] = [];
  return { io: { out: (t: string) => { out.push(t); }, err: (t: string) => { err.push(t); } }, out, err };
}

/** The fixture with five template files (three more shapes made from the first two) and template weights. */
function fivePlan(): { dir: string; plan: string } {
  const fx = makePlanFixture({ samples: 200 });
  for (const [name, from, power] of [['narrow-b', 'narrow', 1.3], ['wide-b', 'wide', 0.7], ['wide-c', 'wide', 1.9]] as const) {
    const src = join(fx.templates, `${from}.fits`);
    const m = readSkyMap(src);
    writeMapFile(join(fx.templates, `${name}.fits`), { ...m, planes: m.planes.map((p) => Float64Array.from(p, (v) => v ** power)) });
    copyFileSync(survivalPathFor(src), survivalPathFor(join(fx.templates, `${name}.fits`)));
  }
  const text = readFileSync(fx.plan, 'utf8').replace('  files: [templates]',
    '  files: [templates]\n  weights: { narrow: 1, narrow-b: 2, wide: 0.5, wide-b: 1, wide-c: 3 }');
  writeFileSync(fx.plan, text);
  return { dir: fx.dir, plan: fx.plan };
}

const json = (x: unknown) => JSON.parse(JSON.stringify(x));

describe('skyspan run --shard: the factor stage of a plan in shards', () => {
  it('three shards merged equal the factor table of the whole run in every number', async () => {
    const fx = fivePlan();
    const whole = await runPlan(fx.plan, { outDir: join(fx.dir, 'out'), cache: false });
    const one = json(whole.computation.factors);
    expect(one.rows.length).toBe(5 * 2);
    const parts = join(fx.dir, 'parts');
    mkdirSync(parts);
    const files: string[] = [];
    for (const k of [1, 2, 3]) {
      const c = capture();
      expect(await runCli(['run', fx.plan, '--shard', `${k}/3`, '-o', parts, '--no-cache'], c.io)).toBe(0);
      expect(c.out.join('')).toMatch(/factor stage only/);
      files.push(join(parts, `factors-shard-${k}-of-3.json`));
    }
    const shard1 = JSON.parse(readFileSync(files[0], 'utf8'));
    expect(shard1.read.map((r: { index: number }) => r.index)).toEqual([0, 3]);
    const merged = capture();
    mkdirSync(join(fx.dir, 'merged'));
    expect(await runCli(['merge-factors', files[2], files[0], files[1], '-o', join(fx.dir, 'merged'), '--format', 'json', '--json'], merged.io), merged.err.join('')).toBe(0);
    const m = JSON.parse(merged.out.join(''));
    for (const key of ['rows', 'summary', 'regions'] as const) expect(m[key]).toEqual(one[key]);
    expect(m.provenance.notes).toEqual(one.notes);
    expect(m.provenance.warnings).toEqual(one.warnings);
    const wholeTable = JSON.parse(readFileSync(join(fx.dir, 'out', 'factors.json'), 'utf8'));
    const mergedTable = JSON.parse(readFileSync(join(fx.dir, 'merged', 'factors.json'), 'utf8'));
    expect(mergedTable.rows).toEqual(wholeTable.rows);
    expect(mergedTable.summary).toEqual(wholeTable.summary);
    const roles = m.provenance.inputs.map((i: { role: string }) => i.role);
    expect(roles.filter((r: string) => r === 'template')).toHaveLength(5);
    expect(roles).toContain('plan');
    expect(roles.filter((r: string) => r.startsWith('shard')).sort()).toEqual(['shard 1/3', 'shard 2/3', 'shard 3/3']);
  }, 120_000);

  it('refuses shards of two different plans in one line', async () => {
    const fx = makePlanFixture({ absorption: 'none', samples: 200 });
    const parts = join(fx.dir, 'parts');
    const c1 = capture();
    expect(await runCli(['run', fx.plan, '--shard', '1/2', '-o', parts, '--no-cache'], c1.io), c1.err.join('')).toBe(0);
    writeFileSync(fx.plan, readFileSync(fx.plan, 'utf8').replace('targets: [plane]', 'targets: [plane]\nabout: another plan'));
    const c2 = capture();
    expect(await runCli(['run', fx.plan, '--shard', '2/2', '-o', parts, '--no-cache'], c2.io)).toBe(0);
    const c = capture();
    expect(await runCli(['merge-factors', join(parts, 'factors-shard-1-of-2.json'), join(parts, 'factors-shard-2-of-2.json')], c.io)).toBe(1);
    expect(c.err.join('')).toMatch(/shard-2-of-2\.json: the plan file .* differs/);
    expect(c.err.join('').trim().split('\n')).toHaveLength(1);
  }, 120_000);

  it('counts the shipped ensemble after the template files: two shards of a mixed plan merge into the whole run', async () => {
    const fx = makePlanFixture({ absorption: 'none', samples: 200 });
    writeFileSync(fx.plan, readFileSync(fx.plan, 'utf8').replace('  files: [templates]', '  files: [templates/narrow.fits]\n  shipped: true'));
    const whole = await runPlan(fx.plan, { outDir: join(fx.dir, 'out'), cache: false });
    const one = json(whole.computation.factors);
    const parts = join(fx.dir, 'parts');
    const files = [];
    for (const k of [1, 2]) {
      const c = capture();
      expect(await runCli(['run', fx.plan, '--shard', `${k}/2`, '-o', parts, '--no-cache'], c.io), c.err.join('')).toBe(0);
      files.push(join(parts, `factors-shard-${k}-of-2.json`));
    }
    const p2 = JSON.parse(readFileSync(files[1], 'utf8'));
    expect(p2.read.every((r: { index: number; path: string }) => r.index % 2 === 1 && r.path.endsWith('.fits.gz'))).toBe(true);
    const merged = capture();
    expect(await runCli(['merge-factors', ...files, '--json'], merged.io), merged.err.join('')).toBe(0);
    const m = JSON.parse(merged.out.join(''));
    expect(new Set(one.rows.map((r: { template: string }) => r.template)).size).toBeGreaterThan(2);
    for (const key of ['rows', 'summary', 'regions'] as const) expect(m[key]).toEqual(one[key]);
    expect(m.provenance.notes).toEqual(one.notes);
  }, 300_000);
});
