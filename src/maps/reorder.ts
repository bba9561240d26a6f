/**
 * Whole-map reordering between the RING and NESTED schemes (Gorski et al. 2005,
 * ApJ 622, 759, section 4), by the allocation-free index kernels.
 */
import type { Ordering } from '../sphere/nside.js';
import { nside2npix } from '../sphere/nside.js';
import { ringToNest } from '../sphere/pixelIndex.js';
import type { MapArray, SkyMap } from './skyMap.js';
import { newPlaneLike } from './create.js';

/**
 * Reorders one plane: from RING to NESTED when toNested, else NESTED to RING.
 * Writes into `out` (a different array from `plane`).
 */
export function reorderPlane(nside: number, plane: MapArray, toNested: boolean, out: MapArray): void {
  const npix = nside2npix(nside);
  if (toNested) for (let r = 0; r < npix; r++) out[ringToNest(nside, r)] = plane[r];
  else for (let r = 0; r < npix; r++) out[r] = plane[ringToNest(nside, r)];
}

/**
 * The map in the requested ordering: the same object when it is already in it,
 * otherwise a new SkyMap with new planes (values, element type, frame, unit and
 * metadata unchanged).
 *
 * @example
 * reorder(ringMap, 'NESTED').ordering; // 'NESTED'
 */
export function reorder(map: SkyMap, ordering: Ordering): SkyMap {
  if (map.ordering === ordering) return map;
  const npix = nside2npix(map.nside);
  const toNested = ordering === 'NESTED';
  const planes = map.planes.map((p) => {
    const out = newPlaneLike(p, npix);
    reorderPlane(map.nside, p, toNested, out);
    return out;
  });
  return { ...map, ordering, planes };
}
