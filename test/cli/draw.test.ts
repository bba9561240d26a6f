import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { parseZoom } from '../../src/cli/commands/draw.js';
import { cosAngle, fieldMap } from '../render/fixtures.js';
import { decode, pixelAt } from '../render/png.js';
import { mollweideProjection } from '../../src/render/skyView.js';

const dir = mkdtempSync(join(tmpdir(), 'skyspan-draw-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function capture() {
  const out: string[] = [], err: string[] = [];
  return { io: { out: (t: string) => { out.push(t); }, err: (t: string) => { err.push(t); } }, out, err };
}

const mapPath = join(dir, 'dipole.fits');
writeMapFile(mapPath, fieldMap(32, (l, b) => 2 + cosAngle(l, b, 0.5, 0.3), 'galactic', 'GeV^-1 cm^-2 s^-1 sr^-1'));
const regPath = join(dir, 'regions.yaml');
writeFileSync(regPath, 'regions:\n  patch:\n    box: { frame: galactic, lonDeg: [20, 80], latDeg: [-10, 10] }\n  spot:\n    disc: { frame: galactic, atDeg: [-60, 30], radiusDeg: 8 }\n');

describe('skyspan draw', () => {
  it('draws a map file to a PNG of the asked width, with an outline, and reports JSON', async () => {
    const out = join(dir, 'a.png');
    const c = capture();
    const code = await runCli(['draw', mapPath, '-o', out, '--width', '600', '--scale', 'log', '--regions', regPath,
      '--outline', 'patch', '--shade', 'spot', '--region-nside', '64', '--no-graticule', '--json'], c.io);
    expect(c.err.join('')).toBe('');
    expect(code).toBe(0);
    const summary = JSON.parse(c.out.join(''));
    expect(summary.scale).toBe('log');
    const d = decode(readFileSync(out));
    expect(d.width).toBe(600);
    expect(d.height).toBe(summary.height);
    // The outline is white (the default outline colour); the magma table has no pure white.
    // Look along the box's lower edge b = -10 at l = 50 (area placement is read from a render of the same width).
    const { renderSkyMap } = await import('../../src/render/skyImage.js');
    const ref = renderSkyMap(fieldMap(32, () => 1), { width: 600 });
    const [x, y] = mollweideProjection(ref.view.width)([50, -10])!;
    let white = 0;
    for (let dy = -3; dy <= 3; dy++) if (pixelAt(d, ref.areaLeft + Math.floor(x), ref.areaTop + Math.floor(y) + dy) === 0xffffff) white++;
    expect(white).toBeGreaterThan(0);
    const [xi, yi] = mollweideProjection(ref.view.width)([50, 0])!;
    expect(pixelAt(d, ref.areaLeft + Math.floor(xi), ref.areaTop + Math.floor(yi))).not.toBe(0xffffff);
  });

  it('refuses to replace an output without --force, and replaces it with --force', async () => {
    const out = join(dir, 'b.png');
    writeFileSync(out, 'old');
    const c = capture();
    expect(await runCli(['draw', mapPath, '-o', out, '--width', '400'], c.io)).toBe(1);
    expect(c.err.join('')).toMatch(/exists already/);
    expect(readFileSync(out, 'utf8')).toBe('old');
    expect(await runCli(['draw', mapPath, '-o', out, '--width', '400', '--force', '--zoom', '330,30,-20,20'], capture().io)).toBe(0);
    expect(decode(readFileSync(out)).width).toBe(400);
  });

  it('rejects bad options with a usage error (exit 2) and writes nothing', async () => {
    for (const bad of [['--scale', 'sqrt'], ['--zoom', '1,2,3'], ['--colours', 'rainbow'], ['--frame', 'ecliptic'], ['--width', 'wide'], ['--outline', 'patch']]) {
      const out = join(dir, `bad${bad[0]}.png`);
      const c = capture();
      expect(await runCli(['draw', mapPath, '-o', out, ...bad], c.io)).toBe(2);
      expect(c.err.join('')).toContain(bad[0]);
      expect(existsSync(out)).toBe(false);
    }
    const c = capture();
    expect(await runCli(['draw', mapPath, '-o', join(dir, 'p.png'), '--plane', '3'], c.io)).toBe(1);
    expect(c.err.join('')).toMatch(/plane/);
  });

  it('reads a zoom window that passes l = 0', () => {
    expect(parseZoom('330,30,-5,5')).toEqual({ lonMinDeg: 330, lonMaxDeg: 390, latMinDeg: -5, latMaxDeg: 5 });
    expect(parseZoom('-40,60,-10,10')).toEqual({ lonMinDeg: -40, lonMaxDeg: 60, latMinDeg: -10, latMaxDeg: 10 });
  });
});
