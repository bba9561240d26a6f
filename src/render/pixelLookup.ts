/**
 * Which map pixel each picture pixel shows: the display directions of a view,
 * rotated into the map's frame (rotationMatrix), through the allocation-free
 * zPhiToRing / ringToNest kernels. Cached per (view, Nside, ordering, rotation),
 * so drawing several planes or maps of one size costs one lookup each.
 */
import type { Ordering } from '../sphere/nside.js';
import { ringToNest, zPhiToRing } from '../sphere/pixelIndex.js';
import type { SkyView } from './skyView.js';

const cache = new Map<string, Int32Array>();
const MAX_ENTRIES = 6;

/**
 * Fills out[k] with the pixel index (in `ordering`) holding direction
 * m * (vx[k], vy[k], vz[k]), or -1 where the view shows no sky. m is a
 * row-major 3x3 rotation (display frame -> map frame).
 */
export function lookupKernel(
  nside: number, nested: boolean, m: ArrayLike<number>,
  vx: Float64Array, vy: Float64Array, vz: Float64Array, out: Int32Array, n: number,
): void {
  const m0 = m[0], m1 = m[1], m2 = m[2], m3 = m[3], m4 = m[4], m5 = m[5], m6 = m[6], m7 = m[7], m8 = m[8];
  for (let k = 0; k < n; k++) {
    const x = vx[k];
    if (x !== x) { out[k] = -1; continue; }
    const y = vy[k], z = vz[k];
    const xr = m0 * x + m1 * y + m2 * z, yr = m3 * x + m4 * y + m5 * z, zr = m6 * x + m7 * y + m8 * z;
    const r = Math.sqrt(xr * xr + yr * yr + zr * zr);
    const ring = zPhiToRing(nside, zr / r, Math.sqrt(xr * xr + yr * yr) / r, Math.atan2(yr, xr));
    out[k] = nested ? ringToNest(nside, ring) : ring;
  }
}

/** The cached lookup of a view for a map geometry (see {@link lookupKernel}). */
export function pixelLookup(view: SkyView, nside: number, ordering: Ordering, m: ArrayLike<number>): Int32Array {
  const key = `${view.key}|${nside}|${ordering}|${Array.prototype.join.call(m, ',')}`;
  let hit = cache.get(key);
  if (hit) { cache.delete(key); cache.set(key, hit); return hit; }
  const n = view.width * view.height;
  hit = new Int32Array(n);
  lookupKernel(nside, ordering === 'NESTED', m, view.vx, view.vy, view.vz, hit, n);
  cache.set(key, hit);
  while (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value as string);
  return hit;
}
