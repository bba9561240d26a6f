/**
 * Loads the healpy reference document printed by scripts/healpy_reference.py
 * (Debian's python3-healpy), once per test file.
 */
import { requirePython, runPython } from '../helpers/python.js';

export interface HealpyReference {
  healpy: string;
  pix2ang: Record<string, { theta: number[]; phi: number[]; ring2nest: number[] }>;
  directions: { theta: number[]; phi: number[] };
  ang2pix: Record<string, { ring: number[]; nest: number[] }>;
  interp: Record<string, { pix: number[][]; w: number[][] }>;
  udgrade: Record<string, number[]> & { nside: number };
  rotate: { nside: number; input: number[]; output: number[] };
  spot: {
    pix2ang_4_0: number[]; ang2pix_4_equator_phi0: number[]; pixarea_1024: number; resol_1024_arcmin: number;
    interp_4_001_03: [number[], number[]]; unseen: number;
  };
}

let cached: HealpyReference | null | undefined;

/** The reference, or null when Python is missing outside CI (requirePython throws under CI=true). */
export function healpyReference(): HealpyReference | null {
  if (cached === undefined) {
    cached = requirePython() ? (JSON.parse(runPython('scripts/healpy_reference.py')) as HealpyReference) : null;
  }
  return cached;
}
