/**
 * Blank pixels. The HEALPix convention marks a pixel without data with
 * -1.6375e30 (healpy's UNSEEN; files also state it as BAD_DATA); NaN means the
 * same. Everywhere in skyspan both are excluded from means and sums, and counted.
 */
import { BLANK } from './skyMap.js';
import type { MapArray } from './skyMap.js';

/** Distance from {@link BLANK} within which a value is blank (1e-5 relative). */
export const BLANK_TOL = 1e-5 * Math.abs(BLANK);

/**
 * True when v is NaN or within 1e-5 relative of {@link BLANK} (the tolerance
 * absorbs the float32 rounding of the sentinel, common practice, no source).
 */
export function isBlank(v: number): boolean {
  return v !== v || Math.abs(v - BLANK) <= BLANK_TOL;
}

/** Number of blank values in a plane. */
export function countBlanks(plane: ArrayLike<number>): number {
  let n = 0;
  for (let i = 0; i < plane.length; i++) {
    const v = plane[i];
    if (v !== v || Math.abs(v - BLANK) <= BLANK_TOL) n++;
  }
  return n;
}
