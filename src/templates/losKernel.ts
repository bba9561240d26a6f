/**
 * The line-of-sight hot loop: for every pixel centre of the rings given, sum
 * w_k q(R(s_k), z(s_k), E_e) over the quadrature samples s_k, with bilinear
 * interpolation of the tabulated model, optionally weighted by the survival
 * probability exp(-s_k / lambda(E_e)). Plain typed arrays in and out; no
 * allocation per pixel or sample. Used by the main thread and by losWorker.ts.
 *
 * Geometry (Galactic frame, pixel theta = colatitude, phi = longitude l):
 * Galactic centre at the origin, the Sun at (R_sun, 0, z_sun), the direction
 * (l, b) is (-cos b cos l, -cos b sin l, sin b), so l = 0 points at the centre.
 */
import { ringTable } from '../sphere/ringTable.js';

/** Everything the kernel reads and writes (all shareable between threads). */
export interface KernelInput {
  nside: number;
  rSunKpc: number;
  zSunKpc: number;
  nR: number;
  nU: number;
  nE: number;
  dRKpc: number;
  zScaleKpc: number;
  /** Model values[((iR * nU) + iU) * nE + e]. */
  values: Float32Array;
  sKpc: Float64Array;
  wKpc: Float64Array;
  /** exp(-s_k / lambda_e) at [k * nE + e], or null without absorption. */
  survival: Float64Array | null;
  /** Output, plane-major [e * npix + pix]: the (absorbed) integral in model units x kpc. */
  out: Float64Array;
  /** Output with absorption: the unabsorbed integral, same layout. */
  outPlain: Float64Array | null;
}

/**
 * One line of sight toward the direction with the given cos/sin of b and l:
 * fills acc[e] with the (absorbed) sum and accPlain[e] with the unabsorbed sum
 * (model units x kpc). acc and accPlain hold nE values each.
 */
export function losIntegral(k: KernelInput, cosB: number, sinB: number, cosL: number, sinL: number,
  acc: Float64Array, accPlain: Float64Array): void {
  const { nR, nU, nE, values, sKpc, wKpc, survival } = k;
  const invDR = 1 / k.dRKpc, zs = k.zScaleKpc, invDu = (nU - 1) / 2;
  const rSun = k.rSunKpc, zSun = k.zSunKpc;
  const nS = sKpc.length, strideR = nU * nE;
  const dx = -cosB * cosL, dy = -cosB * sinL;
  for (let e = 0; e < nE; e++) { acc[e] = 0; accPlain[e] = 0; }
  for (let i = 0; i < nS; i++) {
    const s = sKpc[i];
    const x = rSun + s * dx, y = s * dy, z = zSun + s * sinB;
    const fr = Math.sqrt(x * x + y * y) * invDR;
    const iR = fr | 0;
    if (iR >= nR - 1) continue;
    const tr = fr - iR;
    const fu = (z / (Math.abs(z) + zs) + 1) * invDu;
    let iU = fu | 0;
    if (iU > nU - 2) iU = nU - 2;
    const tu = fu - iU;
    const w = wKpc[i];
    const w00 = w * (1 - tr) * (1 - tu), w01 = w * (1 - tr) * tu, w10 = w * tr * (1 - tu), w11 = w * tr * tu;
    const b00 = iR * strideR + iU * nE, b10 = b00 + strideR;
    if (survival === null) {
      for (let e = 0; e < nE; e++) {
        acc[e] += w00 * values[b00 + e] + w01 * values[b00 + nE + e] + w10 * values[b10 + e] + w11 * values[b10 + nE + e];
      }
    } else {
      const sb0 = i * nE;
      for (let e = 0; e < nE; e++) {
        const v = w00 * values[b00 + e] + w01 * values[b00 + nE + e] + w10 * values[b10 + e] + w11 * values[b10 + nE + e];
        accPlain[e] += v;
        acc[e] += v * survival[sb0 + e];
      }
    }
  }
  if (survival === null) for (let e = 0; e < nE; e++) accPlain[e] = acc[e];
}

/**
 * The shift of a ring whose pixels sit at phi0 + j dphi: 2 phi0 / dphi, which
 * is 0 or 1 in the RING scheme (phi0 is 0 or dphi / 2; Gorski et al. 2005,
 * ApJ 622, 759, eqs. 8-9). One per ring, for {@link mirrorInRing}.
 */
export function ringShift(phi0: number, dphi: number): number {
  return Math.round((2 * phi0) / dphi);
}

/**
 * Index of the pixel mirrored in longitude (phi -> 2 pi - phi) within a ring
 * of `len` pixels with shift `shift` ({@link ringShift}): len - j (mod len)
 * for shift 0, len - 1 - j for shift 1.
 */
export function mirrorInRing(j: number, len: number, shift: number): number {
  return (len - shift - j + len) % len;
}

/**
 * Integrates rings ringFrom, ringFrom + ringStride, ... (0-based, RING scheme)
 * into k.out (and k.outPlain); calls onRing after each ring (for progress).
 *
 * The model is axisymmetric and the observer sits at y = 0, so the line of
 * sight toward (l, b) meets the same (R, z) as toward (-l, b): each ring is
 * mirror-symmetric in longitude, and only the pixels with mirror index >= j
 * are integrated; the others copy their mirror (half the work).
 */
export function integrateRings(k: KernelInput, ringFrom: number, ringStride: number, onRing?: (pixels: number) => void): void {
  const t = ringTable(k.nside);
  const npix = 12 * k.nside * k.nside;
  const { nE, out, outPlain } = k;
  const acc = new Float64Array(nE), accPlain = new Float64Array(nE);
  for (let r = ringFrom; r < t.count; r += ringStride) {
    const cb = t.sinTheta[r], sb = t.z[r], phi0 = t.phi0[r], dphi = t.dphi[r];
    const first = t.first[r], len = t.length[r], shift = ringShift(phi0, dphi);
    for (let j = 0; j < len; j++) {
      const pix = first + j;
      const m = mirrorInRing(j, len, shift);
      if (m < j) {
        const src = first + m;
        for (let e = 0; e < nE; e++) {
          out[e * npix + pix] = out[e * npix + src];
          if (outPlain !== null) outPlain[e * npix + pix] = outPlain[e * npix + src];
        }
        continue;
      }
      const phi = phi0 + j * dphi;
      losIntegral(k, cb, sb, Math.cos(phi), Math.sin(phi), acc, accPlain);
      for (let e = 0; e < nE; e++) {
        out[e * npix + pix] = acc[e];
        if (outPlain !== null) outPlain[e * npix + pix] = accPlain[e];
      }
    }
    if (onRing) onRing(len);
  }
}
