/**
 * Map files written and read back by skyspan (round trips over every layout:
 * common practice, no source), the frame option, BAD_DATA, FIRSTPIX ranges
 * and the safety rules of writing (no overwrite without force, never over an
 * input). The healpy/astropy side of the same files is in interop.test.ts.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { readMapFile, readSkyMap, writeMapFile } from '../../src/io/mapFile.js';
import { bintableHdu, primaryHdu } from '../../src/io/fits/writer.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { testMap } from './fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-map-');
let n = 0;
const path = (ext = '.fits') => join(dir, `m${n++}${ext}`);

describe('writeMapFile / readMapFile round trips', () => {
  it('every layout, ordering, frame, dtype and compression (property, seeded)', () => {
    fc.assert(fc.property(
      fc.constantFrom(1, 2, 4, 16), fc.constantFrom('RING', 'NESTED' as const), fc.constantFrom('galactic', 'equatorial', 'unknown' as const),
      fc.constantFrom('implicit', 'explicit' as const), fc.boolean(), fc.boolean(), fc.integer({ min: 1, max: 3 }), fc.integer({ min: 0, max: 3 }),
      (nside, ordering, frame, layout, f64, gzip, columns, cubePlanes) => {
        const maps = cubePlanes > 0
          ? [testMap(nside, { ordering, frame, column: 'CUBE', f64, blankEvery: 5,
            planes: Array.from({ length: cubePlanes }, (_, k) => testMap(nside, { f64, k, blankEvery: 5 }).planes[0]),
            energiesGeV: Float64Array.from({ length: cubePlanes }, (_, k) => 10 ** k) })]
          : Array.from({ length: columns }, (_, k) => testMap(nside, { ordering, frame, column: `C${k}`, f64, k, blankEvery: layout === 'explicit' ? 4 : 0 }));
        const p = path(gzip ? '.fits.gz' : '.fits');
        writeMapFile(p, maps, { layout });
        const back = readMapFile(p);
        expect(back.maps).toHaveLength(maps.length);
        back.maps.forEach((m, i) => {
          expect(m.nside).toBe(nside);
          expect(m.ordering).toBe(ordering);
          expect(m.frame).toBe(frame);
          expect(m.column).toBe(maps[i].column);
          expect(m.unit).toBe(maps[i].unit);
          expect(m.planes[0]).toBeInstanceOf(f64 ? Float64Array : Float32Array);
          expect(m.planes.map((x) => Array.from(x))).toEqual(maps[i].planes.map((x) => Array.from(x)));
          expect(m.energiesGeV ? Array.from(m.energiesGeV) : null).toEqual(maps[i].energiesGeV ? Array.from(maps[i].energiesGeV!) : null);
        });
        expect(back.hdus[1].healpix!.scheme).toBe(layout === 'explicit' ? 'EXPLICIT' : 'IMPLICIT');
      }), { seed: 7, numRuns: 60 });
  });

  it('dtype converts, header cards are written, readSkyMap picks a column', () => {
    const p = path();
    writeMapFile(p, [testMap(2, { column: 'A', f64: true }), testMap(2, { column: 'B', k: 1 })], { dtype: 'float32', header: { MODEL: 'invented', scale: 2 } });
    const b = readSkyMap(p, { column: 'b' });
    expect(b.column).toBe('B');
    expect(b.planes[0]).toBeInstanceOf(Float32Array);
    expect(readSkyMap(p, { column: 1 }).column).toBe('A');
    expect(() => readSkyMap(p, { column: 'Z' })).toThrow(/has no map column "Z".*available: A, B/);
  });

  it('the frame option fills an unknown frame and refuses a contradiction', () => {
    const p = path();
    writeMapFile(p, testMap(1, { frame: 'unknown' }));
    expect(readSkyMap(p).frame).toBe('unknown');
    expect(readSkyMap(p, { frame: 'equatorial' }).frame).toBe('equatorial');
    const q = path();
    writeMapFile(q, testMap(1, { frame: 'galactic' }));
    expect(() => readSkyMap(q, { frame: 'equatorial' })).toThrow(/says frame galactic .* but equatorial was asked for/);
  });

  it('refuses to replace an existing file without force, and never writes over an input', () => {
    const p = path();
    writeMapFile(p, testMap(1));
    expect(() => writeMapFile(p, testMap(1))).toThrow(/exists already/);
    expect(() => writeMapFile(p, testMap(1), { force: true, inputs: [p] })).toThrow(/is an input/);
    writeMapFile(p, testMap(1, { k: 2 }), { force: true });
    expect(readSkyMap(p).planes[0][0]).toBe(Math.fround(Math.sin(2) + 2));
  });

  it('a BAD_DATA other than the HEALPix sentinel becomes BLANK; a FIRSTPIX..LASTPIX range reads as a partial map', () => {
    const v = Float32Array.from({ length: 48 }, (_, i) => (i === 5 ? -999 : i));
    const p = path();
    writeFileSync(p, Buffer.concat([primaryHdu(), ...bintableHdu([{ name: 'V', type: 'float32', repeat: 1, values: v }],
      [['PIXTYPE', 'HEALPIX'], ['ORDERING', 'RING'], ['NSIDE', 2], ['BAD_DATA', -999]])]));
    const m = readSkyMap(p);
    expect(m.planes[0][5]).toBe(Math.fround(BLANK));
    expect(m.planes[0][6]).toBe(6);
    const q = path();
    writeFileSync(q, Buffer.concat([primaryHdu(), ...bintableHdu([{ name: 'V', type: 'float64', repeat: 1, values: Float64Array.from([7, 8, 9]) }],
      [['PIXTYPE', 'HEALPIX'], ['ORDERING', 'NESTED'], ['NSIDE', 1], ['FIRSTPIX', 4], ['LASTPIX', 6]])]));
    const r = readSkyMap(q);
    expect(Array.from(r.planes[0].subarray(3, 8))).toEqual([BLANK, 7, 8, 9, BLANK]);
  });

  it('detects gzip by its magic bytes whatever the name (RFC 1952, section 2.3.1)', () => {
    const p = path('.fits');
    writeMapFile(p, testMap(2), { gzip: true });
    expect(readFileSync(p).subarray(0, 2)).toEqual(Buffer.from([0x1f, 0x8b]));
    expect(Array.from(readSkyMap(p).planes[0])).toEqual(Array.from(testMap(2).planes[0]));
  });

  it('refuses maps that cannot share a file', () => {
    expect(() => writeMapFile(path(), [testMap(1), testMap(2)])).toThrow(/differ in Nside/);
    expect(() => writeMapFile(path(), testMap(1, { planes: [new Float32Array(5)] }))).toThrow(/plane of 5 pixels, expected 12/);
    expect(() => writeMapFile(path(), testMap(1, { planes: [new Float32Array(12).fill(BLANK)] }), { layout: 'explicit' })).toThrow(/every pixel is blank/);
  });
});
