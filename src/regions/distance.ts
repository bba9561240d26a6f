/**
 * The per-point kernel: a signed angular distance (rad) from a direction to a
 * compiled region's boundary, positive inside, negative outside. For discs,
 * rings and latitude limits it is exact; for longitude limits it is the exact
 * distance to the bounding half-meridian; combinations take min (intersection)
 * and max (union), so the magnitude is never more than the true distance and
 * the sign is always right (the usual rule for combined distance bounds,
 * common practice, no source). A pixel whose centre is further inside (or
 * outside) than the pixel's radius is therefore wholly inside (or outside).
 *
 * No allocation: the point lives in a Float64Array P of 10 numbers,
 * [x, y, z, lon, lat] in the template frame then the same in the other frame
 * (longitude and latitude only filled when some shape needs them).
 */
import { HALF_PI, TWO_PI } from '../core/math.js';
import { Op, type PNode, type Program } from './program.js';

/** Stands for "no boundary on this side": larger than any angle on the sphere. */
export const FAR = 10;

const SKY = Op.Sky, LAT = Op.Lat, ABSLAT = Op.AbsLat, WEDGE = Op.Wedge, DISC = Op.Disc, RING = Op.Ring;
const DISCS = Op.Discs, ALL = Op.All, ANY = Op.Any, MINUS = Op.Minus;

/** Fills P from a unit vector (x, y, z) of the template frame. */
export function setPoint(prog: Program, P: Float64Array, x: number, y: number, z: number): void {
  P[0] = x; P[1] = y; P[2] = z;
  if (prog.needAngles[0]) {
    P[3] = Math.atan2(y, x);
    P[4] = Math.atan2(z, Math.sqrt(x * x + y * y));
  }
  if (prog.usesOther) {
    const m = prog.toOther;
    const xr = m[0] * x + m[1] * y + m[2] * z;
    const yr = m[3] * x + m[4] * y + m[5] * z;
    const zr = m[6] * x + m[7] * y + m[8] * z;
    P[5] = xr; P[6] = yr; P[7] = zr;
    P[8] = Math.atan2(yr, xr);
    P[9] = Math.atan2(zr, Math.sqrt(xr * xr + yr * yr));
  }
}

function meridianDistance(delta: number, lat: number, coslat: number): number {
  // delta: longitude difference folded into [0, pi]
  return delta <= HALF_PI ? Math.asin(Math.min(1, coslat * Math.sin(delta))) : HALF_PI - Math.abs(lat);
}

function discDistance(c: Float64Array, i: number, P: Float64Array): number {
  const dx = P[0] - c[3 * i], dy = P[1] - c[3 * i + 1], dz = P[2] - c[3 * i + 2];
  const chord = Math.sqrt(dx * dx + dy * dy + dz * dz);
  return 2 * Math.asin(Math.min(1, chord / 2)); // accurate at small and large separations
}

/** Signed angular distance (rad) of point P to the boundary of node n; see module doc. */
export function signedDistance(n: PNode, P: Float64Array): number {
  switch (n.op) {
    case SKY: return FAR;
    case LAT: {
      const lat = P[n.side * 5 + 4];
      const lo = n.a <= -HALF_PI ? FAR : lat - n.a;
      const hi = n.b >= HALF_PI ? FAR : n.b - lat;
      return lo < hi ? lo : hi;
    }
    case ABSLAT: {
      const al = Math.abs(P[n.side * 5 + 4]);
      const lo = n.a <= 0 ? FAR : al - n.a;
      const hi = n.b >= HALF_PI ? FAR : n.b - al;
      return lo < hi ? lo : hi;
    }
    case WEDGE: {
      const o = n.side * 5;
      const lat = P[o + 4];
      const coslat = Math.sqrt(P[o] * P[o] + P[o + 1] * P[o + 1]);
      let dl = (P[o + 3] - n.a) % TWO_PI;
      if (dl < 0) dl += TWO_PI;
      const inside = dl <= n.b;
      let d2 = dl - n.b;
      if (d2 < 0) d2 += TWO_PI;
      const e1 = meridianDistance(dl > Math.PI ? TWO_PI - dl : dl, lat, coslat);
      const e2 = meridianDistance(d2 > Math.PI ? TWO_PI - d2 : d2, lat, coslat);
      const e = e1 < e2 ? e1 : e2;
      return inside ? e : -e;
    }
    case DISC: return n.radii[0] - discDistance(n.centres, 0, P);
    case RING: {
      const d = discDistance(n.centres, 0, P);
      const outer = n.b - d;
      if (n.a <= 0) return outer;
      const inner = d - n.a;
      return inner < outer ? inner : outer;
    }
    case DISCS: {
      let best = -n.d; // floor for discs far from the current ring (see beginRing)
      const act = n.active, c = n.centres, r = n.radii;
      for (let k = 0; k < n.activeCount; k++) {
        const i = act[k];
        const v = r[i] - discDistance(c, i, P);
        if (v > best) best = v;
      }
      return best;
    }
    case ALL: {
      let v = FAR;
      for (let k = 0; k < n.kids.length; k++) {
        const s = signedDistance(n.kids[k], P);
        if (s < v) v = s;
      }
      return v;
    }
    case ANY: {
      let v = -FAR;
      for (let k = 0; k < n.kids.length; k++) {
        const s = signedDistance(n.kids[k], P);
        if (s > v) v = s;
      }
      return v;
    }
    case MINUS: {
      const a = signedDistance(n.kids[0], P);
      const b = -signedDistance(n.kids[1], P);
      return a < b ? a : b;
    }
  }
  return -FAR;
}

/**
 * Prepares the disc lists for points whose colatitude lies within `spread`
 * of thetaRing: a disc of radius r whose centre is further than
 * r + 2 spread in colatitude cannot reach them, and is left out; the union then
 * reports at most -spread for them, which keeps the distance a lower bound
 * (any such point is at least spread outside the left-out discs).
 */
export function beginRing(n: PNode, thetaRing: number, spread: number): void {
  if (n.op === DISCS) {
    let k = 0;
    for (let i = 0; i < n.radii.length; i++) {
      if (Math.abs(thetaRing - n.colat[i]) <= n.radii[i] + 2 * spread) n.active[k++] = i;
    }
    n.activeCount = k;
    n.d = spread;
  }
  for (let k = 0; k < n.kids.length; k++) beginRing(n.kids[k], thetaRing, spread);
}
