/**
 * What the streaming reader (mapStream.ts) needs to know from a HEALPix map
 * table's header before its data streams past: Nside, ordering, frame,
 * indexing scheme, the planes (value columns and, for a cube's vector
 * column, the slot in each pixel's values), the FIRSTPIX..LASTPIX range.
 * The rules are those of mapRead.ts (HEALPix FITS convention, Gorski et al.
 * 2005, ApJ 622, 759); only the ENERGIES table may come after the map, so a
 * single vector column of K values is taken as K planes when its row count
 * is the pixel count (checked against the ENERGIES table at the end, see
 * {@link checkPlanesAgainstEnergies}).
 */
import { InputError } from '../core/errors.js';
import type { FrameName } from '../sphere/frames.js';
import { nside2npix, npix2nside, type Ordering } from '../sphere/nside.js';
import { findColumn, tableLayout, type TableColumn, type TableLayout } from './fits/bintable.js';
import type { Hdu } from './fits/hdu.js';
import { readFrame, readNside, readOrdering, readScheme } from './healpixKeywords.js';
import { decodesToFloat32, type PlaneSource } from './mapStreamDecode.js';

/** Thrown when a file is valid but cannot be streamed (the caller reads it whole instead). */
export class StreamNotPossible extends Error {}

/** The streaming plan of a map table (see module doc). */
export interface MapStreamPlan {
  readonly file: string;
  readonly hdu: Hdu;
  readonly layout: TableLayout;
  readonly nside: number;
  readonly npix: number;
  readonly ordering: Ordering;
  readonly frame: FrameName;
  readonly coordsys: string | null;
  readonly scheme: 'IMPLICIT' | 'EXPLICIT';
  readonly pixelCol: TableColumn | null;
  readonly valueCols: TableColumn[];
  /** Planes in file order: every slot of every value column. */
  readonly planes: PlaneSource[];
  /** Pixels per table row (IMPLICIT) and the pixel range the rows cover. */
  readonly pixelsPerRow: number;
  readonly first: number;
  readonly last: number;
  readonly bad: number | undefined;
  readonly notes: string[];
}

