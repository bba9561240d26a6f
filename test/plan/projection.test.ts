/**
 * A plan with the neutrino analysis's template and acceptance (invented maps):
 * the run reports the comparison on the neutrino template's own terms beside
 * the region-average one. Check: with T_nu the 'narrow' template divided by
 * its whole-sky mean and a uniform acceptance, that template's projection
 * factor equals its whole-sky k_I (algebra of N = sum(a P T) / sum(a T^2);
 * common practice, no source), and a constant acceptance in another frame
 * and Nside changes nothing.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createSkyMap } from '../../src/maps/create.js';
import { readSkyMap, writeMapFile } from '../../src/io/mapFile.js';
import { runPlan } from '../../src/plan/runPlan.js';
import { makePlanFixture } from './fixture.js';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('plan: comparison on the neutrino template\'s own terms', () => {
  const fx = makePlanFixture({ absorption: 'none', samples: 1000 });
  const narrow = readSkyMap(join(fx.templates, 'narrow.fits'));
  const plane = narrow.planes[0];
  let mean = 0;
  for (let i = 0; i < plane.length; i++) mean += plane[i] / plane.length;
  writeMapFile(join(fx.dir, 'nu-template.fits'), createSkyMap({ nside: 32, ordering: 'RING', frame: 'galactic', column: 'T', planes: [Float64Array.from(plane, (v) => v / mean)] }));
  writeMapFile(join(fx.dir, 'acceptance.fits'), createSkyMap({ nside: 8, ordering: 'NESTED', frame: 'equatorial', column: 'A', planes: [new Float64Array(768).fill(2.5)] }));
  const text = readFileSync(fx.plan, 'utf8');

  it('reports q beside k_I, a predicted and a measured N, and the headline sentence; q = k_I for the template the neutrino template copies', async () => {
    writeFileSync(fx.plan, text.replace('  region: sky\n', '  region: sky\n  template: nu-template.fits\n'));
    const r = await runPlan(fx.plan, { outDir: join(fx.dir, 'out1'), cache: false, date: new Date(0) });
    const res = JSON.parse(readFileSync(r.results, 'utf8'));
    const p = res.templateProjection;
    const f = p.factors.find((x: { template: string }) => x.template === 'narrow');
    expect(rel(f.q, f.kI)).toBeLessThan(1e-12);
    expect(f.plane).toBe(1); // planes are 1-based wherever a user sees them (single-plane template)
    const g = p.factors.find((x: { template: string }) => x.template === 'wide');
    expect(rel(g.q, g.kI)).toBeGreaterThan(1e-3); // another shape projects differently
    expect(p.comparison.ratio.median).toBeGreaterThan(0);
    expect(p.statement).toMatch(/acceptance uniform/);
    expect(r.headline.text).toMatch(/On the neutrino template's own terms/);
    expect(readFileSync(join(fx.dir, 'out1', 'report.html'), 'utf8')).toMatch(/template-projection/);
    expect(res.comparison.ratio.median).toBeGreaterThan(0); // the simple mode is still there

    writeFileSync(fx.plan, text.replace('  region: sky\n', '  region: sky\n  template: nu-template.fits\n  acceptance: acceptance.fits\n'));
    const r2 = await runPlan(fx.plan, { outDir: join(fx.dir, 'out2'), cache: false, date: new Date(0) });
    const p2 = JSON.parse(readFileSync(r2.results, 'utf8')).templateProjection;
    p2.factors.forEach((x: { q: number }, i: number) => expect(rel(x.q, p.factors[i].q)).toBeLessThan(1e-9));
    expect(p2.statement).toMatch(/acceptance from the acceptance map/);
  });

  it('an acceptance without a template is a one-line error naming the key', async () => {
    writeFileSync(fx.plan, text.replace('  region: sky\n', '  region: sky\n  acceptance: acceptance.fits\n'));
    await expect(runPlan(fx.plan, { outDir: join(fx.dir, 'out3'), cache: false })).rejects.toThrow(/key neutrino\.acceptance: found an acceptance map and no neutrino template/);
  });
});
