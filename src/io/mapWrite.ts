/**
 * Writing HEALPix maps as FITS files that healpy.read_map and astropy.io.fits
 * read back unchanged (the HEALPix FITS convention, Gorski et al. 2005,
 * ApJ 622, 759): an empty primary HDU, then a BINTABLE with PIXTYPE,
 * ORDERING, COORDSYS, NSIDE, FIRSTPIX, LASTPIX, INDXSCHM, OBJECT and
 * BAD_DATA. Full-sky maps are written IMPLICIT in rows of 1024 values
 * (TFORM 1024E) when the pixel count allows; partial-sky maps EXPLICIT with a
 * PIXEL column listing the pixels that are not blank in any map. Energy cubes
 * follow the layout in mapLayout.ts.
 */
import { gzipSync } from 'node:zlib';
import { InputError } from '../core/errors.js';
import { assertFits, formatBytes } from '../core/memory.js';
import { nside2npix } from '../sphere/nside.js';
import { isBlank } from '../maps/blank.js';
import { BLANK, type MapArray, type SkyMap } from '../maps/skyMap.js';
import { writeFileAtomic } from './atomicWrite.js';
import { bintableHdu, primaryHdu, type CardSpec, type ColumnSpec } from './fits/writer.js';
import { ENERGIES_EXTNAME, ENERGY_COLUMN, planeColumnName } from './mapLayout.js';

/** Options of {@link writeMapFile}. */
export interface WriteMapOptions {
  force?: boolean;
  inputs?: string[];
  layout?: 'implicit' | 'explicit';
  dtype?: 'float32' | 'float64';
  header?: Record<string, string | number | boolean>;
  /** Compress with gzip; default: when the path ends in .gz. */
  gzip?: boolean;
  /** Memory limit in bytes (default: SKYSPAN_MEMORY_LIMIT_BYTES, else what the system reports free; core/memory.ts). */
  memoryLimitBytes?: number;
}

const COORDSYS: Record<string, string | undefined> = { galactic: 'G', equatorial: 'C', unknown: undefined };

function extraCards(values: Record<string, string | number | boolean> | undefined, file: string): CardSpec[] {
  const cards: CardSpec[] = [];
  for (const [k, v] of Object.entries(values ?? {})) {
    const key = k.toUpperCase();
    if (typeof v === 'number' && !Number.isFinite(v)) continue;
    if (key === 'COMMENT' || key === 'HISTORY') cards.push([key, undefined, String(v)]);
    else if (/^[A-Z0-9_-]{1,8}$/.test(key)) cards.push([key, v]);
    else if (/^[\x20-\x7e]*$/.test(k)) cards.push(['COMMENT', undefined, `${k} = ${String(v)}`]);
    else throw new InputError(`header key "${k}" is not printable ASCII`, { file, keyword: k });
  }
  return cards;
}

function checkMaps(maps: SkyMap[], file: string): void {
  if (maps.length === 0) throw new InputError('no map to write', { file });
  const m0 = maps[0];
  for (const m of maps) {
    if (m.nside !== m0.nside || m.ordering !== m0.ordering || m.frame !== m0.frame) {
      throw new InputError(`maps ${m0.column} and ${m.column} differ in Nside, ordering or frame and cannot share a file`, { file });
    }
    const npix = nside2npix(m.nside);
    for (const p of m.planes) if (p.length !== npix) throw new InputError(`map ${m.column} has a plane of ${p.length} pixels, expected ${npix}`, { file });
    if (m.planes.length === 0) throw new InputError(`map ${m.column} has no plane`, { file });
  }
  const cubes = maps.filter((m) => m.energiesGeV !== null);
  if (cubes.length > 0 && maps.length > 1) throw new InputError('an energy cube is written alone in its file', { file });
  if (cubes.length === 1 && cubes[0].energiesGeV!.length !== cubes[0].planes.length) {
    throw new InputError(`cube ${cubes[0].column} has ${cubes[0].planes.length} planes but ${cubes[0].energiesGeV!.length} energies`, { file });
  }
}

function convert(p: MapArray, dtype: 'float32' | 'float64'): MapArray {
  if (dtype === 'float32') return p instanceof Float32Array ? p : Float32Array.from(p);
  return p instanceof Float64Array ? p : Float64Array.from(p);
}

function gatherPixels(planes: MapArray[], npix: number): Int32Array {
  const keep = new Uint8Array(npix);
  let n = 0;
  for (let i = 0; i < npix; i++) {
    for (const p of planes) if (!isBlank(p[i])) { keep[i] = 1; n++; break; }
  }
  const out = new Int32Array(n);
  for (let i = 0, k = 0; i < npix; i++) if (keep[i]) out[k++] = i;
  return out;
}

/**
 * Refuses, before encoding, a write whose copies would not fit: the encoded
 * table (planes x 12 Nside^2 x 4 or 8 bytes), planes converted to `dtype`, the
 * pixel list of an explicit layout and, for gzip, the joined bytes and the
 * compressed output (taken as large as the input). The maps, already held,
 * count against an explicit limit.
 */
