/**
 * The factor kernels: compensated sums of a template plane over the pixels of
 * a region, with blank pixels excluded and counted. Everything the factors
 * need comes out of one visit of the region's pixels (weighted and unweighted
 * sums, the overlap with a second region, blank and negative counts), and the
 * whole-sky sums out of one pass over the plane.
 *
 * Sums use Neumaier's compensated update (Neumaier 1974, ZAMM 54, 39), written
 * inline so the loop allocates nothing. Pixel areas are equal in HEALPix
 * (Gorski et al. 2005, ApJ 622, 759), so sums are in pixel units and the
 * callers multiply by the pixel area where a solid angle is wanted.
 *
 * Blank: NaN, +-Infinity, or within 1e-5 relative of the HEALPix sentinel
 * -1.6375e30 (the same test as maps/blank.ts, inlined for the hot loop).
 */
import type { MapArray } from '../maps/skyMap.js';
import { BLANK } from '../maps/skyMap.js';
import { ringToNest } from '../sphere/pixelIndex.js';
import type { RegionPixels } from './regionPixels.js';

/** Slots of the output array of {@link regionSums}. */
export const S = {
  /** sum of w f over valid pixels */ WF: 0,
  /** sum of w f T over valid pixels */ WFT: 1,
  /** sum of f over valid pixels */ F: 2,
  /** sum of f T over valid pixels */ FT: 3,
  /** sum of f f_other T over valid pixels */ CROSS: 4,
  /** pixels with f > 0 whose value is blank */ BLANK_COUNT: 5,
  /** sum of f over blank pixels */ BLANK_F: 6,
  /** pixels with f > 0 and T < 0 */ NEG_COUNT: 7,
  /** pixels with f > 0 and a valid value */ VALID_COUNT: 8,
} as const;
/** Number of slots in one region's sums (one more than the largest slot index above). */
export const SUMS_LENGTH = 9;

const BLANK_LO = BLANK * (1 + 1e-5);
const BLANK_HI = BLANK * (1 - 1e-5);

/**
 * Sums of `plane` (RING, or NESTED when `nested`) over the sparse region `r`
 * (not `full`), written to `out` at the {@link S} slots. `other`, when given,
 * supplies f_other for the CROSS slot (its index list is merged with r's; a
 * full `other` has f_other = 1). Without an exposure, w = 1.
 */
export function regionSums(
  plane: MapArray, nside: number, nested: boolean, r: RegionPixels, other: RegionPixels | null, out: Float64Array,
): void {
  const idx = r.index, fr = r.fraction, ex = r.exposure, n = idx.length;
  const oIdx = other && !other.full ? other.index : null;
  const oFr = other ? other.fraction : null;
  const crossAll = other !== null && other.full;
  // the pixels go in blocks through one small kernel (compiled early as a hot function, see
  // wholeSkySums); the state is carried exactly, so the sums are those of one plain loop
  const st = new Float64Array(ST_LENGTH);
  for (let k = 0; k < n; k += SUM_BLOCK) {
    sumBlock(plane, 0, nside, nested, idx, fr, ex, oIdx, oFr, crossAll, k, k + SUM_BLOCK < n ? k + SUM_BLOCK : n, st);
  }
  finishRegionSums(st, out);
}

/** Writes the {@link S} slots of `out` from the state of {@link sumBlock}. */
export function finishRegionSums(st: Float64Array, out: Float64Array): void {
  out[S.WF] = st[0] + st[1];
  out[S.WFT] = st[2] + st[3];
  out[S.F] = st[4] + st[5];
  out[S.FT] = st[6] + st[7];
  out[S.CROSS] = st[8] + st[9];
  out[S.BLANK_COUNT] = st[10];
  out[S.BLANK_F] = st[11];
  out[S.NEG_COUNT] = st[12];
  out[S.VALID_COUNT] = st[13];
}

/** Listed pixels per call of {@link sumBlock}. */
const SUM_BLOCK = 16384;
/** State of {@link sumBlock}: five (sum, compensation) pairs, four counts or sums, the merge position. */
export const ST_LENGTH = 15;

/**
 * The loop of {@link regionSums} over list entries k0..k1-1, continuing the
 * state in st; pixel p's value is plane[p - base] (a window of a streamed
 * plane starts at pixel `base`; 0 for a whole plane). A null `fr` (or `oFr`
 * with `oIdx`) means every listed pixel is covered fully (f = 1).
 */