/** Plans the streaming of map HDU `hdu` (see module doc); `assumeFrame` supplies a missing frame. */
export function planMapStream(hdu: Hdu, file: string, assumeFrame?: FrameName): MapStreamPlan {
  const h = hdu.header;
  const layout = tableLayout(hdu);
  const ordering = readOrdering(h);
  const fr = readFrame(h);
  let frame = fr.frame;
  if (assumeFrame && assumeFrame !== 'unknown') {
    if (frame !== 'unknown' && frame !== assumeFrame) {
      throw new InputError(`the file says frame ${frame} (COORDSYS = ${fr.coordsys}) but ${assumeFrame} was asked for`,
        { file, keyword: 'COORDSYS' }, 'drop the frame option, or fix COORDSYS');
    }
    frame = assumeFrame;
  }
  const pixelCol = findColumn(layout, 'PIXEL') ?? null;
  const scheme = readScheme(h, pixelCol !== null);
  if (scheme === 'EXPLICIT' && !pixelCol) {
    throw new InputError('INDXSCHM is EXPLICIT but the table has no PIXEL column', { file, keyword: 'INDXSCHM' });
  }
  const notes: string[] = [];
  for (const c of layout.columns) {
    if (c.format.element === null || c.format.code === 'L') notes.push(`column ${c.name} (${c.tform}) is not a map and was not read`);
  }
  const valueCols = layout.columns.filter((c) => c !== pixelCol && c.format.element !== null && c.format.code !== 'L');
  if (valueCols.length === 0) throw new InputError('the HEALPix table has no numeric map column', { file, byteOffset: h.start });
  let nside = readNside(h);
  const repeat = valueCols[0].format.repeat;
  const vector = valueCols.length === 1 && repeat > 1;
  let k = 1, first = 0, last = -1;
  if (scheme === 'EXPLICIT') {
    if (pixelCol!.format.repeat !== 1) throw new InputError('the PIXEL column must hold one index per row', { file, keyword: `TFORM${pixelCol!.index}` });
    if (nside === null) throw new InputError('NSIDE is missing in a partial-sky (EXPLICIT) map', { file, keyword: 'NSIDE', byteOffset: h.start });
    k = vector ? repeat : 1;
    for (const c of valueCols) {
      if (c.format.repeat !== k) {
        throw new InputError(`column ${c.name} holds ${c.format.repeat} values per row in a partial-sky map, expected ${k}`,
          { file, keyword: `TFORM${c.index}`, byteOffset: h.offsetOf(`TFORM${c.index}`) });
      }
    }
  } else {
    if (nside === null) {
      const asVector = vector && !Number.isNaN(npix2nside(layout.rows)), asPixels = !Number.isNaN(npix2nside(layout.rows * repeat));
      if (asVector && asPixels) throw new StreamNotPossible('NSIDE missing and the vector column is ambiguous');
      k = asVector ? repeat : 1;
      nside = npix2nside((layout.rows * repeat) / k);
      if (Number.isNaN(nside)) {
        throw new InputError(`the map has ${layout.rows * repeat} pixels, not 12 Nside^2 for a power-of-two Nside, and NSIDE is missing`,
          { file, keyword: 'NAXIS2', byteOffset: h.offsetOf('NAXIS2') });
      }
    }
    const npix = nside2npix(nside);
    first = h.optInt('FIRSTPIX', 0, npix - 1, 0);
    last = h.optInt('LASTPIX', first, npix - 1, npix - 1);
    if (vector && layout.rows === last - first + 1) k = repeat;
    const count = (layout.rows * repeat) / k;
    if (count !== last - first + 1) {
      throw new InputError(`the map column ${valueCols[0].name} holds ${count} pixels per plane, but NSIDE ${nside} with FIRSTPIX ${first} and LASTPIX ${last} needs ${last - first + 1}`,
        { file, keyword: 'NAXIS2', byteOffset: h.offsetOf('NAXIS2') }, 'the table is truncated, or NSIDE, NAXIS2 or TFORM is wrong');
    }
    for (const c of valueCols) {
      if (layout.rows * c.format.repeat !== (last - first + 1) * k) {
        throw new InputError(`column ${c.name} holds ${layout.rows * c.format.repeat} values, expected ${(last - first + 1) * k}`,
          { file, keyword: `TFORM${c.index}`, byteOffset: h.offsetOf(`TFORM${c.index}`) });
      }
    }
  }
  if (fr.frame === 'unknown') notes.push(`COORDSYS ${fr.coordsys === null ? 'missing' : `"${fr.coordsys}" not recognised`}: frame ${frame}`);
  const planes: PlaneSource[] = [];
  for (const col of valueCols) for (let slot = 0; slot < k; slot++) planes.push({ col, k, slot, float32: decodesToFloat32(col) });
  return { file, hdu, layout, nside, npix: nside2npix(nside), ordering, frame, coordsys: fr.coordsys, scheme, pixelCol, valueCols, planes,
    pixelsPerRow: repeat / k, first, last, bad: h.number('BAD_DATA'), notes };
}

/**
 * Checks the planes against the ENERGIES table found (or not) after the map,
 * with the rule of mapRead.ts: a vector column is a cube only beside an
 * ENERGIES table of as many rows, and a cube has one plane per energy.
 */
export function checkPlanesAgainstEnergies(plan: MapStreamPlan, energies: Float64Array | null): void {
  const k = plan.planes[0].k;
  const expectedK = energies && plan.valueCols.length === 1 && plan.valueCols[0].format.repeat === energies.length ? energies.length : 1;
  if (k !== expectedK) {
    const c = plan.valueCols[0];
    throw new InputError(`the map column ${c.name} holds ${c.format.repeat} values per row` +
      (energies ? `, but the ENERGIES table lists ${energies.length} energies` : ' and there is no ENERGIES table'),
    { file: plan.file, keyword: `TFORM${c.index}` }, 'each energy needs one map column (or one value per pixel in a vector column)');
  }
  if (energies && plan.planes.length !== energies.length) {
    throw new InputError(`the ENERGIES table lists ${energies.length} energies but the map has ${plan.planes.length} planes`,
      { file: plan.file, keyword: 'NAXIS2' }, 'each energy needs one map column (or one value per pixel in a vector column)');
  }
}
