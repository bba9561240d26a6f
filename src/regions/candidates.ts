/**
 * Per ring of the template, the longitudes (phi intervals) where a compiled
 * region can hold pixel centres: exact for shapes drawn in the template frame
 * (latitude limits, longitude ranges, discs computed analytically per ring);
 * latitude limits in the other frame are annuli around that frame's pole and
 * are computed the same way; only longitude ranges in the other frame give the
 * whole ring (their pixels are then tested one by one). With a margin m > 0 every interval is widened to hold all points
 * within angular distance m of the region, so that pixels cut by an edge are
 * found too.
 *
 * Intervals are flat number arrays [s0, e0, s1, e1, ...] in [0, 2 pi], sorted
 * and disjoint. One small array per ring and node: nothing per pixel.
 * "Exact" means exact away from the interval ends: the caller decides the
 * pixels at each end by the per-pixel test, so centres lying on an edge are
 * classified the same way whichever path finds them.
 */
import { HALF_PI, TWO_PI } from '../core/math.js';
import { Op, type PNode } from './program.js';

/** Candidate intervals of one node on one ring. */
export interface Candidates {
  iv: number[];
  /** True when every centre inside the intervals is in the region (only with m = 0). */
  exact: boolean;
}

/** The whole ring. */
export const FULL = (): number[] => [0, TWO_PI];

/** Normalises [c - w, c + w] into [0, 2 pi] pieces (full ring when w >= pi). */
export function arc(c: number, w: number): number[] {
  if (w >= Math.PI) return FULL();
  let s = (c - w) % TWO_PI;
  if (s < 0) s += TWO_PI;
  const e = s + 2 * w;
  return e <= TWO_PI ? [s, e] : [0, e - TWO_PI, s, TWO_PI];
}

/** Union of two interval lists. */
export function unite(a: number[], b: number[]): number[] {
  const all: number[] = [];
  let i = 0, j = 0;
  while (i < a.length || j < b.length) {
    if (j >= b.length || (i < a.length && a[i] <= b[j])) { all.push(a[i], a[i + 1]); i += 2; } else { all.push(b[j], b[j + 1]); j += 2; }
  }
  const out: number[] = [];
  for (let k = 0; k < all.length; k += 2) {
    const n = out.length;
    if (n > 0 && all[k] <= out[n - 1]) { if (all[k + 1] > out[n - 1]) out[n - 1] = all[k + 1]; } else out.push(all[k], all[k + 1]);
  }
  return out;
}

/** Intersection of two interval lists. */
export function intersect(a: number[], b: number[]): number[] {
  const out: number[] = [];
  let i = 0, j = 0;
  while (i < a.length && j < b.length) {
    const s = Math.max(a[i], b[j]), e = Math.min(a[i + 1], b[j + 1]);
    if (s <= e) out.push(s, e);
    if (a[i + 1] < b[j + 1]) i += 2; else j += 2;
  }
  return out;
}

/** Complement within [0, 2 pi] (boundaries kept, which is harmless for candidates). */
export function complement(a: number[]): number[] {
  const out: number[] = [];
  let prev = 0;
  for (let k = 0; k < a.length; k += 2) {
    if (a[k] > prev) out.push(prev, a[k]);
    prev = a[k + 1];
  }
  if (prev < TWO_PI) out.push(prev, TWO_PI);
  return out;
}

/**
 * Longitudes on the ring at colatitude theta (cos z, sin st) within angular
 * distance R of the direction with colatitude thc and unit vector
 * (cx, cy, cz): cos d = z cz + st sin(thc) cos(dphi) >= cos R.
 */
export function discArc(z: number, st: number, cx: number, cy: number, cz: number, R: number): number[] {
  if (R >= Math.PI) return FULL();
  if (R <= 0) return [];
  const sc = Math.sqrt(cx * cx + cy * cy);
  const den = st * sc;
  const cr = Math.cos(R);
  if (!(den > 1e-15)) return z * cz + den >= cr ? FULL() : [];
  const c = (cr - z * cz) / den;
  if (c <= -1) return FULL();
  if (c > 1) return [];
  return arc(Math.atan2(cy, cx), Math.acos(c));
}

/** Longitudes on the ring within angular distance [r1, r2] of the unit vector c (r1 <= 0: a disc). */
export function annulus(z: number, st: number, c: Float64Array, r1: number, r2: number): number[] {
  const outer = discArc(z, st, c[0], c[1], c[2], r2);
  if (r1 <= 0 || outer.length === 0) return outer;
  return intersect(outer, complement(discArc(z, st, c[0], c[1], c[2], r1)));
}

