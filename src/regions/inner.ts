/**
 * Per ring of the template, the longitudes where a compiled region holds every
 * point at least R inside: the pixels there are wholly inside and are filled
 * without a test (the complement of candidates.ts, which gives a superset).
 */
import { HALF_PI } from '../core/math.js';
import { annulus, arc, candidates, complement, discArc, FULL, intersect, unite } from './candidates.js';
import { Op, type PNode } from './program.js';

/**
 * Longitudes on the ring whose points lie inside node n by at least R (rad):
 * a subset, used to fill pixels that are wholly inside without testing them.
 * Shapes in the other frame that have no closed form here (longitude ranges)
 * give no interval.
 */
export function innerIntervals(n: PNode, z: number, st: number, lat: number, R: number): number[] {
  switch (n.op) {
    case Op.Sky: return FULL();
    case Op.Lat:
      if (n.side !== 0) return annulus(z, st, n.centres, HALF_PI - n.b + R, HALF_PI - n.a - R);
      return lat >= n.a + R && lat <= n.b - R ? FULL() : [];
    case Op.AbsLat: {
      if (n.side !== 0) {
        return unite(annulus(z, st, n.centres, HALF_PI - n.b + R, HALF_PI - n.a - R),
          annulus(z, st, n.centres, HALF_PI + n.a + R, HALF_PI + n.b - R));
      }
      const al = Math.abs(lat);
      return (n.a <= 0 || al >= n.a + R) && al <= n.b - R ? FULL() : [];
    }
    case Op.Wedge: {
      if (n.side !== 0 || st <= Math.sin(R)) return [];
      const w = n.b / 2 - Math.asin(Math.sin(R) / st);
      return w > 0 ? arc(n.a + n.b / 2, w) : [];
    }
    case Op.Disc:
      return discArc(z, st, n.centres[0], n.centres[1], n.centres[2], n.radii[0] - R);
    case Op.Ring:
      return annulus(z, st, n.centres, n.a > 0 ? n.a + R : 0, n.b - R);
    case Op.Discs: {
      let iv: number[] = [];
      for (let k = 0; k < n.activeCount; k++) {
        const i = n.active[k];
        iv = unite(iv, discArc(z, st, n.centres[3 * i], n.centres[3 * i + 1], n.centres[3 * i + 2], n.radii[i] - R));
      }
      return iv;
    }
    case Op.All: {
      let iv = FULL();
      for (const k of n.kids) { iv = intersect(iv, innerIntervals(k, z, st, lat, R)); if (iv.length === 0) break; }
      return iv;
    }
    case Op.Any: {
      let iv: number[] = [];
      for (const k of n.kids) iv = unite(iv, innerIntervals(k, z, st, lat, R));
      return iv;
    }
    case Op.Minus: {
      const a = innerIntervals(n.kids[0], z, st, lat, R);
      if (a.length === 0) return a;
      return intersect(a, complement(candidates(n.kids[1], z, st, lat, R).iv));
    }
  }
  return [];
}
