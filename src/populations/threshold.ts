/**
 * Which sources a survey resolves. A source is resolved when its flux at the
 * pivot exceeds the survey's threshold at its position:
 *  - 'exposure': S_th(delta) = S_ref x omega(delta_ref) / omega(delta), omega the
 *    relative exposure of a ground site (Sommers 2001, Astropart. Phys. 14, 271,
 *    eq. 2; regions/exposure.ts). A flux threshold scaling as 1/exposure is the
 *    background-free limit; with background it goes as 1/sqrt(exposure), which
 *    `exposurePower` 0.5 selects (common practice, no source). Zero exposure:
 *    never resolved.
 *  - 'map': a user's HEALPix map of the threshold (erg cm^-2 s^-1, E0^2 dN/dE);
 *    blank, zero or negative pixels: never resolved.
 *  - 'none': nothing is resolved (a neutrino analysis of the plane).
 * Extension penalty for a source of angular radius r with a point-spread width
 * psf: S_th x max(1, sqrt(r^2 + psf^2) / psf), the growth of a background-limited
 * threshold with the radius of the integration region (common practice, no source).
 */
import { isBlank } from '../maps/blank.js';
import type { SkyMap } from '../maps/skyMap.js';
import { relativeExposure, type ExposureWeighting } from '../regions/exposure.js';
import type { SourceRealisation } from './realise.js';
import { sourceLonLat, sourcePixels } from './sourcePixels.js';

/** A survey's detection threshold (fluxes E0^2 dN/dE at the population's pivot, erg cm^-2 s^-1; angles rad). */
export type DetectionThreshold =
  | {
      kind: 'exposure'; fluxErgCm2S: number; referenceDecRad: number; siteLatRad: number; maxZenithRad: number;
      weighting: ExposureWeighting; exposurePower: number; psfRad: number | null;
    }
  | { kind: 'map'; map: SkyMap; psfRad: number | null; file?: string }
  | { kind: 'none' };

/** Threshold (erg cm^-2 s^-1) at every source's position; Infinity where it cannot be resolved. */
export function thresholdsOf(r: SourceRealisation, t: DetectionThreshold): Float64Array {
  const n = r.count, out = new Float64Array(n);
  if (t.kind === 'none') { out.fill(Infinity); return out; }
  if (t.kind === 'exposure') {
    const ref = relativeExposure(t.referenceDecRad, t.siteLatRad, t.maxZenithRad, t.weighting);
    const { lat } = sourceLonLat(r, 'equatorial');
    for (let i = 0; i < n; i++) {
      const e = relativeExposure(lat[i], t.siteLatRad, t.maxZenithRad, t.weighting);
      out[i] = e > 0 && ref > 0 ? t.fluxErgCm2S * Math.pow(ref / e, t.exposurePower) : Infinity;
    }
  } else {
    const m = t.map, plane = m.planes[0];
    const pix = sourcePixels(r, m.nside, m.frame === 'unknown' ? 'galactic' : m.frame, m.ordering);
    for (let i = 0; i < n; i++) {
      const v = plane[pix[i]];
      out[i] = isBlank(v) || !(v > 0) ? Infinity : v;
    }
  }
  const psf = t.psfRad, rad = r.radiusRad;
  if (psf !== null && psf > 0 && rad) {
    for (let i = 0; i < n; i++) {
      const g = Math.sqrt(rad[i] * rad[i] + psf * psf) / psf;
      if (g > 1) out[i] *= g;
    }
  }
  return out;
}

/** 1 where the source's flux exceeds its threshold, else 0. */
export function resolvedFlags(r: SourceRealisation, t: DetectionThreshold): Uint8Array {
  const th = thresholdsOf(r, t), out = new Uint8Array(r.count);
  for (let i = 0; i < r.count; i++) out[i] = r.fluxErgCm2S[i] > th[i] ? 1 : 0;
  return out;
}
