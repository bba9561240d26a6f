/**
 * Gamma-ray points from a file of any supported kind, chosen by the file's
 * extension: `.ecsv` an ECSV flux-point table, `.fits` / `.fit` / `.fts`
 * (optionally `.gz`) a FITS flux-point table, anything else skyspan's CSV
 * points (physics/points.ts).
 */
import type { SpectrumPoints } from '../points.js';
import { readSpectrumPoints } from '../points.js';
import { readFluxPointsEcsv } from './ecsv.js';
import { readFluxPointsFits } from './fits.js';

/** Which reader a path goes to. */
export function pointsFileKind(path: string): 'ecsv' | 'fits' | 'csv' {
  const p = path.toLowerCase();
  if (p.endsWith('.ecsv')) return 'ecsv';
  if (/\.(fits|fit|fts)(\.gz)?$/.test(p)) return 'fits';
  return 'csv';
}

/**
 * Reads gamma-ray points in internal units (GeV; GeV^-1 cm^-2 s^-1 sr^-1)
 * from CSV, ECSV or FITS, by extension (see module comment).
 * @example readGammaPoints('points.ecsv').energyGeV
 */
export function readGammaPoints(path: string): SpectrumPoints {
  const kind = pointsFileKind(path);
  return kind === 'ecsv' ? readFluxPointsEcsv(path) : kind === 'fits' ? readFluxPointsFits(path) : readSpectrumPoints(path);
}
