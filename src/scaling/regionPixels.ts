/**
 * A region's pixel weights in sparse form: the RING pixels it touches, in
 * increasing order, with their covered fraction and (for a measured region)
 * their relative exposure. Most regions cover a few per cent of the sky, so
 * the factor kernels visit only these pixels; a region that is the whole sky
 * with no exposure weighting is flagged `full` and costs one pass over the
 * template instead of a 12 Nside^2 index list.
 */
import { ComputeError } from '../core/errors.js';
import type { FrameName } from '../sphere/frames.js';
import { nside2npix, pixelAreaSr } from '../sphere/nside.js';
import { ringTable } from '../sphere/ringTable.js';

/**
 * The shape of the regions layer's `RegionWeights` that the factors need
 * (declared here so the kernels and their tests depend on the shape only).
 */
export interface RegionWeightsLike {
  readonly nside: number;
  readonly frame: FrameName;
  readonly name: string;
  readonly mode: 'fraction' | 'centre';
  /** Covered fraction per RING pixel, 0..1. */
  readonly fraction: Float32Array;
  /** Relative exposure per RING pixel (max 1), or null for unweighted. */
  readonly exposure: Float32Array | null;
  readonly solidAngleSr: number;
  readonly notes: string[];
  /**
   * Optional ring bounds of the nonzero pixels (see the regions layer's
   * `RegionWeights.ringSpans`): pixels j = ringSpans[2r] .. ringSpans[2r + 1]
   * of ring r, -1 for none. When given, only those pixels are read.
   */
  readonly ringSpans?: Int32Array;
}

/** Sparse pixel weights of one region at one Nside (see module doc). */
export interface RegionPixels {
  readonly name: string;
  readonly nside: number;
  readonly frame: FrameName;
  readonly mode: 'fraction' | 'centre';
  /** True when the region is the whole sky with unit weight everywhere. */
  readonly full: boolean;
  /** RING indices of the pixels with fraction > 0, increasing (empty when full). */
  readonly index: Uint32Array;
  /**
   * Covered fraction of each listed pixel, or null when every listed pixel is
   * covered fully (f = 1, as always in pixel-centre coverage): the kernels then
   * use 1, and no list of ones is written (at Nside 2048 a band of |b| < 4 deg
   * lists 3.5M pixels, whose ones cost 14 MB of fresh memory).
   */
  readonly fraction: Float32Array | null;
  /** Relative exposure of each listed pixel, or null (unweighted). */
  readonly exposure: Float32Array | null;
  /** Sum of the covered fractions, in pixels (12 Nside^2 when full). */
  readonly pixelCount: number;
  /** Solid angle in sr: pixelCount times the pixel area. */
  readonly solidAngleSr: number;
  readonly notes: string[];
}

/**
 * Converts dense RING pixel weights to {@link RegionPixels}. `useExposure`
 * false drops the exposure (an unweighted region). Fractions outside [0, 1] or
 * non-finite, and exposures that are negative or non-finite, are rejected with
 * a ComputeError naming the region (the regions layer should never emit them).
 * With `w.ringSpans` only the pixels inside the ring bounds are read (the rest
 * are zero by that field's contract); the result is the same as a full scan.
 */
