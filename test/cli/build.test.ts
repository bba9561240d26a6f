import { describe, expect, it } from 'vitest';
import { writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main.js';
import { readSkyMap } from '../../src/io/mapFile.js';
import { survivalPathFor } from '../../src/templates/writeTemplate.js';
import { tempDir } from '../helpers/tempDir.js';

function capture() {
  const out: string[] = [], err: string[] = [];
  return { io: { out: (t: string) => { out.push(t); }, err: (t: string) => { err.push(t); } }, out, err };
}

describe('skyspan build', () => {
  const dir = tempDir('skyspan-build-');
  const spec = join(dir, 'slab.yaml');
  writeFileSync(spec, 'name: slab\ngas: [{component: exponentialSlab, densityCm3: 1, scaleHeightKpc: 0.1}]\ncosmicRays: {distribution: constant}\nintegration: {maxDistanceKpc: 5}\n');

  it('writes a template cube and its survival map with --absorption, and reports JSON', async () => {
    const c = capture();
    const out = join(dir, 't.fits.gz');
    const code = await runCli(['build', spec, '-o', out, '--nside', '4', '--energies', '100TeV,2.2PeV', '--absorption', '--quiet', '--json'], c.io);
    expect(c.err.join('')).toBe('');
    expect(code).toBe(0);
    const summary = JSON.parse(c.out.join('')) as { files: string[]; planes: number };
    expect(summary.planes).toBe(2);
    expect(existsSync(join(dir, 't-survival.fits.gz'))).toBe(true);
    const m = readSkyMap(out);
    expect(Array.from(m.energiesGeV!)).toEqual([1e5, 2.2e6]);
    const s = readSkyMap(join(dir, 't-survival.fits.gz'));
    // Toward latitude b an exponential slab (scale h) seen from inside survives with lambda / (lambda + h / sin b)
    // (integral of exp(-s sin b / h - s / lambda); common practice, no source); lambda(2.2 PeV) = 7.067 kpc
    // (computed with scipy, scripts/attenuation_reference.py). Pixel 0 of Nside 4 is at sin b = 1 - 1/48; sub-pixel averaging moves this by < 1e-4.
    const expected = 7.067 / (7.067 + 0.1 / (1 - 1 / 48));
    expect(Math.abs(s.planes[1][0] - expected)).toBeLessThan(3e-4);
    for (const v of s.planes[1]) expect(v > 0 && v <= 1).toBe(true);
  });

  it('refuses to overwrite without --force and names the file', async () => {
    const c = capture();
    const out = join(dir, 'u.fits');
    expect(await runCli(['build', spec, '-o', out, '--nside', '2', '--quiet'], c.io)).toBe(0);
    const c2 = capture();
    expect(await runCli(['build', spec, '-o', out, '--nside', '2', '--quiet'], c2.io)).toBe(1);
    expect(c2.err.join('')).toMatch(/u\.fits: exists already/);
  });

  it('a bad spec gives one line with the key path and exit 1', async () => {
    const bad = join(dir, 'bad.yaml');
    writeFileSync(bad, 'name: b\ngas: [{component: exponentialSlab, densityCm3: 1, scaleHeightKpc: -1}]\ncosmicRays: {distribution: constant}\n');
    const c = capture();
    expect(await runCli(['build', bad, '-o', join(dir, 'b.fits'), '--quiet'], c.io)).toBe(1);
    expect(c.err.join('')).toMatch(/^skyspan: .*bad\.yaml, key gas\[0\]\.scaleHeightKpc: must be > 0, got -1\n$/);
  });

  it('names the survival file beside the template', () => {
    expect(survivalPathFor('a/b.fits.gz')).toBe('a/b-survival.fits.gz');
    expect(survivalPathFor('b.fits')).toBe('b-survival.fits');
    expect(survivalPathFor('b')).toBe('b-survival.fits');
  });

  it('--help shows an example', async () => {
    const c = capture();
    expect(await runCli(['build', '--help'], c.io)).toBe(0);
    expect(c.out.join('')).toMatch(/Example:\n  skyspan build /);
  });
});
