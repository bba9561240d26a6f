/**
 * Summary statistics of a map plane, blanks excluded and counted.
 */
import type { MapArray } from './skyMap.js';
import { BLANK_TOL } from './blank.js';
import { BLANK } from './skyMap.js';

/** Minimum, maximum and mean of the non-blank values, with counts. */
export interface PlaneStats {
  /** NaN when no value is valid. */
  min: number;
  max: number;
  /** Mean of the valid values (Neumaier 1974 compensated sum); NaN when none. */
  mean: number;
  validCount: number;
  blankCount: number;
  /** Valid values that are not zero (for a mask: the pixels it covers at all). */
  nonZeroCount: number;
}

/** Pixels per call of the kernel: short calls get the kernel optimised early (one long loop waits for on-stack replacement). */
const BLOCK = 16384;

/**
 * Kernel: folds plane[from..to) into st = [min, max, sum, compensation, ...,
 * non-zero count at 6] (Neumaier 1974, ZAMM 54, 39) and returns the number of valid values.
 */
function foldBlock(plane: MapArray, from: number, to: number, st: Float64Array): number {
  let min = st[0], max = st[1], sum = st[2], comp = st[3], nonZero = st[6], valid = 0;
  for (let i = from; i < to; i++) {
    const v = plane[i];
    if (v !== v || Math.abs(v - BLANK) <= BLANK_TOL) continue; // isBlank, inlined
    valid++;
    if (v !== 0) nonZero++;
    if (v < min) min = v;
    if (v > max) max = v;
    const t = sum + v;
    comp += Math.abs(sum) >= Math.abs(v) ? (sum - t) + v : (v - t) + sum;
    sum = t;
  }
  st[0] = min; st[1] = max; st[2] = sum; st[3] = comp; st[6] = nonZero;
  return valid;
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

/** The running state of {@link statsBlock}: min, max, sum, compensation, valid count, blank count, non-zero count. */
export function newStatsState(): Float64Array {
  return Float64Array.of(Infinity, -Infinity, 0, 0, 0, 0, 0);
}

/**
 * Adds plane[a..b) to the state `st` (see {@link newStatsState}) in blocks of
 * the kernel; a plane given in consecutive pieces gives exactly the
 * statistics of one call.
 */
export function statsBlock(plane: MapArray, a: number, b: number, st: Float64Array): void {
  let valid = 0;
  for (let i = a; i < b; i += BLOCK) valid += foldBlock(plane, i, Math.min(b, i + BLOCK), st);
  st[4] += valid;
  st[5] += (b - a) - valid;
}

/** The statistics of a finished state (see {@link planeStats}). */
export function finishStats(st: Float64Array): PlaneStats {
  const valid = st[4], blank = st[5];
  if (valid === 0) return { min: NaN, max: NaN, mean: NaN, validCount: 0, blankCount: blank, nonZeroCount: 0 };
  return { min: st[0], max: st[1], mean: (st[2] + st[3]) / valid, validCount: valid, blankCount: blank, nonZeroCount: st[6] };
}
