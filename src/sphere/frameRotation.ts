/**
 * Rotation between the equatorial (ICRS, J2000 axes) and Galactic frames.
 *
 * The ICRS -> Galactic matrix is the one tabulated in the Hipparcos catalogue
 * (ESA 1997, The Hipparcos and Tycho Catalogues, vol. 1, section 1.5.3),
 * r_gal = A r_icrs, rows (from memory, checked against astropy 5.2 to 1e-7 and
 * healpy 1.16 to 4e-8 by scripts/astropy_frames.py):
 *
 *   -0.0548755604  -0.8734370902  -0.4838350155
 *   +0.4941094279  -0.4448296300  +0.7469822445
 *   -0.8676661490  -0.1980763734  +0.4559837762
 *
 * Its rows are the Galactic x axis (the Galactic centre), y axis (l = 90 deg) and
 * z axis (the North Galactic Pole) in ICRS. Rounded to ten digits, the printed
 * matrix is orthogonal only to 1.1e-10; we make it exactly orthogonal (to
 * rounding) by the symmetric orthogonalisation A (A^T A)^(-1/2) (Bjorck & Bowie
 * 1971, SIAM J. Numer. Anal. 8, 358, iteration X <- X (3 I - X^T X) / 2), which
 * moves directions by less than 1e-10 rad (2e-5 arcsec) and lets the inverse be
 * the transpose, so round trips close to 1e-15 rad.
 */
import { InputError } from '../core/errors.js';
import { TWO_PI } from '../core/math.js';
import type { FrameName } from './frames.js';

/** The Hipparcos ICRS -> Galactic matrix as printed (row-major), before orthogonalisation. */
export const HIPPARCOS_ICRS_TO_GALACTIC: readonly number[] = Object.freeze([
  -0.0548755604, -0.8734370902, -0.4838350155,
  +0.4941094279, -0.4448296300, +0.7469822445,
  -0.8676661490, -0.1980763734, +0.4559837762,
]);

function orthogonalise(a: readonly number[]): Float64Array {
  let x = Float64Array.from(a);
  for (let it = 0; it < 4; it++) {
    // g = x^T x
    const g = new Float64Array(9);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
      g[3 * i + j] = x[i] * x[j] + x[3 + i] * x[3 + j] + x[6 + i] * x[6 + j];
    }
    const next = new Float64Array(9);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
      let s = 0;
      for (let k = 0; k < 3; k++) s += x[3 * i + k] * ((k === j ? 3 : 0) - g[3 * k + j]);
      next[3 * i + j] = s / 2;
    }
    x = next;
  }
  return x;
}

const EQ_TO_GAL = orthogonalise(HIPPARCOS_ICRS_TO_GALACTIC);
const GAL_TO_EQ = transpose(EQ_TO_GAL);
const IDENTITY = new Float64Array([1, 0, 0, 0, 1, 0, 0, 0, 1]);

function transpose(m: Float64Array): Float64Array {
  return new Float64Array([m[0], m[3], m[6], m[1], m[4], m[7], m[2], m[5], m[8]]);
}

function checkFrame(f: FrameName, role: string): void {
  if (f !== 'galactic' && f !== 'equatorial') {
    throw new InputError(`the ${role} frame is '${f}', expected 'galactic' or 'equatorial'`, {},
      'give the map frame explicitly (files without COORDSYS read as unknown)');
  }
}

/**
 * The 3x3 rotation (row-major, a fresh copy) taking unit vectors in frame `from`
 * to frame `to`: v_to = M v_from. Identity when the frames are equal. Throws an
 * {@link InputError} for the frame 'unknown'.
 *
 * @example
 * const m = rotationMatrix('equatorial', 'galactic');
 * m[0]; // -0.05487556... (x of the Galactic centre in ICRS)
 */
export function rotationMatrix(from: FrameName, to: FrameName): Float64Array {
  checkFrame(from, 'source');
  checkFrame(to, 'target');
  if (from === to) return IDENTITY.slice();
  return (from === 'equatorial' ? EQ_TO_GAL : GAL_TO_EQ).slice();
}

/**
 * Rotates n directions given as colatitude theta and longitude phi (rad) by the
 * row-major matrix m: outTheta in [0, pi], outPhi in [0, 2 pi). Allocation-free;
 * the output arrays may be the input arrays.
 */
export function rotateThetaPhi(
  m: ArrayLike<number>, theta: ArrayLike<number>, phi: ArrayLike<number>,
  outTheta: Float64Array, outPhi: Float64Array, n: number = outTheta.length,
): void {
  const m0 = m[0], m1 = m[1], m2 = m[2], m3 = m[3], m4 = m[4], m5 = m[5], m6 = m[6], m7 = m[7], m8 = m[8];
  for (let i = 0; i < n; i++) {
    const th = theta[i], ph = phi[i];
    const st = Math.sin(th);
    const x = st * Math.cos(ph), y = st * Math.sin(ph), z = Math.cos(th);
    const xr = m0 * x + m1 * y + m2 * z;
    const yr = m3 * x + m4 * y + m5 * z;
    const zr = m6 * x + m7 * y + m8 * z;
    outTheta[i] = Math.atan2(Math.sqrt(xr * xr + yr * yr), zr);
    let p = Math.atan2(yr, xr);
    if (p < 0) p += TWO_PI;
    if (p >= TWO_PI) p -= TWO_PI;
    outPhi[i] = p;
  }
}

/**
 * Converts one direction given as longitude and latitude (rad: RA/Dec in the
 * equatorial frame, l/b in the Galactic frame) from frame `from` to `to`.
 * For rare calls; use {@link rotateThetaPhi} in loops. lonRad in [0, 2 pi).
 *
 * @example
 * // Galactic centre -> (RA 266.40500 deg, Dec -28.93617 deg)
 * convertLonLat(0, 0, 'galactic', 'equatorial');
 */
export function convertLonLat(
  lonRad: number, latRad: number, from: FrameName, to: FrameName,
): { lonRad: number; latRad: number } {
  const m = rotationMatrix(from, to);
  const cb = Math.cos(latRad);
  const x = cb * Math.cos(lonRad), y = cb * Math.sin(lonRad), z = Math.sin(latRad);
  const xr = m[0] * x + m[1] * y + m[2] * z;
  const yr = m[3] * x + m[4] * y + m[5] * z;
  const zr = m[6] * x + m[7] * y + m[8] * z;
  let lon = Math.atan2(yr, xr);
  if (lon < 0) lon += TWO_PI;
  if (lon >= TWO_PI) lon -= TWO_PI;
  return { lonRad: lon, latRad: Math.atan2(zr, Math.sqrt(xr * xr + yr * yr)) };
}
