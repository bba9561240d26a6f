/**
 * The generic FITS reader against files written by astropy.io.fits
 * (Debian python3-astropy 5.2, scripts/write_with_astropy.py): every image
 * BITPIX with BSCALE/BZERO/BLANK, a BINTABLE of types L B I J K E D with a
 * vector column, TSCAL/TZERO, TNULL and TUNIT, a CONTINUE long string, a
 * HIERARCH card and a D exponent; an ASCII table; a vector-per-pixel cube.
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { join } from 'node:path';
import { requirePython, runPython } from '../../helpers/python.js';
import { loadFitsBytes, walkHdus, readImage, tableLayout, readColumn, readTextColumn, findColumn } from '../../../src/io/fits/index.js';
import { readMapFile, describeFitsFile } from '../../../src/io/mapFile.js';
import { tempDir } from '../../helpers/tempDir.js';

const have = requirePython();
const dir = tempDir('skyspan-astropy-');
let ref: Record<string, any>;

const nul = (a: ArrayLike<number>): (number | null)[] => Array.from(a, (v) => (Number.isFinite(v) ? v : null));

describe.skipIf(!have)('FITS reader vs astropy.io.fits', () => {
  beforeAll(() => {
    ref = JSON.parse(runPython('scripts/write_with_astropy.py', [dir]));
  });

  it.each([8, 16, 32, 64, -32, -64])('image BITPIX %i decodes as astropy reads it (BSCALE, BZERO, BLANK)', (bitpix) => {
    const file = join(dir, `image_${bitpix}.fits`);
    const bytes = loadFitsBytes(file);
    const [hdu] = walkHdus(bytes, file);
    const img = readImage(bytes, hdu);
    expect(img.dims).toEqual(ref[`image_${bitpix}`].dims);
    expect(nul(img.data)).toEqual(ref[`image_${bitpix}`].values);
  });

  it('BINTABLE columns L B I J K E D, vector, scaled, TNULL, text and header cards', () => {
    const file = join(dir, 'table.fits');
    const bytes = loadFitsBytes(file);
    const hdus = walkHdus(bytes, file);
    const layout = tableLayout(hdus[1]);
    const t = ref.table;
    for (const name of ['FLAG', 'BYTE', 'SHORT', 'LONG', 'FLT', 'DBL', 'VEC', 'SCALED']) {
      expect(nul(readColumn(bytes, layout, findColumn(layout, name)!)), name).toEqual(t[name]);
    }
    // TNULL4 = -99: astropy returns the stored -99; the FITS Standard (section 7.3.2) says it marks an undefined value.
    const ints = readColumn(bytes, layout, findColumn(layout, 'INT')!);
    expect(nul(ints)).toEqual(t.INT.map((v: number) => (v === -99 ? null : v)));
    expect(readTextColumn(bytes, layout, findColumn(layout, 'NAME')!)).toEqual(t.NAME);
    expect(findColumn(layout, 'SHORT')!.unit).toBe('count');
    const h = hdus[1].header;
    expect(h.get('LONGSTR')).toBe(t.LONGSTR);
    expect(h.get('DEXP')).toBe(t.DEXP);
    expect(h.get('SOME LONG KEY')).toBe(42);
  });

  it('an ASCII table is described, not read as a map', () => {
    const d = describeFitsFile(join(dir, 'ascii.fits'));
    expect(d.maps).toEqual([]);
    expect(d.hdus[1].kind).toBe('table');
    expect(d.hdus[1].columns![0].name).toBe('X');
    expect(() => readMapFile(join(dir, 'ascii.fits'))).toThrow(/holds no HEALPix map/);
  });

  it('a vector-per-pixel energy cube with energies in MeV', () => {
    const { maps } = readMapFile(join(dir, 'cube_vector.fits'));
    expect(maps).toHaveLength(1);
    expect(maps[0].planes.map((p) => Array.from(p))).toEqual(ref.cube_vector.planes);
    expect(Array.from(maps[0].energiesGeV!)).toEqual(ref.cube_vector.energiesGeV);
    expect(maps[0].frame).toBe('galactic');
  });
});
