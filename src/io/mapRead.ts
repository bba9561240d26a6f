/**
 * Reading HEALPix maps from FITS files (the HEALPix FITS convention of
 * Gorski et al. 2005, ApJ 622, 759): full-sky (INDXSCHM = IMPLICIT, values in
 * pixel order, possibly as 1024E vector rows, possibly a FIRSTPIX..LASTPIX
 * range) and partial-sky (EXPLICIT, a PIXEL column), several map columns, and
 * energy cubes (see mapLayout.ts for the two cube layouts).
 */
import { InputError } from '../core/errors.js';
import type { FrameName } from '../sphere/frames.js';
import { nside2npix, npix2nside } from '../sphere/nside.js';
import { BLANK, type MapArray, type SkyMap } from '../maps/skyMap.js';
import { findColumn, readColumn, tableLayout, type TableColumn } from './fits/bintable.js';
import type { DecodedArray } from './fits/decode.js';
import type { Hdu } from './fits/hdu.js';
import { isHealpixHdu, readFrame, readNside, readOrdering, readScheme } from './healpixKeywords.js';
import { readEnergies } from './mapLayout.js';
import { checkDecodeMemory } from './mapMemory.js';
import { summariseHdu, type HduSummary } from './hduSummary.js';

/** What a map file holds: one SkyMap per map column (a cube is one SkyMap), and every HDU described. */
export interface MapFileContents {
  readonly file: string;
  readonly maps: SkyMap[];
  readonly hdus: HduSummary[];
}

/** Options of {@link readMapFile}. */
export interface ReadMapOptions {
  /** Frame to assume when the file does not state one (COORDSYS missing or unknown). */
  frame?: FrameName;
  /** Memory the decoded maps may take, bytes (default: SKYSPAN_MEMORY_LIMIT_BYTES, else the free memory; see core/memory.ts). */
  memoryLimitBytes?: number;
}

/** Largest full-sky expansion of a partial map accepted regardless of the file size (bytes). */
const EXPAND_FLOOR_BYTES = 2 ** 30;

function toMapArray(a: DecodedArray): MapArray {
  if (a instanceof Float32Array || a instanceof Float64Array) return a;
  return a instanceof Uint8Array || a instanceof Int16Array ? Float32Array.from(a) : Float64Array.from(a);
}

function replaceBadData(a: MapArray, bad: number | undefined): void {
  if (bad === undefined || Math.abs(bad - BLANK) <= 1e-5 * Math.abs(BLANK)) return;
  const b32 = Math.fround(bad);
  for (let i = 0; i < a.length; i++) if (a[i] === bad || a[i] === b32) a[i] = BLANK;
}

/** Finds the HDU holding the map, or throws an InputError saying the file has none. */
export function findMapHdu(hdus: Hdu[], file: string): Hdu {
  const hdu = hdus.find(isHealpixHdu);
  if (!hdu) {
    throw new InputError('holds no HEALPix map (no binary table with PIXTYPE = HEALPIX or NSIDE and ORDERING)', { file },
      'run `skyspan info` on it to see what it holds');
  }
  return hdu;
}

