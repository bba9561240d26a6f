/**
 * `skyspan info` through runCli: text and JSON descriptions of map files
 * (statistics checked against values computed here from the written map:
 * common practice, no source), of files without a map, and one-line errors
 * with exit code 1 for bad input, 2 for a bad command line.
 */
import { describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { bintableHdu, primaryHdu, headerBytes } from '../../src/io/fits/writer.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { testMap } from '../io/fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-info-');

async function cli(argv: string[]) {
  let out = '', err = '';
  const code = await runCli(argv, { out: (t) => { out += t; }, err: (t) => { err += t; } });
  return { code, out, err };
}

describe('skyspan info', () => {
  const mapPath = join(dir, 'm.fits.gz');
  const plane = Float64Array.from({ length: 48 }, (_, i) => (i < 12 ? BLANK : i));
  writeMapFile(mapPath, [testMap(2, { column: 'A', planes: [plane], f64: true, frame: 'equatorial', ordering: 'NESTED' }), testMap(2, { column: 'B', f64: true, frame: 'equatorial', ordering: 'NESTED' })]);

  it('prints HDUs, Nside, ordering, frame, columns, statistics and sky fraction as JSON', async () => {
    const r = await cli(['info', mapPath, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.hdus).toHaveLength(2);
    expect(j.hdus[1].healpix).toMatchObject({ nside: 2, ordering: 'NESTED', frame: 'equatorial', scheme: 'IMPLICIT' });
    expect(j.maps.map((m: any) => m.column)).toEqual(['A', 'B']);
    const a = j.maps[0].planes[0];
    // Pixels 12..47 hold their index: mean (12 + 47) / 2 = 29.5, 12 blanks, 36/48 of the sky.
    expect(a).toMatchObject({ min: 12, max: 47, mean: 29.5, blankCount: 12, validCount: 36, validSkyFraction: 0.75 });
  });

  it('prints a readable summary, with the energy planes of a cube', async () => {
    const cubePath = join(dir, 'cube.fits');
    writeMapFile(cubePath, testMap(1, { column: 'CUBE', planes: [new Float32Array(12).fill(1), new Float32Array(12).fill(3)], energiesGeV: Float64Array.from([10, 100]) }));
    const r = await cli(['info', cubePath]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/HEALPix map: Nside 1, RING, frame galactic \(COORDSYS G\), IMPLICIT indexing/);
    expect(r.out).toMatch(/map CUBE .*2 energy planes/);
    expect(r.out).toMatch(/plane 2 at 100 GeV: min 3, mean 3, max 3; 0 blank of 12; not blank on 100.00% of the sky, non-zero on 100.00%/);
    expect(r.out).toMatch(/HDU 2 bintable ENERGIES/);
  });

  it('reports the fraction of the sky a mask covers at all (non-zero pixels), beside the non-blank fraction', async () => {
    // 1 of 48 pixels non-zero: 1/48 = 2.08 % of the sky (HEALPix pixels have equal area, Gorski et al. 2005).
    const maskPath = join(dir, 'mask.fits');
    const f = new Float32Array(48); f[7] = 0.25; f[9] = BLANK; // a blank pixel is neither covered nor zero
    writeMapFile(maskPath, testMap(2, { column: 'FRACTION', planes: [f] }));
    const r = await cli(['info', maskPath]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/not blank on 97.92% of the sky, non-zero on 2.08%/);
    const j = JSON.parse((await cli(['info', maskPath, '--json'])).out);
    expect(Math.abs(j.maps[0].planes[0].nonZeroSkyFraction / (1 / 48) - 1)).toBeLessThan(1e-12);
  });

  it('describes an image file and a table that hold no HEALPix map', async () => {
    const img = join(dir, 'img.fits');
    writeFileSync(img, Buffer.concat([headerBytes([['SIMPLE', true], ['BITPIX', 16], ['NAXIS', 2], ['NAXIS1', 3], ['NAXIS2', 2]]), new Uint8Array(2880)]));
    const r = await cli(['info', img]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/HDU 0 primary PRIMARY: image 3 x 2/);
    expect(r.out).toMatch(/no HEALPix map in this file/);
    const tab = join(dir, 'tab.fits');
    writeFileSync(tab, Buffer.concat([primaryHdu(), ...bintableHdu([{ name: 'RA', type: 'float64', repeat: 1, unit: 'deg', values: Float64Array.from([1, 2]) }])]));
    const t = await cli(['info', tab, '--json']);
    expect(JSON.parse(t.out).maps).toEqual([]);
    expect(JSON.parse(t.out).hdus[1].columns[0]).toMatchObject({ name: 'RA', unit: 'deg' });
  });

  it('bad input: one line naming the file, exit 1; no argument: exit 2', async () => {
    const bad = join(dir, 'cut.fits');
    writeFileSync(bad, Buffer.alloc(100, 65));
    const r = await cli(['info', bad]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(new RegExp(`^skyspan: ${bad.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}.*less than one 2880-byte FITS block.*\\n$`));
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect((await cli(['info'])).code).toBe(2);
    const h = await cli(['info', '--help']);
    expect(h.code).toBe(0);
    expect(h.out).toMatch(/Example:/);
  });
});
