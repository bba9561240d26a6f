/**
 * Ring geometry of the HEALPix RING scheme, tabulated once per Nside so that hot
 * loops can visit every pixel centre without allocating: for ring r (0-based,
 * north to south) the pixels are first[r] .. first[r] + length[r] - 1 in RING
 * order, all at z = cos(theta) = z[r], with centres at
 * phi = phi0[r] + j * dphi[r], j = 0 .. length[r] - 1.
 *
 * Formulas: Gorski et al. 2005 (ApJ 622, 759), section 4, eqs. 4-9 (pixel-centre
 * positions in the polar caps and the equatorial belt). In the belt the shift is
 * s = ((i - Nside) mod 2) + 1, phi = (pi / (2 Nside)) (j - s/2) with 1-based j;
 * that form reproduces healpy's pix2ang (checked with Debian python3-healpy
 * in test/sphere/healpixGeometry.test.ts).
 *
 * @example
 * const t = ringTable(4);
 * t.count;       // 15 rings
 * t.first[1];    // 4: ring 2 starts at pixel 4
 */
import { nside2npix } from './nside.js';

/** Tabulated ring geometry for one Nside (see module doc). */
export interface RingTable {
  readonly nside: number;
  /** Number of rings, 4 Nside - 1. */
  readonly count: number;
  readonly z: Float64Array;
  /** sin(theta) of the ring, computed without cancellation near the poles. */
  readonly sinTheta: Float64Array;
  readonly theta: Float64Array;
  readonly phi0: Float64Array;
  readonly dphi: Float64Array;
  /** RING index of the ring's first pixel (exact integers in a Float64Array). */
  readonly first: Float64Array;
  readonly length: Int32Array;
}

const cache = new Map<number, RingTable>();

/** The ring table of an Nside, built once and cached. */
export function ringTable(nside: number): RingTable {
  let t = cache.get(nside);
  if (!t) {
    t = buildRingTable(nside);
    cache.set(nside, t);
  }
  return t;
}

function buildRingTable(nside: number): RingTable {
  const count = 4 * nside - 1;
  const npix = nside2npix(nside);
  const z = new Float64Array(count);
  const sinTheta = new Float64Array(count);
  const theta = new Float64Array(count);
  const phi0 = new Float64Array(count);
  const dphi = new Float64Array(count);
  const first = new Float64Array(count);
  const length = new Int32Array(count);
  const n2 = nside * nside;
  for (let r = 0; r < count; r++) {
    const i = r + 1; // 1-based ring number from the north pole
    if (i < nside) {
      // North polar cap.
      const u = (i * i) / (3 * n2); // 1 - z
      z[r] = 1 - u;
      sinTheta[r] = Math.sqrt(u * (2 - u));
      phi0[r] = Math.PI / (4 * i);
      dphi[r] = Math.PI / (2 * i);
      first[r] = 2 * i * (i - 1);
      length[r] = 4 * i;
    } else if (i <= 3 * nside) {
      // Equatorial belt.
      const zi = 4 / 3 - (2 * i) / (3 * nside);
      z[r] = zi;
      sinTheta[r] = Math.sqrt((1 - zi) * (1 + zi));
      const s = ((i - nside) % 2) + 1;
      phi0[r] = (Math.PI / (2 * nside)) * (1 - s / 2);
      dphi[r] = Math.PI / (2 * nside);
      first[r] = 2 * nside * (nside - 1) + (i - nside) * 4 * nside;
      length[r] = 4 * nside;
    } else {
      // South polar cap, mirror of the north.
      const ip = 4 * nside - i;
      const u = (ip * ip) / (3 * n2);
      z[r] = u - 1;
      sinTheta[r] = Math.sqrt(u * (2 - u));
      phi0[r] = Math.PI / (4 * ip);
      dphi[r] = Math.PI / (2 * ip);
      first[r] = npix - 2 * ip * (ip + 1);
      length[r] = 4 * ip;
    }
    theta[r] = Math.atan2(sinTheta[r], z[r]);
  }
  return { nside, count, z, sinTheta, theta, phi0, dphi, first, length };
}
