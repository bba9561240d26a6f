/**
 * Decoding one block of rows of a HEALPix map table into per-plane value
 * arrays, for the streaming reader (mapStream.ts). The values are exactly
 * those the whole-file reader produces (mapRead.ts with fits/bintable.ts):
 * big-endian numbers (Pence et al. 2010, A&A 524, A42, section 5), scaled as
 * TZEROn + TSCALn * stored (section 7.3.2), integer TNULLn values as NaN,
 * BAD_DATA values as the HEALPix blank, in the same element type
 * (Float32Array for float32, uint8 and int16 columns, else Float64Array).
 */
import { BLANK, type MapArray } from '../maps/skyMap.js';
import { elementBytes, gatherBigEndian } from './fits/decode.js';
import type { TableColumn, TableLayout } from './fits/bintable.js';

/** One plane of the map: a column and a slot within each pixel's values. */
export interface PlaneSource {
  readonly col: TableColumn;
  /** Values per pixel in this column (K for a cube vector column, else 1). */
  readonly k: number;
  /** Slot of this plane within a pixel's K values. */
  readonly slot: number;
  /** True when the plane is held as Float32Array. */
  readonly float32: boolean;
}

/** True when a column decodes to Float32Array (see module doc). */
export function decodesToFloat32(c: TableColumn): boolean {
  const e = c.format.element;
  const scaled = c.scale !== 1 || c.zero !== 0;
  const nulls = e !== 'float32' && e !== 'float64' && c.tnull !== undefined;
  return !scaled && !nulls && (e === 'float32' || e === 'uint8' || e === 'int16');
}

/** Allocates the window array of a plane. */
export function planeArray(src: PlaneSource, n: number): MapArray {
  return src.float32 ? new Float32Array(n) : new Float64Array(n);
}

/** True when every column of the table is float32, so a block can be byte-swapped as 32-bit words at once. */
export function allFloat32(layout: TableLayout): boolean {
  return layout.columns.every((c) => c.format.element === 'float32');
}

/**
 * Decodes plane `src` of `rows` rows held in `block` (raw big-endian bytes,
 * or, with `words`, the same block already swapped and viewed as float32
 * words) into `out[0 .. rows * ppr)`, ppr pixels per row, pixel-major.
 * `bad` is the BAD_DATA value (undefined when absent).
 */
export function decodePlane(block: Uint8Array, words: Float32Array | null, rowBytes: number, rows: number, ppr: number,
  src: PlaneSource, bad: number | undefined, out: MapArray): void {
  const { col, k, slot } = src;
  const n = rows * ppr;
  if (words) {
    const rowWords = rowBytes / 4, base = col.offset / 4 + slot;
    let o = 0;
    for (let r = 0; r < rows; r++) {
      let p = r * rowWords + base;
      for (let i = 0; i < ppr; i++, p += k) out[o++] = words[p];
    }
  } else {
    gather(block, rowBytes, rows, ppr, src, out);
  }
  const e = col.format.element;
  const nulls = e !== 'float32' && e !== 'float64' && col.tnull !== undefined;
  if (col.scale !== 1 || col.zero !== 0 || nulls) {
    const s = col.scale, z = col.zero, tn = col.tnull ?? NaN;
    for (let i = 0; i < n; i++) { const v = out[i]; out[i] = nulls && v === tn ? NaN : z + s * v; }
  }
  replaceBad(out, n, bad);
}

/** Replaces BAD_DATA values (`bad`, or its float32 rounding) among out[0 .. n) by the HEALPix blank. */
export function replaceBad(out: MapArray, n: number, bad: number | undefined): void {
  if (bad === undefined || Math.abs(bad - BLANK) <= 1e-5 * Math.abs(BLANK)) return;
  const b32 = Math.fround(bad);
  for (let i = 0; i < n; i++) if (out[i] === bad || out[i] === b32) out[i] = BLANK;
}

/** Gathers stored values of one plane (any element type; fits/decode.ts kernel). */
function gather(block: Uint8Array, rowBytes: number, rows: number, ppr: number, src: PlaneSource, out: MapArray): void {
  const t = src.col.format.element!;
  const size = elementBytes(t);
  gatherBigEndian(block, 0, rows, rowBytes, src.col.offset + src.slot * size, ppr, size * src.k, t, out);
}

/** Decodes the PIXEL column (one index per row) of `rows` rows into `out` (as numbers). */
export function decodePixels(block: Uint8Array, rowBytes: number, rows: number, col: TableColumn, out: Float64Array): void {
  gather(block, rowBytes, rows, 1, { col, k: 1, slot: 0, float32: false }, out);
  if (col.scale !== 1 || col.zero !== 0) for (let i = 0; i < rows; i++) out[i] = col.zero + col.scale * out[i];
}