function checkWriteMemory(path: string, list: SkyMap[], npix: number, dtype: 'float32' | 'float64', options: WriteMapOptions): void {
  const size = dtype === 'float32' ? 4 : 8;
  let planes = 0, converted = 0, held = 0;
  for (const m of list) {
    for (const p of m.planes) {
      planes++;
      held += p.byteLength;
      if (!(p instanceof (dtype === 'float32' ? Float32Array : Float64Array))) converted++;
    }
  }
  const encoded = planes * npix * size;
  const gzip = options.gzip ?? /\.gz$/i.test(path);
  const needed = encoded * (gzip ? 3 : 1) + converted * npix * size + (options.layout === 'explicit' ? 5 * npix : 0);
  assertFits(needed, `writing ${planes} plane${planes === 1 ? '' : 's'} of ${formatBytes(npix * size)} to ${path}`,
    `write ${gzip ? 'uncompressed (.fits) or ' : ''}${size === 8 ? 'float32 (--dtype float32) or ' : ''}at a lower Nside`,
    options.memoryLimitBytes, held);
}

/**
 * Writes one or more maps (same Nside, ordering, frame), or one energy cube,
 * to a FITS file through writeFileAtomic (an existing file is replaced only
 * with `force`; an input path is refused).
 */
export function writeMapFile(path: string, maps: SkyMap | SkyMap[], options: WriteMapOptions = {}): void {
  const list = Array.isArray(maps) ? maps : [maps];
  checkMaps(list, path);
  const m0 = list[0];
  const npix = nside2npix(m0.nside);
  const dtype = options.dtype ?? (list.every((m) => m.planes.every((p) => p instanceof Float64Array)) ? 'float64' : 'float32');
  const cube = m0.energiesGeV !== null;
  checkWriteMemory(path, list, npix, dtype, options);
  const named = cube
    ? m0.planes.map((p, k) => ({ name: planeColumnName(k), unit: m0.unit, plane: convert(p, dtype) }))
    : list.map((m) => ({ name: m.column, unit: m.unit, plane: convert(m.planes[0], dtype) }));
  for (const m of list) {
    if (!cube && m.planes.length > 1) throw new InputError(`map ${m.column} has ${m.planes.length} planes but no energies`, { file: path });
  }
  const explicit = options.layout === 'explicit';
  const columns: ColumnSpec[] = [];
  let pixels: Int32Array | null = null;
  if (explicit) {
    pixels = gatherPixels(named.map((c) => c.plane), npix);
    if (pixels.length === 0) throw new InputError('every pixel is blank: nothing to write in a partial-sky file', { file: path });
    columns.push({ name: 'PIXEL', type: 'int32', repeat: 1, values: pixels });
    for (const c of named) {
      const v = c.plane instanceof Float32Array ? new Float32Array(pixels.length) : new Float64Array(pixels.length);
      for (let i = 0; i < pixels.length; i++) v[i] = c.plane[pixels[i]];
      columns.push({ name: c.name, type: dtype, repeat: 1, unit: c.unit, values: v });
    }
  } else {
    const repeat = npix % 1024 === 0 ? 1024 : 1;
    for (const c of named) columns.push({ name: c.name, type: dtype, repeat, unit: c.unit, values: c.plane });
  }
  const cards: CardSpec[] = [
    ['PIXTYPE', 'HEALPIX', 'HEALPix pixelisation'],
    ['ORDERING', m0.ordering, 'pixel ordering scheme, RING or NESTED'],
  ];
  const cs = COORDSYS[m0.frame];
  if (cs) cards.push(['COORDSYS', cs, cs === 'G' ? 'Galactic' : 'equatorial (ICRS, J2000 axes)']);
  else cards.push(['COMMENT', undefined, 'coordinate frame unknown: COORDSYS not written']);
  cards.push(['EXTNAME', 'SKYMAP', 'HEALPix map table']);
  cards.push(['NSIDE', m0.nside, 'HEALPix resolution parameter']);
  cards.push(['FIRSTPIX', pixels ? pixels[0] : 0, 'first pixel (0-based)']);
  cards.push(['LASTPIX', pixels ? pixels[pixels.length - 1] : npix - 1, 'last pixel (0-based)']);
  cards.push(['INDXSCHM', explicit ? 'EXPLICIT' : 'IMPLICIT', 'indexing: IMPLICIT or EXPLICIT']);
  cards.push(['OBJECT', explicit ? 'PARTIAL' : 'FULLSKY', 'sky coverage']);
  cards.push(['BAD_DATA', BLANK, 'value of blank pixels']);
  if (cube) cards.push(['CUBECOL', m0.column, `cube name; plane energies in the ${ENERGIES_EXTNAME} extension`]);
  cards.push(...extraCards(m0.meta, path), ...extraCards(options.header, path));
  const chunks: Uint8Array[] = [primaryHdu([['COMMENT', undefined, 'HEALPix map written by skyspan']]), ...bintableHdu(columns, cards)];
  if (cube) {
    chunks.push(...bintableHdu([{ name: ENERGY_COLUMN, type: 'float64', repeat: 1, unit: 'GeV', values: m0.energiesGeV! }],
      [['EXTNAME', ENERGIES_EXTNAME, 'energy of each map plane']]));
  }
  const gzip = options.gzip ?? /\.gz$/i.test(path);
  const data = gzip ? [gzipSync(Buffer.concat(chunks))] : chunks;
  writeFileAtomic(path, data, { force: options.force, inputs: options.inputs });
}
