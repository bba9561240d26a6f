/**
 * Flux points (table.ts) as a FITS BINTABLE (io/fits): read from the first
 * binary table that has an e_ref or e_min column, units from TUNITn,
 * SED_TYPE and UL_CONF from that table's header (or the primary header);
 * written as an empty primary HDU and one BINTABLE 'FLUXPOINTS' with float64
 * columns and is_ul as a logical column.
 */
import { InputError } from '../../core/errors.js';
import { bintableHdu, primaryHdu, type CardSpec } from '../../io/fits/writer.js';
import { loadFitsBytes } from '../../io/fits/source.js';
import { walkHdus } from '../../io/fits/hdu.js';
import { readColumn, tableLayout } from '../../io/fits/bintable.js';
import type { SpectrumPoints } from '../points.js';
import { pointsFromTable, tableFromPoints, type FluxTable, type FluxTableOptions } from './table.js';

/** The numeric columns and header metadata of the flux-point table in FITS bytes. */
export function fitsFluxTable(bytes: Uint8Array, file: string): FluxTable {
  const hdus = walkHdus(bytes, file);
  for (const hdu of hdus) {
    if (hdu.kind !== 'bintable') continue;
    const layout = tableLayout(hdu);
    const names = layout.columns.map((c) => c.name.toLowerCase());
    if (!names.includes('e_ref') && !names.includes('e_min')) continue;
    const columns = layout.columns.filter((c) => c.format.element !== null && c.format.repeat === 1)
      .map((c) => ({ name: c.name, unit: c.unit, values: Float64Array.from(readColumn(bytes, layout, c)) }));
    const meta: Record<string, unknown> = {};
    for (const key of ['SED_TYPE', 'UL_CONF']) {
      const v = hdu.header.has(key) ? hdu.header.get(key) : hdus[0].header.get(key);
      if (v !== undefined) meta[key] = typeof v === 'string' ? v.trim() : v;
    }
    return { file, columns, meta, rowAt: (i) => ({ file, row: i + 1, byteOffset: hdu.dataStart + i * layout.rowBytes }) };
  }
  throw new InputError('has no binary table with an e_ref or e_min column', { file },
    'expected a flux-point table (columns e_ref or e_min/e_max, dnde or e2dnde)');
}

/** Reads flux points from a FITS file (plain or gzip). */
export function readFluxPointsFits(path: string): SpectrumPoints {
  return pointsFromTable(fitsFluxTable(loadFitsBytes(path), path));
}

/** FITS bytes of a flux-point table for `points` (internal units). */
export function formatFluxPointsFits(points: SpectrumPoints, options: FluxTableOptions = {}): Uint8Array {
  const { columns, meta } = tableFromPoints(points, options);
  const cards: CardSpec[] = [['EXTNAME', 'FLUXPOINTS', 'flux points']];
  for (const [k, v] of Object.entries(meta)) cards.push([k, v]);
  const [head, data] = bintableHdu(columns.map((c) => ({ name: c.name, type: c.bool ? 'uint8' : 'float64', repeat: 1,
    ...(c.unit ? { unit: c.unit } : {}), values: c.values, ...(c.bool ? { logical: true } : {}) })), cards);
  const primary = primaryHdu();
  const out = new Uint8Array(primary.length + head.length + data.length);
  out.set(primary, 0); out.set(head, primary.length); out.set(data, primary.length + head.length);
  return out;
}
