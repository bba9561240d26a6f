/**
 * Changing the Nside of a map. In the NESTED scheme the 4^k pixels of Nside
 * N 2^k inside one pixel of Nside N are contiguous (Gorski et al. 2005, ApJ 622,
 * 759, section 4), so degrading is a sum over runs of 4^k values and upgrading
 * a copy into them.
 *
 * - intensive quantities (intensities, column densities): a degraded pixel is
 *   the mean of its non-blank children; an upgraded child takes its parent's
 *   value. This is healpy.ud_grade with power 0 (pess=False).
 * - extensive quantities (counts per pixel): a degraded pixel is the sum of its
 *   non-blank children, with no correction for blank ones (divide by the
 *   filled fraction to extrapolate them); an upgraded child gets its parent's
 *   value / 4^k. Without blanks this is healpy.ud_grade with power -2.
 *
 * A pixel with no non-blank child is blank. The filled fraction of an output
 * pixel is the fraction of its input area that was not blank (1 or 0 when
 * upgrading).
 */
import { InputError } from '../core/errors.js';
import { assertNside, nside2npix } from '../sphere/nside.js';
import { nestToRing } from '../sphere/pixelIndex.js';
import { BLANK, type MapArray, type SkyMap } from './skyMap.js';
import { isBlank } from './blank.js';
import { newPlaneLike } from './create.js';

/** How pixel values combine when pixels merge or split. */
export type QuantityKind = 'intensive' | 'extensive';

/** A resampled map and the filled fraction of each of its pixels (in its ordering). */
export interface ResampleResult {
  map: SkyMap;
  /** Filled fraction of the first plane (the usual case: all planes share their blanks). */
  filledFraction: Float32Array;
  /** Filled fraction of every plane. */
  filledFractionByPlane: Float32Array[];
}

function storageIndex(nside: number, nested: boolean): Uint32Array | null {
  if (nested) return null;
  const n = nside2npix(nside);
  const idx = new Uint32Array(n);
  for (let q = 0; q < n; q++) idx[q] = nestToRing(nside, q);
  return idx;
}

/**
 * Resamples every plane of `map` to Nside nsideOut (see module doc for the
 * rules). The output keeps the map's ordering, frame, unit and element type.
 * Throws {@link InputError} for an invalid nsideOut or quantity.
 *
 * @example
 * const { map: coarse, filledFraction } = resample(fine, 64, { quantity: 'intensive' });
 */
export function resample(map: SkyMap, nsideOut: number, options: { quantity: QuantityKind }): ResampleResult {
  assertNside(nsideOut, { keyPath: 'nsideOut' });
  const quantity = options.quantity;
  if (quantity !== 'intensive' && quantity !== 'extensive') {
    throw new InputError(`quantity is '${String(quantity)}', expected 'intensive' or 'extensive'`, { keyPath: 'quantity' });
  }
  const nested = map.ordering === 'NESTED';
  const nIn = map.nside, npixIn = nside2npix(nIn), npixOut = nside2npix(nsideOut);
  const inIdx = storageIndex(nIn, nested);
  const outIdx = nsideOut === nIn ? inIdx : storageIndex(nsideOut, nested);
  const planes: MapArray[] = [];
  const fractions: Float32Array[] = [];
  for (const p of map.planes) {
    const out = newPlaneLike(p, npixOut);
    const frac = new Float32Array(npixOut);
    if (nsideOut <= nIn) {
      const k = npixIn / npixOut; // 4^k children per output pixel
      for (let q = 0; q < npixOut; q++) {
        let sum = 0, valid = 0;
        const c0 = q * k;
        for (let c = c0; c < c0 + k; c++) {
          const v = p[inIdx ? inIdx[c] : c];
          if (isBlank(v)) continue;
          sum += v;
          valid++;
        }
        const o = outIdx ? outIdx[q] : q;
        frac[o] = valid / k;
        out[o] = valid === 0 ? BLANK : quantity === 'intensive' ? sum / valid : sum;
      }
    } else {
      const k = npixOut / npixIn;
      const scale = quantity === 'intensive' ? 1 : 1 / k;
      for (let q = 0; q < npixIn; q++) {
        const v = p[inIdx ? inIdx[q] : q];
        const blank = isBlank(v);
        const val = blank ? BLANK : v * scale;
        const c0 = q * k;
        for (let c = c0; c < c0 + k; c++) {
          const o = outIdx ? outIdx[c] : c;
          out[o] = val;
          frac[o] = blank ? 0 : 1;
        }
      }
    }
    planes.push(out);
    fractions.push(frac);
  }
  return {
    map: { ...map, nside: nsideOut, planes },
    filledFraction: fractions[0],
    filledFractionByPlane: fractions,
  };
}