/** Rings closer than this (rad) to a latitude limit are left to the per-pixel test. */
const RING_EDGE = 1e-12;

/**
 * Candidates of a latitude range [lo, hi] on a ring at latitude lat, margin m:
 * none, the full ring (exact when m = 0), or the full ring to be tested pixel
 * by pixel when the ring lies on a limit (so that the per-pixel test alone
 * decides centres on an edge).
 */
function latRange(lat: number, lo: number, hi: number, m: number): Candidates {
  if (!(lat >= lo - m - RING_EDGE && lat <= hi + m + RING_EDGE)) return { iv: [], exact: true };
  const onEdge = Math.abs(lat - lo) <= RING_EDGE || Math.abs(lat - hi) <= RING_EDGE;
  return { iv: FULL(), exact: m === 0 && !onEdge };
}

/**
 * Candidate longitudes of node n on the ring with cos(colatitude) z, sin st
 * and latitude lat (rad), widened by margin m (rad).
 */
export function candidates(n: PNode, z: number, st: number, lat: number, m: number): Candidates {
  const exact0 = m === 0;
  switch (n.op) {
    case Op.Sky: return { iv: FULL(), exact: true };
    case Op.Lat:
      if (n.side !== 0) {
        // latitude in the other frame: lo <= lat <= hi is an annulus around that frame's pole
        return { iv: annulus(z, st, n.centres, HALF_PI - n.b - m, HALF_PI - n.a + m), exact: exact0 };
      }
      return latRange(lat, n.a, n.b, m);
    case Op.AbsLat:
      if (n.side !== 0) {
        const north = annulus(z, st, n.centres, HALF_PI - n.b - m, HALF_PI - n.a + m);
        return { iv: unite(north, annulus(z, st, n.centres, HALF_PI + n.a - m, HALF_PI + n.b + m)), exact: exact0 };
      }
      return latRange(Math.abs(lat), n.a, n.b, m);
    case Op.Wedge: {
      if (n.side !== 0) return { iv: FULL(), exact: false };
      let w = n.b / 2;
      if (m > 0) w += st <= Math.sin(m) ? Math.PI : Math.asin(Math.sin(m) / st);
      return { iv: arc(n.a + n.b / 2, w), exact: exact0 };
    }
    case Op.Disc:
      return { iv: discArc(z, st, n.centres[0], n.centres[1], n.centres[2], n.radii[0] + m), exact: exact0 };
    case Op.Ring: {
      const c = n.centres;
      const outer = discArc(z, st, c[0], c[1], c[2], n.b + m);
      const innerR = n.a - m;
      if (innerR <= 0) return { iv: outer, exact: exact0 && n.a <= 0 };
      // the open inner disc is excluded; its closed arc is removed, which can drop a centre lying exactly on it
      return { iv: intersect(outer, complement(discArc(z, st, c[0], c[1], c[2], innerR))), exact: exact0 };
    }
    case Op.Discs: {
      let iv: number[] = [];
      for (let k = 0; k < n.activeCount; k++) {
        const i = n.active[k];
        iv = unite(iv, discArc(z, st, n.centres[3 * i], n.centres[3 * i + 1], n.centres[3 * i + 2], n.radii[i] + m));
      }
      return { iv, exact: exact0 };
    }
    case Op.All: {
      let iv = FULL(), exact = true;
      for (const k of n.kids) {
        const c = candidates(k, z, st, lat, m);
        iv = intersect(iv, c.iv);
        exact = exact && c.exact;
        if (iv.length === 0) return { iv, exact: true };
      }
      return { iv, exact };
    }
    case Op.Any: {
      let iv: number[] = [], exact = true;
      for (const k of n.kids) {
        const c = candidates(k, z, st, lat, m);
        iv = unite(iv, c.iv);
        exact = exact && c.exact;
      }
      return { iv, exact };
    }
    case Op.Minus: {
      const a = candidates(n.kids[0], z, st, lat, m);
      if (a.iv.length === 0 || m > 0) return { iv: a.iv, exact: false };
      const b = candidates(n.kids[1], z, st, lat, m);
      if (!b.exact) return { iv: a.iv, exact: false };
      return { iv: intersect(a.iv, complement(b.iv)), exact: a.exact };
    }
  }
  return { iv: FULL(), exact: false };
}