export function sumBlock(plane: MapArray, base: number, nside: number, nested: boolean, idx: Uint32Array, fr: Float32Array | null, ex: Float32Array | null,
  oIdx: Uint32Array | null, oFr: Float32Array | null, crossAll: boolean, k0: number, k1: number, st: Float64Array): void {
  const oN = oIdx ? oIdx.length : 0;
  let sWF = st[0], cWF = st[1], sWFT = st[2], cWFT = st[3], sF = st[4], cF = st[5], sFT = st[6], cFT = st[7], sX = st[8], cX = st[9];
  let blankCount = st[10], blankF = st[11], negCount = st[12], validCount = st[13], j = st[14];
  for (let k = k0; k < k1; k++) {
    const p = idx[k];
    const v = plane[(nested ? ringToNest(nside, p) : p) - base];
    const f = fr === null ? 1 : fr[k];
    if (!(v - v === 0) || (v >= BLANK_LO && v <= BLANK_HI)) {
      blankCount++;
      blankF += f;
      continue;
    }
    validCount++;
    if (v < 0) negCount++;
    const w = ex ? ex[k] * f : f;
    const wt = w * v, ft = f * v;
    let t = sWF + w;
    if (Math.abs(sWF) >= Math.abs(w)) cWF += (sWF - t) + w; else cWF += (w - t) + sWF;
    sWF = t;
    t = sWFT + wt;
    if (Math.abs(sWFT) >= Math.abs(wt)) cWFT += (sWFT - t) + wt; else cWFT += (wt - t) + sWFT;
    sWFT = t;
    t = sF + f;
    if (Math.abs(sF) >= Math.abs(f)) cF += (sF - t) + f; else cF += (f - t) + sF;
    sF = t;
    t = sFT + ft;
    if (Math.abs(sFT) >= Math.abs(ft)) cFT += (sFT - t) + ft; else cFT += (ft - t) + sFT;
    sFT = t;
    let fo = 0;
    if (crossAll) fo = 1;
    else if (oIdx) {
      while (j < oN && oIdx[j] < p) j++;
      if (j < oN && oIdx[j] === p) fo = oFr === null ? 1 : oFr[j];
    }
    if (fo > 0) {
      const x = ft * fo;
      t = sX + x;
      if (Math.abs(sX) >= Math.abs(x)) cX += (sX - t) + x; else cX += (x - t) + sX;
      sX = t;
    }
  }
  st[0] = sWF; st[1] = cWF; st[2] = sWFT; st[3] = cWFT; st[4] = sF; st[5] = cF; st[6] = sFT; st[7] = cFT; st[8] = sX; st[9] = cX;
  st[10] = blankCount; st[11] = blankF; st[12] = negCount; st[13] = validCount; st[14] = j;
}

/**
 * Whole-sky sums of a plane (any ordering: a sum does not depend on it), in
 * the {@link S} slots with f = w = 1: WF = F = VALID_COUNT = valid pixels,
 * WFT = FT = CROSS = sum of valid values.
 */
export function wholeSkySums(plane: MapArray, out: Float64Array): void {
  const n = plane.length;
  // the pass goes in blocks through one small kernel, so that the kernel is compiled as an
  // ordinary hot function early on (one long loop in a single call runs slower, measured);
  // the order of the additions is the same as one plain loop
  const st = new Float64Array(SKY_ST_LENGTH);
  for (let a = 0; a < n; a += SKY_BLOCK) skyBlock(plane, a, a + SKY_BLOCK < n ? a + SKY_BLOCK : n, st);
  finishSkySums(st, n, out);
}

/** Writes the {@link S} slots of `out` from the state of {@link skyBlock} after a pass over all `n` pixels. */
export function finishSkySums(st: Float64Array, n: number, out: Float64Array): void {
  const blank = st[2], neg = st[3], part = st[4];
  let s = st[0], c = st[1];
  const t = s + part; // the last partial sum
  if (Math.abs(s) >= Math.abs(part)) c += (s - t) + part; else c += (part - t) + s;
  s = t;
  const valid = n - blank, sum = s + c;
  out[S.WF] = valid;
  out[S.WFT] = sum;
  out[S.F] = valid;
  out[S.FT] = sum;
  out[S.CROSS] = sum;
  out[S.BLANK_COUNT] = blank;
  out[S.BLANK_F] = blank;
  out[S.NEG_COUNT] = neg;
  out[S.VALID_COUNT] = valid;
}

/** Pixels per call of {@link skyBlock}. */
const SKY_BLOCK = 16384;

/** Length of the state of {@link skyBlock}. */
export const SKY_ST_LENGTH = 6;
/** Valid values added plainly (in double precision) before their partial sum enters the compensated sum. */
const SKY_PART = 256;

/**
 * Sum of the valid values of plane[a..b), continuing the state in st
 * (running sum, compensation, blank count, negative count, partial sum,
 * values in the partial sum). Valid values go into a plain double partial
 * sum, and every 256 of them the partial enters the Neumaier sum: one
 * compensated update per 256 values instead of per value, with the partial's
 * rounding at most 256 x 2^-53 of its values' magnitudes (Higham 2002,
 * Accuracy and Stability of Numerical Algorithms, eq. 4.4; from memory). The
 * partials are counted over valid values in pixel order, so the result does
 * not depend on how the pass is cut into blocks.
 */
export function skyBlock(plane: MapArray, a: number, b: number, st: Float64Array): void {
  let s = st[0], c = st[1], blank = st[2], neg = st[3], part = st[4], k = st[5];
  for (let p = a; p < b; p++) {
    const v = plane[p];
    // the common case first: finite and >= 0 (never blank, never negative)
    if (!(v >= 0 && v < Infinity)) {
      if (!(v - v === 0) || (v >= BLANK_LO && v <= BLANK_HI)) { blank++; continue; }
      neg++;
    }
    part += v;
    if (++k === SKY_PART) {
      const t = s + part;
      if (Math.abs(s) >= Math.abs(part)) c += (s - t) + part; else c += (part - t) + s;
      s = t; part = 0; k = 0;
    }
  }
  st[0] = s; st[1] = c; st[2] = blank; st[3] = neg; st[4] = part; st[5] = k;
}