/** Reads the maps of a located HEALPix HDU. */
export function readMapsFromHdus(bytes: Uint8Array, hdus: Hdu[], file: string, options: ReadMapOptions = {}): MapFileContents {
  const summaries = hdus.map(summariseHdu);
  const hdu = findMapHdu(hdus, file);
  const h = hdu.header;
  const layout = tableLayout(hdu);
  const ordering = readOrdering(h);
  const fr = readFrame(h);
  let frame = fr.frame;
  if (options.frame && options.frame !== 'unknown') {
    if (frame !== 'unknown' && frame !== options.frame) {
      throw new InputError(`the file says frame ${frame} (COORDSYS = ${fr.coordsys}) but ${options.frame} was asked for`,
        { file, keyword: 'COORDSYS' }, 'drop the frame option, or fix COORDSYS');
    }
    frame = options.frame;
  }
  const pixelCol = findColumn(layout, 'PIXEL');
  const scheme = readScheme(h, pixelCol !== undefined);
  if (scheme === 'EXPLICIT' && !pixelCol) {
    throw new InputError('INDXSCHM is EXPLICIT but the table has no PIXEL column', { file, keyword: 'INDXSCHM' });
  }
  const valueCols = layout.columns.filter((c) => c !== pixelCol && c.format.element !== null && c.format.code !== 'L');
  const summary = summaries[hdu.index];
  for (const c of layout.columns) {
    if (c.format.element === null || c.format.code === 'L') summary.notes.push(`column ${c.name} (${c.tform}) is not a map and was not read`);
  }
  if (valueCols.length === 0) throw new InputError('the HEALPix table has no numeric map column', { file, byteOffset: h.start });
  const energies = readEnergies(bytes, hdus, hdu, file);
  const single = layout.columns.length === 1;
  const inPlace = single;
  const bad = h.number('BAD_DATA');
  let nside = readNside(h);
  let pixels: DecodedArray | null = null;
  let first = 0;
  let last = -1;
  const perPixel = (c: TableColumn): number => (energies && valueCols.length === 1 && c.format.repeat === energies.length) ? energies.length : 1;
  if (scheme === 'EXPLICIT') {
    if (pixelCol!.format.repeat !== 1) throw new InputError('the PIXEL column must hold one index per row', { file, keyword: `TFORM${pixelCol!.index}` });
    pixels = readColumn(bytes, layout, pixelCol!);
    if (nside === null) throw new InputError('NSIDE is missing in a partial-sky (EXPLICIT) map', { file, keyword: 'NSIDE', byteOffset: h.start });
  } else {
    const k = perPixel(valueCols[0]);
    const count = (layout.rows * valueCols[0].format.repeat) / k;
    if (nside === null) {
      nside = npix2nside(count);
      if (Number.isNaN(nside)) {
        throw new InputError(`the map has ${count} pixels, not 12 Nside^2 for a power-of-two Nside, and NSIDE is missing`,
          { file, keyword: 'NAXIS2', byteOffset: h.offsetOf('NAXIS2') });
      }
    }
    const npix = nside2npix(nside);
    first = h.optInt('FIRSTPIX', 0, npix - 1, 0);
    last = h.optInt('LASTPIX', first, npix - 1, npix - 1);
    const dataNside = npix2nside(count);
    if (first === 0 && dataNside !== nside && !Number.isNaN(dataNside)) {
      // healpy's read_map refuses such a file too ("Wrong nside parameter").
      throw new InputError(`NSIDE ${nside} disagrees with the data: the map column ${valueCols[0].name} holds ${count} pixels per plane, a full sky at Nside ${dataNside}`,
        { file, keyword: 'NSIDE', byteOffset: h.offsetOf('NSIDE') }, `set NSIDE = ${dataNside} and LASTPIX = ${count - 1} if the data are right`);
    }
    if (count !== last - first + 1) {
      throw new InputError(`the map column ${valueCols[0].name} holds ${count} pixels per plane, but NSIDE ${nside} with FIRSTPIX ${first} and LASTPIX ${last} needs ${last - first + 1}`,
        { file, keyword: 'NAXIS2', byteOffset: h.offsetOf('NAXIS2') }, 'the table is truncated, or NSIDE, NAXIS2 or TFORM is wrong');
    }
  }
  const npix = nside2npix(nside);
  if (scheme === 'IMPLICIT' && last - first + 1 !== npix) guardExpansion(last - first + 1, npix, 8, file, bytes.length);
  if (pixels) {
    guardExpansion(pixels.length, npix, 8, file, bytes.length);
    checkPixels(pixels, npix, file);
  }
  checkDecodeMemory(valueCols, perPixel, { nside, file, inPlace, fullSky: !pixels && first === 0 && last === npix - 1, held: bytes.length },
    options.memoryLimitBytes);
  const maps: SkyMap[] = [];
  const isCube = energies !== null;
  const planes: MapArray[] = [];
  for (const c of valueCols) {
    const k = perPixel(c);
    if (scheme === 'IMPLICIT' && layout.rows * c.format.repeat !== (last - first + 1) * k) {
      throw new InputError(`column ${c.name} holds ${layout.rows * c.format.repeat} values, expected ${(last - first + 1) * k}`,
        { file, keyword: `TFORM${c.index}`, byteOffset: h.offsetOf(`TFORM${c.index}`) });
    }
    if (scheme === 'EXPLICIT' && c.format.repeat !== k) {
      throw new InputError(`column ${c.name} holds ${c.format.repeat} values per row in a partial-sky map, expected ${k}`,
        { file, keyword: `TFORM${c.index}`, byteOffset: h.offsetOf(`TFORM${c.index}`) });
    }
    const values = toMapArray(readColumn(bytes, layout, c, inPlace));
    replaceBadData(values, bad);
    const columnPlanes = k === 1 ? [values] : splitPlanes(values, k);
    const full = columnPlanes.map((v) => expand(v, pixels, first, npix));
    if (isCube) planes.push(...full);
    else maps.push({ nside, ordering, frame, column: c.name, unit: c.unit, planes: full, energiesGeV: null });
  }
  if (isCube) {
    if (planes.length !== energies.length) {
      throw new InputError(`the ENERGIES table lists ${energies.length} energies but the map has ${planes.length} planes`,
        { file, keyword: 'NAXIS2' }, 'each energy needs one map column (or one value per pixel in a vector column)');
    }
    const name = h.string('CUBECOL') ?? valueCols[0].name;
    maps.push({ nside, ordering, frame, column: name, unit: valueCols[0].unit, planes, energiesGeV: energies });
  }
  summary.healpix = { nside, ordering, frame, scheme, coordsys: fr.coordsys };
  if (fr.frame === 'unknown') summary.notes.push(`COORDSYS ${fr.coordsys === null ? 'missing' : `"${fr.coordsys}" not recognised`}: frame ${frame}`);
  return { file, maps, hdus: summaries };
}

