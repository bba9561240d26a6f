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
  /** Covered fraction of each listed pixel. */
  readonly fraction: Float32Array;
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
  let n = 0, allOne = e === null;
  let sum = 0, comp = 0; // Neumaier (1974) compensated sum of the fractions
  for (let p = 0; p < npix; p++) {
    const v = f[p];
    if (!(v >= 0 && v <= 1)) {
      throw new ComputeError(`region '${w.name}': covered fraction ${v} at RING pixel ${p} is outside 0..1`);
    }
    if (v > 0) {
      n++;
      const t = sum + v;
      if (Math.abs(sum) >= v) comp += (sum - t) + v; else comp += (v - t) + sum;
      sum = t;
    }
    if (v !== 1) allOne = false;
  }
  const base = { name: w.name, nside: w.nside, frame: w.frame, mode: w.mode, notes: [...w.notes] };
  if (allOne) return { ...wholeSkyPixels(w.name, w.nside, w.frame, w.mode), notes: base.notes };
  const index = new Uint32Array(n);
  const fraction = new Float32Array(n);
  const exposure = e ? new Float32Array(n) : null;
  let k = 0;
  for (let p = 0; p < npix; p++) {
    const v = f[p];
    if (v > 0) {
      index[k] = p;
      fraction[k] = v;
      if (exposure) {
        const x = e![p];
        if (!(x >= 0 && x < Infinity)) {
          throw new ComputeError(`region '${w.name}': exposure ${x} at RING pixel ${p} is negative or not finite`);
        }
        exposure[k] = x;
      }
      k++;
    }
  }
  const pixelCount = sum + comp;
  return { ...base, full: false, index, fraction, exposure, pixelCount, solidAngleSr: pixelCount * pixelAreaSr(w.nside) };
}

/** The whole sky as {@link RegionPixels} (full, unweighted), without any per-pixel array. */
export function wholeSkyPixels(name: string, nside: number, frame: FrameName, mode: 'fraction' | 'centre'): RegionPixels {
  return { name, nside, frame, mode, full: true, index: new Uint32Array(0), fraction: new Float32Array(0), exposure: null,
    pixelCount: nside2npix(nside), solidAngleSr: 4 * Math.PI, notes: [] };
}
