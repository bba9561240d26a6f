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
  const st = newStatsState();
  statsBlock(plane, 0, plane.length, st);
  return finishStats(st);
}

/** The running state of {@link statsBlock}: min, max, sum, compensation, valid count, blank count. */
export function newStatsState(): Float64Array {
  return Float64Array.of(Infinity, -Infinity, 0, 0, 0, 0);
}

/**
 * Adds plane[a..b) to the state `st` (see {@link newStatsState}); a plane
 * given in consecutive pieces gives exactly the statistics of one call.
 */
export function statsBlock(plane: MapArray, a: number, b: number, st: Float64Array): void {
  let min = st[0], max = st[1], sum = st[2], comp = st[3], valid = st[4], blank = st[5];
  for (let i = a; i < b; i++) {
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
  st[0] = min; st[1] = max; st[2] = sum; st[3] = comp; st[4] = valid; st[5] = blank;
}

/** The statistics of a finished state (see {@link planeStats}). */
export function finishStats(st: Float64Array): PlaneStats {
  const [min, max, sum, comp, valid, blank] = st;
  if (valid === 0) return { min: NaN, max: NaN, mean: NaN, validCount: 0, blankCount: blank };
  return { min, max, mean: (sum + comp) / valid, validCount: valid, blankCount: blank };
}
