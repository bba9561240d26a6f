/**
 * Named tolerances, clamped inverse trigonometry, angular distance and
 * compensated summation: the numerical basics every layer shares.
 */

/** Tolerance for geometric tests (radians or unit-vector components). */
export const EPSILON_GEOM = 1e-12;
/** Tolerance for convergence of iterative or refined computations (relative). */
export const EPSILON_CONVERGE = 1e-9;

/** pi. */
export const PI = Math.PI;
/** 2 pi. */
export const TWO_PI = 2 * Math.PI;
/** pi / 2. */
export const HALF_PI = Math.PI / 2;

/** asin with its argument clamped to [-1, 1] so that rounding never gives NaN. */
export function asinClamped(x: number): number {
  return Math.asin(x > 1 ? 1 : x < -1 ? -1 : x);
}

/** acos with its argument clamped to [-1, 1] so that rounding never gives NaN. */
export function acosClamped(x: number): number {
  return Math.acos(x > 1 ? 1 : x < -1 ? -1 : x);
}

/**
 * Angular distance between two directions given as (longitude, latitude) in
 * radians, by the Vincenty form of the haversine (atan2-based, accurate at all
 * separations; common practice, no source).
 */
export function angularDistance(lon1: number, lat1: number, lon2: number, lat2: number): number {
  const dl = lon2 - lon1;
  const s1 = Math.sin(lat1), c1 = Math.cos(lat1);
  const s2 = Math.sin(lat2), c2 = Math.cos(lat2);
  const sdl = Math.sin(dl), cdl = Math.cos(dl);
  const a = c2 * sdl;
  const b = c1 * s2 - s1 * c2 * cdl;
  return Math.atan2(Math.sqrt(a * a + b * b), s1 * s2 + c1 * c2 * cdl);
}

/** Wraps an angle in radians into [0, 2 pi). */
export function wrapTwoPi(a: number): number {
  const r = a % TWO_PI;
  return r < 0 ? r + TWO_PI : r === TWO_PI ? 0 : r + 0; // + 0 turns -0 into 0
}

/**
 * Neumaier's compensated sum (Neumaier 1974, ZAMM 54, 39): an accumulator whose
 * error does not grow with the number of terms. Used for sky integrals and
 * line-of-sight sums. Not for hot per-pixel loops that need inlining: there,
 * write the two-variable update inline (see {@link kahanSum}).
 */
export class CompensatedSum {
  private sum = 0;
  private comp = 0;
  add(x: number): void {
    const t = this.sum + x;
    if (Math.abs(this.sum) >= Math.abs(x)) this.comp += (this.sum - t) + x;
    else this.comp += (x - t) + this.sum;
    this.sum = t;
  }
  value(): number {
    return this.sum + this.comp;
  }
}

/** Compensated sum of a typed array (Neumaier 1974), skipping nothing. */
export function kahanSum(x: ArrayLike<number>, n = x.length): number {
  let sum = 0, comp = 0;
  for (let i = 0; i < n; i++) {
    const v = x[i];
    const t = sum + v;
    if (Math.abs(sum) >= Math.abs(v)) comp += (sum - t) + v;
    else comp += (v - t) + sum;
    sum = t;
  }
  return sum + comp;
}
