/**
 * Bilinear interpolation on the four nearest HEALPix pixel centres, the scheme
 * of the HEALPix library's get_interpol (healpy.get_interp_weights): the two
 * rings whose centres bracket the direction in colatitude, the two pixels of
 * each ring whose centres bracket it in longitude; weights linear in phi within
 * a ring and linear in theta between the rings. Above the first ring (below the
 * last), the missing ring is replaced by the pole: the four pixels of the polar
 * ring share a quarter of the weight (1 - theta/theta1) each way, so the value
 * at the pole is the mean of those four (common practice, as in the HEALPix C++
 * library; no published equation).
 */
import { TWO_PI } from '../core/math.js';
import { ringTable, type RingTable } from '../sphere/ringTable.js';
import { isBlank } from './blank.js';
import { BLANK } from './skyMap.js';

/** 1-based number of the ring just north of (or at) z = cos(theta); 0 above the first ring. */
function ringAbove(nside: number, z: number): number {
  const az = Math.abs(z);
  if (az <= 2 / 3) return Math.floor(nside * (2 - 1.5 * z));
  const ir = Math.floor(nside * Math.sqrt(3 * (1 - az)));
  return z > 0 ? ir : 4 * nside - ir - 1;
}

/** Writes the two bracketing pixels of ring r (0-based) at phi and their weights at slot s, s+1. */
function ringPair(t: RingTable, r: number, phi: number, pix: Uint32Array, w: Float64Array, s: number): void {
  const nr = t.length[r], dphi = t.dphi[r];
  const tmp = (phi - t.phi0[r]) / dphi;
  let i1 = Math.floor(tmp);
  const f = tmp - i1;
  let i2 = i1 + 1;
  if (i1 < 0) i1 += nr;
  if (i2 >= nr) i2 -= nr;
  pix[s] = t.first[r] + i1;
  pix[s + 1] = t.first[r] + i2;
  w[s] = 1 - f;
  w[s + 1] = f;
}

/**
 * The four RING pixels and their weights (summing to 1) for bilinear
 * interpolation at colatitude theta in [0, pi] and longitude phi (rad, any
 * value: wrapped into [0, 2 pi)). Allocation-free; trusts its inputs.
 *
 * @example
 * const pix = new Uint32Array(4), w = new Float64Array(4);
 * interpolationWeights(4, 0.01, 0.3, pix, w); // pix 1,2,3,0 (the polar ring)
 */
export function interpolationWeights(nside: number, theta: number, phi: number, outPix: Uint32Array, outW: Float64Array): void {
  const t = ringTable(nside);
  let ph = phi % TWO_PI;
  if (ph < 0) ph += TWO_PI;
  const ir1 = ringAbove(nside, Math.cos(theta));
  const ir2 = ir1 + 1;
  const last = 4 * nside; // one past the last ring
  if (ir1 > 0) ringPair(t, ir1 - 1, ph, outPix, outW, 0);
  if (ir2 < last) ringPair(t, ir2 - 1, ph, outPix, outW, 2);
  if (ir1 === 0) {
    const wt = theta / t.theta[0];
    const fac = (1 - wt) * 0.25;
    outW[0] = fac;
    outW[1] = fac;
    outW[2] = outW[2] * wt + fac;
    outW[3] = outW[3] * wt + fac;
    outPix[0] = (outPix[2] + 2) & 3;
    outPix[1] = (outPix[3] + 2) & 3;
  } else if (ir2 === last) {
    const th1 = t.theta[ir1 - 1];
    const wt = (theta - th1) / (Math.PI - th1);
    const fac = wt * 0.25;
    const npix = 12 * nside * nside;
    outW[0] = outW[0] * (1 - wt) + fac;
    outW[1] = outW[1] * (1 - wt) + fac;
    outW[2] = fac;
    outW[3] = fac;
    outPix[2] = ((outPix[0] + 2) & 3) + npix - 4;
    outPix[3] = ((outPix[1] + 2) & 3) + npix - 4;
  } else {
    const th1 = t.theta[ir1 - 1], th2 = t.theta[ir2 - 1];
    const wt = (theta - th1) / (th2 - th1);
    outW[0] *= 1 - wt;
    outW[1] *= 1 - wt;
    outW[2] *= wt;
    outW[3] *= wt;
  }
}

const scratchPix = new Uint32Array(4);
const scratchW = new Float64Array(4);

/**
 * Combines four values with weights, blank-aware: blank values are dropped and
 * the remaining weights renormalised; BLANK when no remaining weight is positive.
 */
export function combineWeighted(plane: ArrayLike<number>, pix: Uint32Array, w: Float64Array): number {
  let sum = 0, wsum = 0;
  for (let k = 0; k < 4; k++) {
    const v = plane[pix[k]];
    if (isBlank(v)) continue;
    sum += w[k] * v;
    wsum += w[k];
  }
  return wsum > 0 ? sum / wsum : BLANK;
}

/**
 * The value of a RING-ordered plane at (theta, phi) by bilinear interpolation
 * (see {@link interpolationWeights}). Blank neighbours are excluded and the
 * other weights renormalised, so next to a blank region the nearest valid
 * centres take over; BLANK when all four usable neighbours are blank.
 */
export function interpolateRing(plane: ArrayLike<number>, nside: number, theta: number, phi: number): number {
  interpolationWeights(nside, theta, phi, scratchPix, scratchW);
  return combineWeighted(plane, scratchPix, scratchW);
}
