/**
 * A plain description of each HDU of a FITS file (kind, name, size, axes,
 * columns, notes), used by `skyspan info` and returned with every map read.
 */
import { tableLayout } from './fits/bintable.js';
import type { Hdu, HduKind } from './fits/hdu.js';

/** One column as described to the user. */
export interface ColumnSummary {
  readonly name: string;
  readonly format: string;
  readonly unit: string;
  readonly note?: string;
}

/** One HDU as described to the user. */
export interface HduSummary {
  readonly index: number;
  readonly kind: HduKind;
  readonly name: string;
  readonly byteOffset: number;
  readonly dataBytes: number;
  /** NAXISn values (for a table: row bytes and rows). */
  readonly dims: number[];
  readonly rows?: number;
  readonly columns?: ColumnSummary[];
  /** Set on the HDU holding a HEALPix map. */
  healpix?: { nside: number; ordering: string; frame: string; scheme: 'IMPLICIT' | 'EXPLICIT'; coordsys: string | null };
  readonly notes: string[];
}

/** Summarises one HDU; BINTABLE columns are listed (a malformed table throws InputError). */
export function summariseHdu(hdu: Hdu): HduSummary {
  const base = {
    index: hdu.index, kind: hdu.kind, name: hdu.name, byteOffset: hdu.header.start,
    dataBytes: hdu.dataBytes, dims: hdu.dims, notes: [...hdu.notes],
  };
  if (hdu.kind === 'bintable') {
    const layout = tableLayout(hdu);
    const columns = layout.columns.map((c) => ({
      name: c.name, format: c.tform, unit: c.unit, ...(c.format.skipNote ? { note: c.format.skipNote } : {}),
    }));
    return { ...base, rows: layout.rows, columns };
  }
  if (hdu.kind === 'table') {
    const tfields = hdu.header.optInt('TFIELDS', 0, 999, 0);
    const columns: ColumnSummary[] = [];
    for (let i = 1; i <= tfields; i++) {
      columns.push({ name: hdu.header.string(`TTYPE${i}`, `COL${i}`) ?? '', format: hdu.header.string(`TFORM${i}`, '') ?? '',
        unit: hdu.header.string(`TUNIT${i}`, '') ?? '', note: 'ASCII table column (not read)' });
    }
    return { ...base, rows: hdu.dims[1] ?? 0, columns };
  }
  return base;
}
