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
  const oN = oIdx ? oIdx.length : 0;
  const crossAll = other !== null && other.full;
  let j = 0;
  let sWF = 0, cWF = 0, sWFT = 0, cWFT = 0, sF = 0, cF = 0, sFT = 0, cFT = 0, sX = 0, cX = 0;
  let blankCount = 0, blankF = 0, negCount = 0, validCount = 0;
  for (let k = 0; k < n; k++) {
    const p = idx[k];
    const v = plane[nested ? ringToNest(nside, p) : p];
    const f = fr[k];
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
      if (j < oN && oIdx[j] === p) fo = oFr![j];
    }
    if (fo > 0) {
      const x = ft * fo;
      t = sX + x;
      if (Math.abs(sX) >= Math.abs(x)) cX += (sX - t) + x; else cX += (x - t) + sX;
      sX = t;
    }
  }
  out[S.WF] = sWF + cWF;
  out[S.WFT] = sWFT + cWFT;
  out[S.F] = sF + cF;
  out[S.FT] = sFT + cFT;
  out[S.CROSS] = sX + cX;
  out[S.BLANK_COUNT] = blankCount;
  out[S.BLANK_F] = blankF;
  out[S.NEG_COUNT] = negCount;
  out[S.VALID_COUNT] = validCount;
}

/**
 * Whole-sky sums of a plane (any ordering: a sum does not depend on it), in
 * the {@link S} slots with f = w = 1: WF = F = VALID_COUNT = valid pixels,
 * WFT = FT = CROSS = sum of valid values.
 */
export function wholeSkySums(plane: MapArray, out: Float64Array): void {
  const n = plane.length;
  let s = 0, c = 0, blank = 0, neg = 0;
  for (let p = 0; p < n; p++) {
    const v = plane[p];
    if (!(v - v === 0) || (v >= BLANK_LO && v <= BLANK_HI)) { blank++; continue; }
    if (v < 0) neg++;
    const t = s + v;
    if (Math.abs(s) >= Math.abs(v)) c += (s - t) + v; else c += (v - t) + s;
    s = t;
  }
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
