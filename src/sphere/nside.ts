/**
 * HEALPix resolution parameter: validation, pixel counts, pixel area and
 * resolution (Gorski et al. 2005, ApJ 622, 759, section 4).
 */
import { InputError, type InputLocation } from '../core/errors.js';

/** Largest Nside skyspan accepts (12 * 8192^2 pixels still index in a Uint32Array). */
export const MAX_NSIDE = 8192;

/** Pixel-ordering schemes of the HEALPix convention. */
export type Ordering = 'RING' | 'NESTED';

/** True when nside is a power of two from 1 to {@link MAX_NSIDE}. */
export function isValidNside(nside: number): boolean {
  return Number.isInteger(nside) && nside >= 1 && nside <= MAX_NSIDE && (nside & (nside - 1)) === 0;
}

/** Throws an {@link InputError} naming the location unless nside is valid. */
export function assertNside(nside: number, where: InputLocation = {}): void {
  if (!isValidNside(nside)) {
    throw new InputError(`NSIDE is ${nside}, expected a power of two from 1 to ${MAX_NSIDE}`, where);
  }
}

/** Number of pixels, 12 Nside^2. */
export function nside2npix(nside: number): number {
  return 12 * nside * nside;
}

/** Nside from a pixel count, or NaN when the count is not 12 Nside^2 for a valid Nside. */
export function npix2nside(npix: number): number {
  const nside = Math.round(Math.sqrt(npix / 12));
  return nside2npix(nside) === npix && isValidNside(nside) ? nside : NaN;
}

/** Solid angle of one pixel in sr: 4 pi / (12 Nside^2) (all pixels have equal area). */
export function pixelAreaSr(nside: number): number {
  return (4 * Math.PI) / nside2npix(nside);
}

/** Resolution as the square root of the pixel area, in radians. */
export function resolutionRad(nside: number): number {
  return Math.sqrt(pixelAreaSr(nside));
}
