/**
 * A plan whose gamma-ray points are a flux-point table (.ecsv, .fits): the run
 * gives the same prediction as from the same points in CSV (same seed), and
 * writes the predicted spectrum as flux points. Invented demo points.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { formatFluxPointsEcsv, readFluxPointsEcsv } from '../../src/physics/fluxPoints/ecsv.js';
import { formatFluxPointsFits } from '../../src/physics/fluxPoints/fits.js';
import { readSpectrumPoints } from '../../src/physics/points.js';
import { runPlan } from '../../src/plan/runPlan.js';
import { makePlanFixture } from './fixture.js';

describe('plan with flux-point gamma-ray input', () => {
  it('CSV, ECSV and FITS points give the same comparison; comparison-spectrum.ecsv holds the combined median', async () => {
    const fx = makePlanFixture({ absorption: 'none', samples: 1000 });
    const pts = readSpectrumPoints(join(fx.dir, 'gamma-points.csv'));
    writeFileSync(join(fx.dir, 'gamma-points.ecsv'), formatFluxPointsEcsv(pts, { sedType: 'e2dnde' }));
    writeFileSync(join(fx.dir, 'gamma-points.fits'), formatFluxPointsFits(pts));
    const text = readFileSync(fx.plan, 'utf8');
    const ratios: number[] = [];
    for (const ext of ['csv', 'ecsv', 'fits']) {
      writeFileSync(fx.plan, text.replace('points: gamma-points.csv', `points: gamma-points.${ext}`));
      const out = join(fx.dir, `out-${ext}`);
      const r = await runPlan(fx.plan, { outDir: out, cache: false, date: new Date(0) });
      const res = JSON.parse(readFileSync(r.results, 'utf8'));
      ratios.push(res.comparison.ratio.median);
      const spec = readFluxPointsEcsv(join(out, 'comparison-spectrum.ecsv'));
      const comb = res.prediction.components.find((c: { name: string }) => c.name === 'combined');
      const j = Array.from(spec.energyGeV).findIndex((e) => Math.abs(e / res.e0GeV - 1) < 1e-12);
      expect(Math.abs(spec.value[j] / comb.atE0.median - 1)).toBeLessThan(1e-14);
    }
    // the three files hold the same numbers to rounding (1e-16 relative), so the seeded runs agree closely
    for (const r of ratios.slice(1)) expect(Math.abs(r / ratios[0] - 1)).toBeLessThan(1e-9);
  });
});
