/**
 * BINTABLE extensions (Pence et al. 2010, A&A 524, A42, section 7.3): the
 * column descriptions (TTYPEn, TFORMn, TUNITn, TSCALn, TZEROn, TNULLn) and
 * decoding of one column into a typed array, scaled as
 * physical = TZEROn + TSCALn * stored (section 7.3.2, eq. 7) with TNULLn
 * values of integer columns becoming NaN.
 */
import { InputError } from '../../core/errors.js';
import { decodeContiguous, decodeStrided, type DecodedArray } from './decode.js';
import type { Hdu } from './hdu.js';
import { parseTform, type ColumnFormat } from './tform.js';

/** One column of a binary table. */
export interface TableColumn {
  readonly index: number;
  readonly name: string;
  readonly tform: string;
  readonly format: ColumnFormat;
  readonly unit: string;
  readonly scale: number;
  readonly zero: number;
  readonly tnull: number | undefined;
  /** Byte offset of the field within a row. */
  readonly offset: number;
}

/** A binary table's layout. */
export interface TableLayout {
  readonly hdu: Hdu;
  readonly rows: number;
  readonly rowBytes: number;
  readonly columns: TableColumn[];
}

/** Reads and checks the column descriptions of a BINTABLE HDU. */
export function tableLayout(hdu: Hdu): TableLayout {
  const h = hdu.header;
  const file = h.file;
  if (hdu.dims.length !== 2 || hdu.bitpix !== 8) {
    throw new InputError(`BINTABLE must have BITPIX = 8 and NAXIS = 2, found ${hdu.bitpix} and ${hdu.dims.length}`,
      { file, keyword: 'NAXIS', byteOffset: h.offsetOf('NAXIS') });
  }
  const [rowBytes, rows] = hdu.dims;
  const tfields = h.int('TFIELDS', 0, 999);
  const columns: TableColumn[] = [];
  let offset = 0;
  for (let i = 1; i <= tfields; i++) {
    const kw = `TFORM${i}`;
    const tform = h.string(kw);
    if (tform === undefined) {
      throw new InputError('required keyword is missing', { file, keyword: kw, byteOffset: h.start }, `TFIELDS is ${tfields}`);
    }
    const format = parseTform(tform);
    if (!format) {
      throw new InputError(`unknown column format "${tform}"`, { file, keyword: kw, byteOffset: h.offsetOf(kw) },
        'expected rT with T one of L X B I J K A E D C M P Q');
    }
    const scale = h.number(`TSCAL${i}`, 1)!;
    const zero = h.number(`TZERO${i}`, 0)!;
    const tnullRaw = h.get(`TNULL${i}`);
    const tnull = typeof tnullRaw === 'number' ? tnullRaw : undefined;
    const name = h.string(`TTYPE${i}`, `COL${i}`) ?? `COL${i}`;
    const unit = h.string(`TUNIT${i}`, '') ?? '';
    columns.push({ index: i, name, tform, format, unit, scale, zero, tnull, offset });
    offset += format.width;
  }
  if (offset !== rowBytes) {
    throw new InputError(`the columns take ${offset} bytes per row but NAXIS1 is ${rowBytes}`,
      { file, keyword: 'NAXIS1', byteOffset: h.offsetOf('NAXIS1') }, 'the TFORMn or NAXIS1 values are wrong');
  }
  return { hdu, rows, rowBytes, columns };
}

/** Finds a column by name (case-insensitive) or 1-based number. */
export function findColumn(layout: TableLayout, which: string | number): TableColumn | undefined {
  if (typeof which === 'number') return layout.columns[which - 1];
  const up = which.toUpperCase();
  return layout.columns.find((c) => c.name.toUpperCase() === up);
}

/**
 * Decodes a numeric column, rows x repeat values in row order. With
 * `inPlace` the file's bytes may be swapped where they lie (only when the
 * table has this one column), so each column must be read once.
 * Scaled or nulled columns come back as Float64Array.
 */
export function readColumn(bytes: Uint8Array, layout: TableLayout, col: TableColumn, inPlace = false): DecodedArray {
  const { hdu, rows, rowBytes } = layout;
  if (col.format.element === null) {
    throw new InputError(`column ${col.name} has format ${col.tform}, which skyspan does not read as numbers`,
      { file: hdu.header.file, keyword: `TFORM${col.index}` });
  }
  const t = col.format.element;
  const repeat = col.format.repeat;
  const contiguous = rowBytes === col.format.width;
  const raw = contiguous
    ? decodeContiguous(bytes, hdu.dataStart, rows * repeat, t, inPlace)
    : decodeStrided(bytes, hdu.dataStart, rows, rowBytes, col.offset, repeat, t);
  const isInt = t !== 'float32' && t !== 'float64';
  const nulls = isInt && col.tnull !== undefined;
  if (col.format.code === 'L') {
    // Logical: 'T' (84) true, 'F' (70) false, 0 undefined (section 7.3.3).
    const out = new Float64Array(raw.length);
    for (let i = 0; i < raw.length; i++) out[i] = raw[i] === 84 ? 1 : raw[i] === 70 ? 0 : NaN;
    return out;
  }
  if (col.scale === 1 && col.zero === 0 && !nulls) return raw;
  const out = new Float64Array(raw.length);
  const s = col.scale, z = col.zero, tn = col.tnull ?? NaN;
  for (let i = 0; i < raw.length; i++) {
    const v = raw[i];
    out[i] = nulls && v === tn ? NaN : z + s * v;
  }
  return out;
}

/** Decodes a character column (TFORM rA) into trimmed strings, one per row. */
export function readTextColumn(bytes: Uint8Array, layout: TableLayout, col: TableColumn): string[] {
  const out: string[] = [];
  const { hdu, rows, rowBytes } = layout;
  for (let r = 0; r < rows; r++) {
    const p = hdu.dataStart + r * rowBytes + col.offset;
    let s = '';
    for (let j = 0; j < col.format.repeat; j++) {
      const c = bytes[p + j];
      if (c === 0) break;
      s += String.fromCharCode(c);
    }
    out.push(s.trimEnd());
  }
  return out;
}
