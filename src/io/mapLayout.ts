/**
 * Energy cubes in HEALPix FITS files. skyspan WRITES this layout:
 *
 * - HDU 1, the map table (PIXTYPE = 'HEALPIX', ...), holds one column per
 *   energy plane, named PLANE1, PLANE2, ... in order of the energies (with
 *   a PIXEL column first in partial-sky files); the keyword CUBECOL gives the
 *   cube's name.
 * - HDU 2, a BINTABLE with EXTNAME = 'ENERGIES', holds one row per plane:
 *   column ENERGY (TFORM D, TUNIT 'GeV').
 *
 * skyspan READS that layout and also the other common one: a single map
 * column with one vector of K values per pixel (TFORM KE or KD, NAXIS2 = the
 * pixel count) beside an ENERGIES table of K rows. The energy column may be
 * named ENERGY, ENERGIES or be the table's first numeric column, in eV, keV,
 * MeV, GeV, TeV or PeV (TUNIT required: MeV and GeV are both common, and
 * guessing would silently scale the spectrum).
 */
import { InputError } from '../core/errors.js';
import { findColumn, readColumn, tableLayout } from './fits/bintable.js';
import type { Hdu } from './fits/hdu.js';
import { energyUnitToGeV } from './healpixKeywords.js';

/** EXTNAME of the energies table. */
export const ENERGIES_EXTNAME = 'ENERGIES';

/** Column name of the energy in the energies table written by skyspan. */
export const ENERGY_COLUMN = 'ENERGY';

/** Name of the k-th plane column (k from 0) in the layout skyspan writes. */
export function planeColumnName(k: number): string {
  return `PLANE${k + 1}`;
}

/** Reads the energies (GeV) of the file's ENERGIES table, or null when there is none. */
export function readEnergies(bytes: Uint8Array, hdus: Hdu[], mapHdu: Hdu, file: string): Float64Array | null {
  const hdu = hdus.find((x) => x !== mapHdu && x.kind === 'bintable' && x.name.toUpperCase() === ENERGIES_EXTNAME);
  if (!hdu) return null;
  const layout = tableLayout(hdu);
  const col = findColumn(layout, ENERGY_COLUMN) ?? findColumn(layout, 'ENERGIES')
    ?? layout.columns.find((c) => c.format.element !== null && c.format.code !== 'L');
  if (!col) throw new InputError('the ENERGIES table has no numeric column', { file, byteOffset: hdu.header.start });
  const factor = energyUnitToGeV(col.unit);
  if (Number.isNaN(factor)) {
    throw new InputError(`the energy column ${col.name} has unit "${col.unit}", expected eV, keV, MeV, GeV, TeV or PeV`,
      { file, keyword: `TUNIT${col.index}`, byteOffset: hdu.header.offsetOf(`TUNIT${col.index}`) },
      'set TUNIT of the energy column');
  }
  const raw = readColumn(bytes, layout, col);
  const out = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i++) {
    const e = raw[i] * factor;
    if (!(e > 0 && e < Infinity)) {
      throw new InputError(`energy ${raw[i]} ${col.unit} is not a positive finite number`, { file, row: i + 1, keyword: col.name });
    }
    out[i] = e;
  }
  return out;
}
