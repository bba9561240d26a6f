/**
 * Where the sources of a realisation fall: their RING (or NESTED) pixel in a
 * frame, their declination, and their weight in a region (the region's
 * covered fraction, optionally times its relative exposure, at the source's
 * pixel). Plain loops over the typed arrays.
 */
import { rotationMatrix } from '../sphere/frameRotation.js';
import type { FrameName } from '../sphere/frames.js';
import type { Ordering } from '../sphere/nside.js';
import { angToRing, ringToNest } from '../sphere/pixelIndex.js';
import type { RegionWeights } from '../regions/types.js';
import type { SourceRealisation } from './realise.js';

/** Latitude and longitude of every source in `frame` (rad), by the frame rotation (sphere/frameRotation.ts). */
export function sourceLonLat(r: SourceRealisation, frame: FrameName): { lon: Float64Array; lat: Float64Array } {
  if (frame === 'galactic') return { lon: r.lRad, lat: r.bRad };
  const m = rotationMatrix('galactic', frame), n = r.count;
  const lon = new Float64Array(n), lat = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const cb = Math.cos(r.bRad[i]);
    const x = cb * Math.cos(r.lRad[i]), y = cb * Math.sin(r.lRad[i]), z = Math.sin(r.bRad[i]);
    const xr = m[0] * x + m[1] * y + m[2] * z, yr = m[3] * x + m[4] * y + m[5] * z, zr = m[6] * x + m[7] * y + m[8] * z;
    let p = Math.atan2(yr, xr);
    if (p < 0) p += 2 * Math.PI;
    lon[i] = p;
    lat[i] = Math.atan2(zr, Math.sqrt(xr * xr + yr * yr));
  }
  return { lon, lat };
}

/** Pixel of every source at nside in `frame` and `ordering` (HEALPix pixel of the direction). */
export function sourcePixels(r: SourceRealisation, nside: number, frame: FrameName, ordering: Ordering = 'RING'): Int32Array {
  const { lon, lat } = sourceLonLat(r, frame), out = new Int32Array(r.count);
  for (let i = 0; i < r.count; i++) {
    const p = angToRing(nside, Math.PI / 2 - lat[i], lon[i]);
    out[i] = ordering === 'NESTED' ? ringToNest(nside, p) : p;
  }
  return out;
}

/**
 * Weight of every source in a region: fraction[pix] (and times exposure[pix]
 * when `exposureWeighted` and the region has one). Returns the weights and the
 * matching solid angle sum_pix fraction (x exposure) x pixel area (sr), so
 * that sum_i w_i phi_i / solidAngle is the region's (exposure-weighted) mean
 * intensity of the sources.
 */
export function regionWeightsOfSources(r: SourceRealisation, region: RegionWeights, exposureWeighted = false): { weight: Float32Array; solidAngleSr: number } {
  const pix = sourcePixels(r, region.nside, region.frame, 'RING');
  const w = new Float32Array(r.count), f = region.fraction, ex = exposureWeighted ? region.exposure : null;
  for (let i = 0; i < r.count; i++) w[i] = ex ? f[pix[i]] * ex[pix[i]] : f[pix[i]];
  let solid = region.solidAngleSr;
  if (ex) {
    let s = 0;
    for (let p = 0; p < f.length; p++) s += f[p] * ex[p];
    solid = (s * 4 * Math.PI) / f.length;
  }
  return { weight: w, solidAngleSr: solid };
}