export function toRegionPixels(w: RegionWeightsLike, useExposure = true): RegionPixels {
  const npix = nside2npix(w.nside);
  const f = w.fraction;
  if (f.length !== npix) {
    throw new ComputeError(`region '${w.name}': ${f.length} pixel weights, expected ${npix} for Nside ${w.nside}`);
  }
  const e = useExposure ? w.exposure : null;
  if (e && e.length !== npix) {
    throw new ComputeError(`region '${w.name}': ${e.length} exposure values, expected ${npix} for Nside ${w.nside}`);
  }
  const spans = w.ringSpans;
  const rings = ringTable(w.nside);
  if (spans && spans.length !== 2 * rings.count) {
    throw new ComputeError(`region '${w.name}': ${spans.length} ring bounds, expected ${2 * rings.count} for Nside ${w.nside}`);
  }
  // pixel runs [a, b) to read: one per ring with ring bounds, else the whole map in blocks;
  // each run goes through a small kernel (compiled early as a hot function; same order of additions)
  const runs = spans ? rings.count : Math.ceil(npix / BLOCK);
  const st = new Float64Array(5); // [sum, compensation (Neumaier 1974), count of f > 0, bad pixel or -1, count of f = 1]
  let allOne = e === null;
  for (let r = 0; r < runs; r++) {
    if (spans) {
      const j0 = spans[2 * r], j1 = spans[2 * r + 1];
      if (j0 !== 0 || j1 !== rings.length[r] - 1) allOne = false;
      if (j0 < 0) continue;
      if (!(j1 >= j0 && j1 < rings.length[r])) {
        throw new ComputeError(`region '${w.name}': ring bounds ${j0}..${j1} of ring ${r} do not fit its ${rings.length[r]} pixels`);
      }
    }
    const a = spans ? rings.first[r] + spans[2 * r] : r * BLOCK;
    const b = spans ? rings.first[r] + spans[2 * r + 1] + 1 : Math.min(npix, a + BLOCK);
    const one = scanRun(f, a, b, st);
    if (st[3] >= 0) {
      throw new ComputeError(`region '${w.name}': covered fraction ${f[st[3]]} at RING pixel ${st[3]} is outside 0..1`);
    }
    if (!one) allOne = false;
  }
  const n = st[2], sum = st[0], comp = st[1];
  const base = { name: w.name, nside: w.nside, frame: w.frame, mode: w.mode, notes: [...w.notes] };
  if (allOne) return { ...wholeSkyPixels(w.name, w.nside, w.frame, w.mode), notes: base.notes };
  const index = new Uint32Array(n);
  const fraction = st[4] === n ? null : new Float32Array(n);
  const exposure = e ? new Float32Array(n) : null;
  let k = 0;
  for (let r = 0; r < runs; r++) {
    if (spans && spans[2 * r] < 0) continue;
    const a = spans ? rings.first[r] + spans[2 * r] : r * BLOCK;
    const b = spans ? rings.first[r] + spans[2 * r + 1] + 1 : Math.min(npix, a + BLOCK);
    k = collectRun(f, e, a, b, index, fraction, exposure, k, st);
    if (st[3] >= 0) {
      throw new ComputeError(`region '${w.name}': exposure ${e![st[3]]} at RING pixel ${st[3]} is negative or not finite`);
    }
  }
  const pixelCount = sum + comp;
  return { ...base, full: false, index, fraction, exposure, pixelCount, solidAngleSr: pixelCount * pixelAreaSr(w.nside) };
}

/** Pixels per run when the whole map is read. */
const BLOCK = 16384;

/**
 * Checks f[a..b) and adds its positive values to the compensated sum in st
 * (st[0] sum, st[1] compensation, st[2] count, st[4] count of values exactly
 * 1); st[3] gets the first pixel outside 0..1 (else -1). Returns whether every
 * value was exactly 1.
 */
function scanRun(f: Float32Array, a: number, b: number, st: Float64Array): boolean {
  let sum = st[0], comp = st[1], n = st[2], ones = st[4], allOne = true;
  st[3] = -1;
  for (let p = a; p < b; p++) {
    const v = f[p];
    if (!(v >= 0 && v <= 1)) { st[3] = p; break; }
    if (v > 0) {
      n++;
      const t = sum + v;
      if (Math.abs(sum) >= v) comp += (sum - t) + v; else comp += (v - t) + sum;
      sum = t;
    }
    if (v !== 1) allOne = false; else ones++;
  }
  st[0] = sum; st[1] = comp; st[2] = n; st[4] = ones;
  return allOne;
}

/**
 * Appends the pixels of f[a..b) with f > 0 (index, fraction unless null,
 * exposure) from slot k on; returns the next slot. st[3] gets the first pixel whose exposure
 * is negative or not finite (else -1).
 */
function collectRun(f: Float32Array, e: Float32Array | null, a: number, b: number, index: Uint32Array,
  fraction: Float32Array | null, exposure: Float32Array | null, k: number, st: Float64Array): number {
  st[3] = -1;
  for (let p = a; p < b; p++) {
    const v = f[p];
    if (v > 0) {
      index[k] = p;
      if (fraction) fraction[k] = v;
      if (exposure) {
        const x = e![p];
        if (!(x >= 0 && x < Infinity)) { st[3] = p; return k; }
        exposure[k] = x;
      }
      k++;
    }
  }
  return k;
}

/** The whole sky as {@link RegionPixels} (full, unweighted), without any per-pixel array. */
export function wholeSkyPixels(name: string, nside: number, frame: FrameName, mode: 'fraction' | 'centre'): RegionPixels {
  return { name, nside, frame, mode, full: true, index: new Uint32Array(0), fraction: new Float32Array(0), exposure: null,
    pixelCount: nside2npix(nside), solidAngleSr: 4 * Math.PI, notes: [] };
}
