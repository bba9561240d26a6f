/**
 * The factor sums of every plane of a streamed map, accumulated window by
 * window: the kernels of regionSums.ts run over each window with their state
 * carried from one window to the next, so the sums of a RING map are bit for
 * bit those of the whole-plane functions (the additions happen in the same
 * order). Memory: one small state per (plane, region), whatever the map size.
 *
 * A NESTED map streams in NESTED pixel order, so its region lists are put in
 * that order first ({@link inPixelOrder}); its sums then differ from the
 * whole-plane ones (which visit the pixels in RING order) only by rounding.
 */
import type { MapArray } from '../maps/skyMap.js';
import { nestToRing, ringToNest } from '../sphere/pixelIndex.js';
import type { RegionPixels } from './regionPixels.js';
import { finishRegionSums, finishSkySums, skyBlock, SKY_ST_LENGTH, ST_LENGTH, sumBlock, SUMS_LENGTH } from './regionSums.js';

/** `r` with its pixels listed in NESTED order and NESTED indices (unchanged when full). */
export function inNestedOrder(r: RegionPixels): RegionPixels {
  if (r.full) return r;
  const n = r.index.length, nside = r.nside;
  const nest = new Uint32Array(n);
  for (let k = 0; k < n; k++) nest[k] = ringToNest(nside, r.index[k]);
  nest.sort();
  const fraction = r.fraction ? new Float32Array(n) : null;
  const exposure = r.exposure ? new Float32Array(n) : null;
  for (let k = 0; k < n; k++) {
    const ring = nestToRing(nside, nest[k]);
    let lo = 0, hi = n - 1; // the RING list is increasing: binary search
    while (lo < hi) { const mid = (lo + hi) >>> 1; if (r.index[mid] < ring) lo = mid + 1; else hi = mid; }
    if (fraction) fraction[k] = r.fraction![lo];
    if (exposure) exposure[k] = r.exposure![lo];
  }
  return { ...r, index: nest, fraction, exposure };
}

/** Regions in the pixel order of the file being streamed. */
export function inPixelOrder(rs: RegionPixels[], nested: boolean): RegionPixels[] {
  return nested ? rs.map(inNestedOrder) : rs;
}

/** Sums of each plane over a measured region `a`, targets `bs` and the whole sky (see module doc). */
export class StreamedPlaneSums {
  private readonly sky: Float64Array[];
  private readonly sa: Float64Array[];
  private readonly sbs: Float64Array[][];
  private readonly cursor: Int32Array;

  constructor(private readonly a: RegionPixels, private readonly bs: RegionPixels[], planes: number, private readonly npix: number) {
    this.sky = Array.from({ length: planes }, () => new Float64Array(SKY_ST_LENGTH));
    this.sa = Array.from({ length: planes }, () => new Float64Array(ST_LENGTH));
    this.sbs = bs.map(() => Array.from({ length: planes }, () => new Float64Array(ST_LENGTH)));
    this.cursor = new Int32Array(1 + bs.length);
  }

  /** Where region r's list reaches pixel p1, from its cursor on (the cursor moves there). */
  private advance(r: RegionPixels, slot: number, p1: number): number {
    const idx = r.index;
    let k = this.cursor[slot];
    while (k < idx.length && idx[k] < p1) k++;
    this.cursor[slot] = k;
    return k;
  }

  /** Adds the values of pixels p0 .. p0 + n - 1 of every plane. */
  window(p0: number, n: number, planes: MapArray[]): void {
    const { a, bs } = this;
    const a0 = this.cursor[0], a1 = a.full ? 0 : this.advance(a, 0, p0 + n);
    const b0 = new Int32Array(bs.length), b1 = new Int32Array(bs.length);
    for (let i = 0; i < bs.length; i++) { b0[i] = this.cursor[1 + i]; b1[i] = bs[i].full ? 0 : this.advance(bs[i], 1 + i, p0 + n); }
    const oIdx = a.full ? null : a.index;
    for (let q = 0; q < planes.length; q++) {
      const v = planes[q];
      skyBlock(v, 0, n, this.sky[q]);
      if (a1 > a0) sumBlock(v, p0, 0, false, a.index, a.fraction, a.exposure, null, null, false, a0, a1, this.sa[q]);
      for (let i = 0; i < bs.length; i++) {
        const b = bs[i];
        if (b1[i] > b0[i]) sumBlock(v, p0, 0, false, b.index, b.fraction, b.exposure, oIdx, a.fraction, a.full, b0[i], b1[i], this.sbs[i][q]);
      }
    }
  }

  /** The sums of plane q in the slots of regionSums.ts: `sa` null for a whole-sky measured region, `sbs[i]` null for a whole-sky target. */
  finish(q: number): { sky: Float64Array; sa: Float64Array | null; sbs: (Float64Array | null)[] } {
    const sky = new Float64Array(SUMS_LENGTH);
    finishSkySums(this.sky[q], this.npix, sky);
    let sa: Float64Array | null = null;
    if (!this.a.full) { sa = new Float64Array(SUMS_LENGTH); finishRegionSums(this.sa[q], sa); }
    const sbs = this.bs.map((b, i) => {
      if (b.full) return null;
      const out = new Float64Array(SUMS_LENGTH);
      finishRegionSums(this.sbs[i][q], out);
      return out;
    });
    return { sky, sa, sbs };
  }
}