/** Splits pixel-major values (K per pixel) into K planes. */
function splitPlanes(values: MapArray, k: number): MapArray[] {
  const n = values.length / k;
  const out: MapArray[] = [];
  for (let j = 0; j < k; j++) {
    const p = values instanceof Float32Array ? new Float32Array(n) : new Float64Array(n);
    for (let i = 0; i < n; i++) p[i] = values[i * k + j];
    out.push(p);
  }
  return out;
}

/** Expands values of listed pixels (or of a FIRSTPIX range) to a full-sky plane, BLANK elsewhere. */
function expand(values: MapArray, pixels: DecodedArray | null, first: number, npix: number): MapArray {
  if (!pixels && first === 0 && values.length === npix) return values;
  const out = values instanceof Float32Array ? new Float32Array(npix) : new Float64Array(npix);
  out.fill(BLANK);
  if (pixels) for (let i = 0; i < pixels.length; i++) out[pixels[i]] = values[i];
  else out.set(values, first);
  return out;
}

/**
 * Refuses to expand a partial map whose full-sky planes would take more than
 * 1 GiB and more than 16 times the file's size: a damaged NSIDE must not make
 * a small file allocate gigabytes.
 */
function guardExpansion(listed: number, npix: number, elementBytes: number, file: string, fileBytes: number): void {
  const bytes = npix * elementBytes;
  if (bytes > EXPAND_FLOOR_BYTES && bytes > 16 * fileBytes) {
    throw new InputError(`a partial map of ${listed} pixels would expand to ${bytes} bytes per plane at its NSIDE, more than this file can justify`,
      { file, keyword: 'NSIDE' }, 'check NSIDE');
  }
}

function checkPixels(pixels: DecodedArray, npix: number, file: string): void {
  const seen = new Uint8Array(npix);
  for (let i = 0; i < pixels.length; i++) {
    const p = pixels[i];
    if (!(p >= 0 && p < npix) || !Number.isInteger(p)) {
      throw new InputError(`PIXEL ${p} is outside 0..${npix - 1}`, { file, row: i + 1, keyword: 'PIXEL' }, 'NSIDE or the PIXEL column is wrong');
    }
    if (seen[p]) throw new InputError(`pixel ${p} is listed twice`, { file, row: i + 1, keyword: 'PIXEL' });
    seen[p] = 1;
  }
}
