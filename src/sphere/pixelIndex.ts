/**
 * Allocation-free scalar HEALPix index kernels: direction -> RING pixel, and
 * RING <-> NESTED. They follow the integer algorithms of Gorski et al. 2005
 * (ApJ 622, 759, section 4 and appendix) as laid out in the HEALPix C++ base
 * (face / x / y decomposition); they are tested pixel by pixel against
 * `@hscmap/healpix` and against healpy. Valid for Nside a power of two up to
 * 8192: every intermediate fits in a 32-bit integer.
 *
 * Kernels trust their inputs (valid Nside, finite angles, pixel in range);
 * callers validate once.
 */
import { TWO_PI } from '../core/math.js';

// Ring number offset (in units of Nside) and phi offset of each base face.
const JRLL = new Int32Array([2, 2, 2, 2, 3, 3, 3, 3, 4, 4, 4, 4]);
const JPLL = new Int32Array([1, 3, 5, 7, 0, 2, 4, 6, 1, 3, 5, 7]);

/**
 * RING pixel holding the direction with cos(colatitude) z, sin(colatitude) sth
 * and longitude phi (rad). Passing sth keeps the polar caps exact close to the
 * poles, where 1 - z loses digits.
 */
export function zPhiToRing(nside: number, z: number, sth: number, phi: number): number {
  const za = Math.abs(z);
  let tt = (phi % TWO_PI) / (Math.PI / 2);
  if (tt < 0) tt += 4;
  if (tt >= 4) tt -= 4;
  if (za <= 2 / 3) {
    const nl4 = 4 * nside;
    const t1 = nside * (0.5 + tt);
    const t2 = nside * z * 0.75;
    const jp = Math.floor(t1 - t2);
    const jm = Math.floor(t1 + t2);
    const ir = nside + 1 + jp - jm; // ring in the belt, 1 .. 2 nside + 1
    const kshift = 1 - (ir & 1);
    let ip = Math.floor((jp + jm - nside + kshift + 1) / 2);
    ip = ip % nl4;
    if (ip < 0) ip += nl4;
    return 2 * nside * (nside - 1) + (ir - 1) * nl4 + ip;
  }
  const tp = tt - Math.floor(tt);
  const tmp = za < 0.99 ? nside * Math.sqrt(3 * (1 - za)) : (nside * sth) / Math.sqrt((1 + za) / 3);
  const jp = Math.floor(tp * tmp);
  const jm = Math.floor((1 - tp) * tmp);
  const ir = jp + jm + 1; // ring counted from the nearer pole
  let ip = Math.floor(tt * ir);
  const n = 4 * ir;
  ip = ip % n;
  if (ip < 0) ip += n;
  return z > 0 ? 2 * ir * (ir - 1) + ip : 12 * nside * nside - 2 * ir * (ir + 1) + ip;
}

/** RING pixel holding the direction (theta, phi) in radians. */
export function angToRing(nside: number, theta: number, phi: number): number {
  return zPhiToRing(nside, Math.cos(theta), Math.sin(theta), phi);
}

function spreadBits(v: number): number {
  v = (v | (v << 8)) & 0x00ff00ff;
  v = (v | (v << 4)) & 0x0f0f0f0f;
  v = (v | (v << 2)) & 0x33333333;
  v = (v | (v << 1)) & 0x55555555;
  return v;
}

/**
 * The even-numbered bits of v (bits 0, 2, 4, ...) packed into the low 16 bits:
 * the inverse of bit interleaving, which gives x (or, for v >>> 1, y) of a
 * NESTED in-face index (Gorski et al. 2005, ApJ 622, 759, section 4).
 * Valid for 0 <= v < 2^32 (in-face indices up to Nside 2^16); allocation-free.
 */
export function compressBits(v: number): number {
  v &= 0x55555555;
  v = (v | (v >>> 1)) & 0x33333333;
  v = (v | (v >>> 2)) & 0x0f0f0f0f;
  v = (v | (v >>> 4)) & 0x00ff00ff;
  v = (v | (v >>> 8)) & 0x0000ffff;
  return v;
}

function isqrt(v: number): number {
  let r = Math.floor(Math.sqrt(v + 0.5));
  while (r * r > v) r--;
  while ((r + 1) * (r + 1) <= v) r++;
  return r;
}

/** NESTED index of the pixel with RING index pix. */
export function ringToNest(nside: number, pix: number): number {
  const npix = 12 * nside * nside;
  const ncap = 2 * nside * (nside - 1);
  const nl2 = 2 * nside;
  let iring: number, iphi: number, kshift: number, nr: number, face: number;
  if (pix < ncap) {
    iring = (1 + isqrt(1 + 2 * pix)) >> 1;
    iphi = pix + 1 - 2 * iring * (iring - 1);
    kshift = 0;
    nr = iring;
    face = Math.floor((iphi - 1) / nr);
  } else if (pix < npix - ncap) {
    const ip = pix - ncap;
    const tmp = Math.floor(ip / (4 * nside));
    iring = tmp + nside;
    iphi = ip - tmp * 4 * nside + 1;
    kshift = (iring + nside) & 1;
    nr = nside;
    const ire = tmp + 1;
    const irm = nl2 + 2 - ire;
    const ifm = Math.floor((iphi - (ire >> 1) + nside - 1) / nside);
    const ifp = Math.floor((iphi - (irm >> 1) + nside - 1) / nside);
    face = ifp === ifm ? ifp | 4 : ifp < ifm ? ifp : ifm + 8;
  } else {
    const ip = npix - pix;
    iring = (1 + isqrt(2 * ip - 1)) >> 1;
    iphi = 4 * iring + 1 - (ip - 2 * iring * (iring - 1));
    kshift = 0;
    nr = iring;
    iring = 2 * nl2 - iring;
    face = Math.floor((iphi - 1) / nr) + 8;
  }
  const irt = iring - JRLL[face] * nside + 1;
  let ipt = 2 * iphi - JPLL[face] * nr - kshift - 1;
  if (ipt >= nl2) ipt -= 8 * nside;
  const ix = (ipt - irt) >> 1;
  const iy = (-ipt - irt) >> 1;
  return face * nside * nside + spreadBits(ix) + 2 * spreadBits(iy);
}

/** RING index of the pixel with NESTED index pix. */
export function nestToRing(nside: number, pix: number): number {
  const n2 = nside * nside;
  const face = Math.floor(pix / n2);
  const inFace = pix - face * n2;
  const ix = compressBits(inFace);
  const iy = compressBits(inFace >>> 1);
  const nl4 = 4 * nside;
  const jr = JRLL[face] * nside - ix - iy - 1;
  let nr: number, before: number, kshift: number;
  if (jr < nside) {
    nr = jr;
    before = 2 * nr * (nr - 1);
    kshift = 0;
  } else if (jr > 3 * nside) {
    nr = nl4 - jr;
    before = 12 * n2 - 2 * (nr + 1) * nr;
    kshift = 0;
  } else {
    nr = nside;
    before = 2 * nside * (nside - 1) + (jr - nside) * nl4;
    kshift = (jr - nside) & 1;
  }
  let jp = (JPLL[face] * nr + ix - iy + 1 + kshift) >> 1;
  if (jp > nl4) jp -= nl4;
  else if (jp < 1) jp += nl4;
  return before + jp - 1;
}
