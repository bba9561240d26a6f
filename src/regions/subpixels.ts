/**
 * Centres of NESTED sub-pixels, addressed by base face and (ix, iy) inside the
 * face, at any Nside up to 2^24: the pixel-to-position step of the HEALPix
 * NESTED scheme (Gorski et al. 2005, ApJ 622, 759, section 4; the face
 * layout as in the HEALPix C++ base). Pixel (face, ix, iy) at Nside n has the
 * four children (face, 2 ix + a, 2 iy + b), a, b in {0, 1}, at Nside 2n,
 * which is how fractional coverage descends into a pixel.
 *
 * Plain arithmetic (no 32-bit bit operations), so sub-pixel Nsides beyond
 * 8192 are fine.
 */
import { compressBits, ringToNest } from '../sphere/pixelIndex.js';

const JRLL = [2, 2, 2, 2, 3, 3, 3, 3, 4, 4, 4, 4];
const JPLL = [1, 3, 5, 7, 0, 2, 4, 6, 1, 3, 5, 7];

/**
 * Writes cos(colatitude), sin(colatitude) and longitude (rad, [0, 2 pi)) of
 * the centre of pixel (face, ix, iy) at Nside nside into out[0..2].
 */
export function subpixelCentre(face: number, ix: number, iy: number, nside: number, out: Float64Array): void {
  const jr = JRLL[face] * nside - ix - iy - 1; // ring number, 1 .. 4 nside - 1
  let nr: number, z: number, st: number, kshift: number;
  if (jr < nside) {
    nr = jr;
    const u = (nr * nr) / (3 * nside * nside);
    z = 1 - u; st = Math.sqrt(u * (2 - u)); kshift = 0;
  } else if (jr > 3 * nside) {
    nr = 4 * nside - jr;
    const u = (nr * nr) / (3 * nside * nside);
    z = u - 1; st = Math.sqrt(u * (2 - u)); kshift = 0;
  } else {
    nr = nside;
    z = ((2 * nside - jr) * 2) / (3 * nside);
    st = Math.sqrt((1 - z) * (1 + z));
    kshift = (jr - nside) % 2;
  }
  let jp = (JPLL[face] * nr + ix - iy + 1 + kshift) / 2;
  if (jp > 4 * nr) jp -= 4 * nr;
  else if (jp < 1) jp += 4 * nr;
  out[0] = z;
  out[1] = st;
  out[2] = (jp - (kshift + 1) * 0.5) * ((Math.PI / 2) / nr);
}

/**
 * Face and (ix, iy) of the RING pixel `ring` at Nside nside (at most 8192),
 * written into out[0..2].
 */
export function ringToFaceXY(nside: number, ring: number, out: Float64Array): void {
  const nest = ringToNest(nside, ring);
  const n2 = nside * nside;
  const face = Math.floor(nest / n2);
  const inFace = nest - face * n2;
  out[0] = face;
  out[1] = compressBits(inFace);
  out[2] = compressBits(inFace >>> 1);
}

/** Ratio of {@link pixelRadiusBound} to the resolution sqrt(pi/3)/nside. */
export const RADIUS_PER_RESOLUTION = 1.1;

/**
 * Upper bound (rad) on the angular distance from a pixel centre to any point
 * of the pixel at Nside nside: 1.1 times the resolution sqrt(pi/3)/nside.
 * healpy's max_pixrad (largest centre-to-corner distance) is at most 1.0446
 * times the resolution for every Nside (computed with healpy 1.16, Nside 1 to
 * 8192); points sampled densely along pixel edges stay below 1.03 times it
 * (test/regions/subpixels.test.ts).
 */
export function pixelRadiusBound(nside: number): number {
  return (RADIUS_PER_RESOLUTION * Math.sqrt(Math.PI / 3)) / nside;
}
