/**
 * Flux points (table.ts) as ECSV text (io/ecsv.ts): read with the units of
 * the `datatype` list and `SED_TYPE` / `UL_CONF` from `meta`; written with
 * float64 columns, is_ul as bool, and the metadata in `meta`.
 */
import { readFileSync } from 'node:fs';
import { InputError } from '../../core/errors.js';
import { formatEcsv, parseEcsv, type EcsvTable } from '../../io/ecsv.js';
import type { SpectrumPoints } from '../points.js';
import { pointsFromTable, tableFromPoints, type FluxTable, type FluxTableOptions } from './table.js';

/** The numeric columns of parsed ECSV as a flux table (string columns are left out); rows are named by their line in the file. */
export function ecsvFluxTable(table: EcsvTable, file: string): FluxTable {
  const rowLines = table.rowLines;
  const columns = table.columns.filter((c) => c.values instanceof Float64Array)
    .map((c) => ({ name: c.name, unit: c.unit ?? '', values: c.values as Float64Array }));
  return { file, columns, meta: table.meta, rowAt: (i) => (rowLines ? { file, row: rowLines[i] } : { file, row: i + 1 }) };
}

/** Parses flux points from ECSV text; `file` names the source in messages (rows are 1-based line numbers). */
export function parseFluxPointsEcsv(text: string, file = '<text>'): SpectrumPoints {
  return pointsFromTable(ecsvFluxTable(parseEcsv(text, file), file));
}

/** Reads flux points from an ECSV file. */
export function readFluxPointsEcsv(path: string): SpectrumPoints {
  let text: string;
  try { text = readFileSync(path, 'utf8'); } catch (e) {
    throw new InputError(`cannot read: ${(e as NodeJS.ErrnoException).code ?? String(e)}`, { file: path });
  }
  return parseFluxPointsEcsv(text, path);
}

/** Formats points (internal units) as an ECSV flux-point table. */
export function formatFluxPointsEcsv(points: SpectrumPoints, options: FluxTableOptions = {}): string {
  const { columns, meta } = tableFromPoints(points, options);
  return formatEcsv({
    columns: columns.map((c) => ({ name: c.name, datatype: c.bool ? 'bool' : 'float64', ...(c.unit ? { unit: c.unit } : {}), values: c.values })),
    meta,
  });
}
