/**
 * Malformed FITS and HEALPix input: each case gives one InputError line naming
 * the file and the byte offset or keyword (FITS Standard 4.0, Pence et al.
 * 2010, A&A 524, A42, for what a valid file is; HEALPix FITS convention,
 * Gorski et al. 2005, ApJ 622, 759, for NSIDE and the pixel count).
 */
import { describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { InputError } from '../../src/core/errors.js';
import { readMapFile, writeMapFile, describeFitsFile } from '../../src/io/mapFile.js';
import { bintableHdu, primaryHdu } from '../../src/io/fits/writer.js';
import { findCard, read, removeEnd, setCard, testMap, write } from './fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-bad-');
const good = join(dir, 'good.fits');
writeMapFile(good, testMap(16), {}); // 3 rows of 1024E
const goodExplicit = join(dir, 'goodx.fits');
writeMapFile(goodExplicit, testMap(4, { blankEvery: 3 }), { layout: 'explicit' });
const bytes = read(good);
const xbytes = read(goodExplicit);
const ext = 2880; // the map table's header starts after the primary HDU

function expectInputError(b: Uint8Array, pattern: RegExp, name = 'bad.fits'): InputError {
  const p = join(dir, name);
  write(p, b);
  let caught: unknown;
  try { readMapFile(p); } catch (e) { caught = e; }
  expect(caught).toBeInstanceOf(InputError);
  const err = caught as InputError;
  expect(err.message).toContain(p);
  expect(err.message).not.toContain('\n');
  expect(err.message).toMatch(pattern);
  return err;
}

describe('bad FITS input', () => {
  it('the good files read', () => {
    expect(readMapFile(good).maps[0].nside).toBe(16);
    expect(readMapFile(goodExplicit).maps[0].nside).toBe(4);
  });
  it('a file cut inside the data', () => {
    const e = expectInputError(bytes.subarray(0, bytes.length - 2880 + 100), /declares 12288 data bytes from byte 5760, but the file ends at byte/);
    expect(e.location.byteOffset).toBe(5760);
  });
  it('a file cut inside a header', () => expectInputError(bytes.subarray(0, 2880 + 800), /no END card/));
  it('an empty file and a file that is not FITS', () => {
    expectInputError(new Uint8Array(0), /less than one 2880-byte FITS block/);
    expectInputError(new Uint8Array(5760).fill(65), /does not start with SIMPLE/);
  });
  it('a header with no END card', () => expectInputError(removeEnd(bytes), /no END card/));
  it('an NAXIS2 larger than the file holds', () => expectInputError(setCard(bytes, 'NAXIS2', '7', ext), /keyword NAXIS2.*declares/));
  it('an NAXIS2 smaller than the pixel count', () => expectInputError(setCard(bytes, 'NAXIS2', '1', ext), /holds 1024 pixels per plane, but NSIDE 16/));
  it('NAXIS2 = 2^40 is refused before allocating', () => expectInputError(setCard(bytes, 'NAXIS2', String(2 ** 40), ext), /declares 4503599627370496 data bytes/));
  it('NAXIS1 disagreeing with the columns', () => expectInputError(setCard(bytes, 'NAXIS1', '4', ext), /keyword NAXIS1.*columns take 4096 bytes per row but NAXIS1 is 4/));
  it('an unknown TFORM', () => expectInputError(setCard(bytes, 'TFORM1', "'1024Z'", ext), /keyword TFORM1.*unknown column format "1024Z"/));
  it('a TFIELDS larger than the columns described', () => expectInputError(setCard(bytes, 'TFIELDS', '2', ext), /keyword TFORM2, byte 2880: required keyword is missing/));
  it('an NSIDE that is not a power of two', () => expectInputError(setCard(bytes, 'NSIDE', '12', ext), /keyword NSIDE.*NSIDE is 12, expected a power of two/));
  it('an NSIDE that disagrees with the pixel count', () => expectInputError(setCard(bytes, 'NSIDE', '8', ext), /keyword LASTPIX.*value 3071 is outside 0\.\.767/));
  it('a pixel count that is not 12 Nside^2 when NSIDE is absent', () => {
    const b = Buffer.concat([primaryHdu(), ...bintableHdu([{ name: 'V', type: 'float32', repeat: 1, values: new Float32Array(100) }],
      [['PIXTYPE', 'HEALPIX'], ['ORDERING', 'RING']])]);
    expectInputError(b, /100 pixels, not 12 Nside\^2/);
  });
  it('ecliptic coordinates are refused', () => expectInputError(setCard(bytes, 'COORDSYS', "'E'", ext), /ecliptic coordinates/));
  it('a missing ORDERING', () => {
    const b = bytes.slice();
    b.fill(32, findCard(b, 'ORDERING', ext), findCard(b, 'ORDERING', ext) + 80);
    b.set(Buffer.from('PIXTYPE'), findCard(b, 'PIXTYPE', ext)); // still a HEALPix table
    expectInputError(b, /ORDERING is missing/);
  });
  it('PIXEL values out of range, or listed twice', () => {
    const p = findCard(xbytes, 'NAXIS2', ext);
    expect(p).toBeGreaterThan(0);
    expectInputError(setCard(xbytes, 'NSIDE', '1', ext), /row 9.*PIXEL 13 is outside 0\.\.11/);
    const dup = xbytes.slice();
    dup.copyWithin(5760 + 8, 5760, 5760 + 4); // row 2's PIXEL := row 1's
    expectInputError(dup, /row 2.*pixel \d+ is listed twice/);
  });
  it('a gzip stream cut short or damaged', () => {
    const gz = gzipSync(bytes);
    expectInputError(gz.subarray(0, gz.length - 30), /gzip stream is damaged or cut short/, 'cut.fits.gz');
    const bad = Buffer.from(gz); bad[20] ^= 0xff;
    expectInputError(bad, /gzip stream is damaged|declares|no END|bad header card|not/, 'flip.fits.gz');
  });
  it('a table that is not a HEALPix map is described by info but refused as a map', () => {
    const b = Buffer.concat([primaryHdu(), ...bintableHdu([{ name: 'V', type: 'float64', repeat: 1, values: new Float64Array(7) }])]);
    const p = join(dir, 'table.fits');
    writeFileSync(p, b);
    expect(describeFitsFile(p).maps).toEqual([]);
    expectInputError(b, /holds no HEALPix map/, 'table.fits');
  });
  it('a missing file', () => {
    expect(() => readMapFile(join(dir, 'nope.fits'))).toThrow(/nope\.fits: cannot read the file \(ENOENT\)/);
  });
});
