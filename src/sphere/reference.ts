/**
 * Per-pixel HEALPix reference API for rare calls, as thin wrappers of
 * `@hscmap/healpix` (an implementation of Gorski et al. 2005, ApJ 622, 759).
 * Each call allocates a small object, so loops over many pixels should use
 * `ringTable`, `pixelIndex` and `bulk` instead; tests use these wrappers as the
 * independent reference for those kernels.
 *
 * Limitation: within about 1e-6 rad of a pole @hscmap/healpix works from
 * z = cos(theta), which rounds to +-1, and returns the first pixel of the polar
 * ring whatever phi is; healpy and `pixelIndex.angToRing` keep phi there.
 */
import * as hp from '@hscmap/healpix';
import type { Ordering } from './nside.js';
import { TWO_PI } from '../core/math.js';

/** Centre (colatitude theta, longitude phi in [0, 2 pi), rad) of pixel pix. */
export function pixelToAngle(nside: number, ordering: Ordering, pix: number): { theta: number; phi: number } {
  const a = ordering === 'NESTED' ? hp.pix2ang_nest(nside, pix) : hp.pix2ang_ring(nside, pix);
  // @hscmap/healpix may return phi beyond 2 pi (e.g. Nside 1, pixel 0): wrap it.
  let phi = a.phi % TWO_PI;
  if (phi < 0) phi += TWO_PI;
  return { theta: a.theta, phi };
}

/** Pixel (in the given ordering) holding the direction (theta, phi) in rad; phi is wrapped first. */
export function angleToPixel(nside: number, ordering: Ordering, theta: number, phi: number): number {
  let p = phi % TWO_PI;
  if (p < 0) p += TWO_PI;
  return ordering === 'NESTED' ? hp.ang2pix_nest(nside, theta, p) : hp.ang2pix_ring(nside, theta, p);
}

/** NESTED index of RING pixel pix (reference, per call). */
export function ringToNestRef(nside: number, pix: number): number {
  return hp.ring2nest(nside, pix);
}

/** RING index of NESTED pixel pix (reference, per call). */
export function nestToRingRef(nside: number, pix: number): number {
  return hp.nest2ring(nside, pix);
}

/**
 * Pixels (sorted, in the given ordering) that overlap the disc of angular radius
 * radiusRad around (theta, phi). Inclusive: it may list some pixels that only
 * come close to the disc (as `@hscmap/healpix`'s query_disc_inclusive does).
 */
export function queryDiscInclusive(
  nside: number, ordering: Ordering, theta: number, phi: number, radiusRad: number,
): number[] {
  const v = hp.ang2vec(theta, phi);
  const out: number[] = [];
  if (ordering === 'NESTED') hp.query_disc_inclusive_nest(nside, v, radiusRad, (p) => out.push(p));
  else hp.query_disc_inclusive_ring(nside, v, radiusRad, (p) => out.push(p));
  return out.sort((a, b) => a - b);
}
