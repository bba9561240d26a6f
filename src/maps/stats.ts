/**
 * Summary statistics of a map plane, blanks excluded and counted.
 */
import type { MapArray } from './skyMap.js';
import { isBlank } from './blank.js';

/** Minimum, maximum and mean of the non-blank values, with counts. */
export interface PlaneStats {
  /** NaN when no value is valid. */
  min: number;
  max: number;
  /** Mean of the valid values (Neumaier 1974 compensated sum); NaN when none. */
  mean: number;
  validCount: number;
  blankCount: number;
}

/**
 * Statistics of one plane. Blank pixels (BLANK sentinel or NaN) are excluded
 * from min, max and mean and counted in blankCount; infinities count as valid.
 *
 * @example
 * planeStats(new Float64Array([1, 2, NaN])); // { min: 1, max: 2, mean: 1.5, validCount: 2, blankCount: 1 }
 */
export function planeStats(plane: MapArray): PlaneStats {
  let min = Infinity, max = -Infinity, sum = 0, comp = 0, valid = 0, blank = 0;
  const n = plane.length;
  for (let i = 0; i < n; i++) {
    const v = plane[i];
    if (isBlank(v)) { blank++; continue; }
    valid++;
    if (v < min) min = v;
    if (v > max) max = v;
    const t = sum + v;
    if (Math.abs(sum) >= Math.abs(v)) comp += (sum - t) + v;
    else comp += (v - t) + sum;
    sum = t;
  }
  if (valid === 0) return { min: NaN, max: NaN, mean: NaN, validCount: 0, blankCount: blank };
  return { min, max, mean: (sum + comp) / valid, validCount: valid, blankCount: blank };
}
