/**
 * Bulk, allocation-free kernels over many pixels or directions, for the hot
 * paths (reframing, rendering, region masks). Each takes preallocated typed
 * arrays and a count; none allocates per element.
 */
import type { Ordering } from './nside.js';
import { ringTable } from './ringTable.js';
import { ringToNest, zPhiToRing } from './pixelIndex.js';

/** Any array of pixel indices: Uint32Array holds every index up to Nside 8192. */
export type IndexArray = Uint32Array | Float64Array | Int32Array;

/**
 * Fills theta (colatitude, rad) and phi (rad) of every pixel centre, indexed by
 * pixel number in the given ordering. Arrays must hold 12 Nside^2 values.
 */
export function pixelCentres(nside: number, ordering: Ordering, theta: Float64Array, phi: Float64Array): void {
  const t = ringTable(nside);
  const nested = ordering === 'NESTED';
  for (let r = 0; r < t.count; r++) {
    const th = t.theta[r], p0 = t.phi0[r], dp = t.dphi[r], first = t.first[r], n = t.length[r];
    for (let j = 0; j < n; j++) {
      const ring = first + j;
      const k = nested ? ringToNest(nside, ring) : ring;
      theta[k] = th;
      phi[k] = p0 + j * dp;
    }
  }
}

/**
 * Pixel index, in the given ordering, of each of n directions (theta, phi in
 * rad). The batched angle-to-pixel kernel.
 */
export function anglesToPixels(
  nside: number, ordering: Ordering, theta: ArrayLike<number>, phi: ArrayLike<number>, out: IndexArray, n = out.length,
): void {
  const nested = ordering === 'NESTED';
  for (let i = 0; i < n; i++) {
    const th = theta[i];
    const ring = zPhiToRing(nside, Math.cos(th), Math.sin(th), phi[i]);
    out[i] = nested ? ringToNest(nside, ring) : ring;
  }
}

