/**
 * Writing FITS: headers as 80-character cards padded with blanks to 2880-byte
 * blocks, an empty primary HDU, and BINTABLE extensions with data padded with
 * zeros (Pence et al. 2010, A&A 524, A42, sections 3.3.2, 4.1 and 7.3).
 */
import { formatCards } from './cards.js';
import { elementBytes, encodeContiguous, writeOne, type ElementType } from './decode.js';
import { BLOCK } from './header.js';

/** A card to write: keyword, value (undefined for commentary) and comment. */
export type CardSpec = [keyword: string, value: string | number | boolean | undefined, comment?: string];

/** A column to write: name, element type, repeat per row, unit, values (rows x repeat, row-major). */
export interface ColumnSpec {
  readonly name: string;
  readonly type: ElementType;
  readonly repeat: number;
  readonly unit?: string;
  readonly values: ArrayLike<number>;
  /** Write as a logical column (TFORM L, section 7.3.3): 1 as 'T', 0 as 'F', NaN as undefined (0); type must be uint8. */
  readonly logical?: boolean;
}

const TFORM_CODE: Record<ElementType, string> = { uint8: 'B', int16: 'I', int32: 'J', int64: 'K', float32: 'E', float64: 'D' };

/** Serialises cards (plus END) into whole 2880-byte blocks of ASCII. */
export function headerBytes(cards: CardSpec[]): Uint8Array {
  const lines: string[] = [];
  for (const [k, v, c] of cards) lines.push(...formatCards(k, v, c));
  lines.push('END'.padEnd(80));
  const text = lines.join('');
  const out = new Uint8Array(Math.ceil(text.length / BLOCK) * BLOCK).fill(32);
  for (let i = 0; i < text.length; i++) out[i] = text.charCodeAt(i);
  return out;
}

/** An empty primary HDU (NAXIS = 0, EXTEND = T) with extra cards. */
export function primaryHdu(extra: CardSpec[] = []): Uint8Array {
  return headerBytes([
    ['SIMPLE', true, 'conforms to the FITS Standard 4.0'],
    ['BITPIX', 8, 'no primary data'],
    ['NAXIS', 0, 'no primary data'],
    ['EXTEND', true, 'extensions follow'],
    ...extra,
  ]);
}

/** Most bytes of row data in one chunk: tables larger than a typed array can hold are written as several. */
export const DATA_CHUNK_BYTES = 2 ** 28;

/**
 * A BINTABLE extension: header (mandatory cards, TTYPEn/TFORMn/TUNITn, then
 * `extra`), then the big-endian row data in chunks of whole rows of at most
 * {@link DATA_CHUNK_BYTES} (one row if a row is larger), the last padded to
 * whole blocks with zeros. All columns must have the same number of rows.
 */
export function bintableHdu(columns: ColumnSpec[], extra: CardSpec[] = []): Uint8Array[] {
  const rows = columns.length ? columns[0].values.length / columns[0].repeat : 0;
  for (const c of columns) {
    if (c.values.length !== rows * c.repeat) throw new RangeError(`column ${c.name} has ${c.values.length} values, expected ${rows * c.repeat}`);
  }
  const widths = columns.map((c) => c.repeat * elementBytes(c.type));
  const rowBytes = widths.reduce((a, b) => a + b, 0);
  const cards: CardSpec[] = [
    ['XTENSION', 'BINTABLE', 'binary table extension'],
    ['BITPIX', 8, '8-bit bytes'],
    ['NAXIS', 2, '2-dimensional table'],
    ['NAXIS1', rowBytes, 'bytes per row'],
    ['NAXIS2', rows, 'number of rows'],
    ['PCOUNT', 0, 'no heap'],
    ['GCOUNT', 1, 'one group'],
    ['TFIELDS', columns.length, 'number of columns'],
  ];
  columns.forEach((c, i) => {
    cards.push([`TTYPE${i + 1}`, c.name, 'column name']);
    cards.push([`TFORM${i + 1}`, `${c.repeat}${c.logical ? 'L' : TFORM_CODE[c.type]}`, 'column format']);
    if (c.unit) cards.push([`TUNIT${i + 1}`, c.unit, 'column unit']);
  });
  const out: Uint8Array[] = [headerBytes([...cards, ...extra])];
  const perChunk = Math.max(1, Math.floor(DATA_CHUNK_BYTES / Math.max(1, rowBytes)));
  for (let r0 = 0; r0 < rows || out.length === 1; r0 += perChunk) {
    const r1 = Math.min(rows, r0 + perChunk), bytes = (r1 - r0) * rowBytes;
    const data = new Uint8Array(r1 === rows ? Math.ceil((rows * rowBytes) / BLOCK) * BLOCK - r0 * rowBytes : bytes);
    encodeRows(columns, widths, rowBytes, r0, r1, data);
    out.push(data);
  }
  return out;
}

/** Encodes rows r0..r1 of `columns` big-endian into `data` (row r0 at byte 0). */
function encodeRows(columns: ColumnSpec[], widths: number[], rowBytes: number, r0: number, r1: number, data: Uint8Array): void {
  if (columns.length === 1 && !columns[0].logical) {
    const c = columns[0], v = c.values;
    const part = ArrayBuffer.isView(v) ? (v as unknown as Float64Array).subarray(r0 * c.repeat, r1 * c.repeat)
      : Array.prototype.slice.call(v, r0 * c.repeat, r1 * c.repeat) as number[];
    encodeContiguous(part, c.type, data, 0);
    return;
  }
  const dv = new DataView(data.buffer, data.byteOffset, data.byteLength);
  let off = 0;
  columns.forEach((c, i) => {
    const size = elementBytes(c.type);
    const v = c.values;
    for (let r = r0, k = r0 * c.repeat; r < r1; r++) {
      let p = (r - r0) * rowBytes + off;
      if (c.logical) for (let j = 0; j < c.repeat; j++, p++, k++) dv.setUint8(p, v[k] === 1 ? 84 : v[k] === 0 ? 70 : 0); // 'T', 'F', 0 = null
      else for (let j = 0; j < c.repeat; j++, p += size, k++) writeOne(dv, p, c.type, v[k]);
    }
    off += widths[i];
  });
}
