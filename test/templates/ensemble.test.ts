import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { buildShippedTemplate, loadShippedEnsemble, roundMantissa, shippedEnsembleDir, shippedTemplateNames } from '../../src/templates/ensemble.js';
import { readTemplateSpec } from '../../src/templates/readSpecFile.js';
import { readSkyMap } from '../../src/io/mapFile.js';

describe('shipped ensemble', () => {
  it('holds at least 8 gas templates and one source-density template, all Nside 128 Galactic', () => {
    const all = loadShippedEnsemble();
    expect(all.filter((t) => t.spec.gas).length).toBeGreaterThanOrEqual(8);
    expect(all.filter((t) => t.spec.sources).length).toBeGreaterThanOrEqual(1);
    for (const t of all) {
      expect(t.map.nside).toBe(128);
      expect(t.map.frame).toBe('galactic');
      expect(t.map.planes[0].every((v) => v >= 0 && Number.isFinite(v))).toBe(true);
    }
    // The ensemble spans two gas models, three cosmic-ray laws and three halo heights.
    const gas = new Set(all.filter((t) => t.spec.gas).map((t) => t.spec.gas!.map((g) => g.component).join('+')));
    const laws = new Set(all.map((t) => t.spec.cosmicRays?.distribution).filter(Boolean));
    const halos = new Set(all.map((t) => t.spec.cosmicRays?.haloHeightKpc).filter(Boolean));
    expect([gas.size, laws.size, halos.size]).toEqual([2, 3, 3]);
  });

  it('a rebuilt template equals the shipped file', async () => {
    // Reproducibility (common practice, no source). Identical arithmetic gives identical bits; the bound allows one
    // rounding quantum (2^-15 relative) in case a platform's exp/pow differ in the last bit.
    const dir = shippedEnsembleDir();
    const name = shippedTemplateNames(dir).find((n) => n.startsWith('gas-ns_cr-lorimer2006_halo2'))!;
    const shipped = readSkyMap(join(dir, `${name}.fits.gz`));
    const rebuilt = await buildShippedTemplate(readTemplateSpec(join(dir, `${name}.yaml`)));
    const a = shipped.planes[0], b = rebuilt.map.planes[0];
    let worst = 0, differing = 0;
    for (let i = 0; i < a.length; i++) {
      if (a[i] !== b[i]) differing++;
      worst = Math.max(worst, Math.abs(a[i] / b[i] - 1));
    }
    expect(worst).toBeLessThanOrEqual(2 ** -15);
    expect(differing).toBeLessThan(a.length / 1000);
  });

  it('mantissa rounding changes values by at most 2^-16 relative and keeps 0', () => {
    const x = Float32Array.from([0, 1, 1.2345678, 3.3e20, 7.77e-5]);
    const y = roundMantissa(Float32Array.from(x));
    x.forEach((v, i) => expect(Math.abs(y[i] - v)).toBeLessThanOrEqual(Math.abs(v) * 2 ** -16));
    expect(y[0]).toBe(0);
    expect(y[1]).toBe(1);
  });
});
