/**
 * Cosmic-ray density from a source radial law, spread by a diffusion halo.
 *
 * The model (a simple one, chosen here; common practice, no source): cosmic
 * rays released by sources in the disc diffuse over a distance of the order of
 * the halo height H before escaping, so
 *   rho(R, z) = S_H(R) / S_H(R_sun) * v(z),
 * where S_H is the source law smoothed in the Galactic plane by a 2D Gaussian
 * of width sigma = H, and v(z) = max(0, 1 - |z|/H) ('linear': steady diffusion
 * from a thin source disc with free escape at |z| = H) or exp(-|z|/H)
 * ('exponential'). rho = 1 at the Sun.
 *
 * For an axisymmetric S the 2D smoothing reduces to
 *   S_H(R) = int S(R') (R'/sigma^2) exp(-(R - R')^2 / (2 sigma^2)) I0e(R R'/sigma^2) dR',
 * with I0e(x) = exp(-x) I0(x) (the angular integral of the Gaussian is 2 pi I0).
 */
import { radialLaw, type RadialLawParams } from './radialLaws.js';

/**
 * Exponentially scaled modified Bessel function exp(-x) I0(x), x >= 0, by the
 * polynomial approximations of Abramowitz & Stegun 1964, eqs. 9.8.1 and 9.8.2
 * (coefficients from memory; agree with scipy.special.i0e to 5e-7 relative in the tests).
 */
export function besselI0e(x: number): number {
  if (x < 3.75) {
    const t = (x / 3.75) ** 2;
    const i0 = 1 + t * (3.5156229 + t * (3.0899424 + t * (1.2067492 + t * (0.2659732 + t * (0.0360768 + t * 0.0045813)))));
    return i0 * Math.exp(-x);
  }
  const t = 3.75 / x;
  const p = 0.39894228 + t * (0.01328592 + t * (0.00225319 + t * (-0.00157565 + t * (0.00916281
    + t * (-0.02057706 + t * (0.02635537 + t * (-0.01647633 + t * 0.00392377)))))));
  return p / Math.sqrt(x);
}

/**
 * The smoothed source law S_H(R) at each radius of rKpc (trapezoid rule in R'
 * with step sigma/40, at most 0.02 kpc, over |R - R'| < 7 sigma), divided by its
 * value at rSunKpc.
 */
export function smoothedRadialProfile(law: RadialLawParams, rSunKpc: number, sigmaKpc: number, rKpc: Float64Array): Float64Array {
  const step = Math.min(0.02, sigmaKpc / 40);
  const smooth = (r: number): number => {
    const lo = Math.max(0, r - 7 * sigmaKpc), hi = r + 7 * sigmaKpc;
    const n = Math.max(2, Math.ceil((hi - lo) / step));
    const h = (hi - lo) / n, s2 = sigmaKpc * sigmaKpc;
    let sum = 0;
    for (let i = 0; i <= n; i++) {
      const rp = lo + i * h;
      const d = r - rp;
      const f = radialLaw(law, rp, rSunKpc) * (rp / s2) * Math.exp(-(d * d) / (2 * s2)) * besselI0e((r * rp) / s2);
      sum += i === 0 || i === n ? f / 2 : f;
    }
    return sum * h;
  };
  const norm = smooth(rSunKpc);
  const out = new Float64Array(rKpc.length);
  for (let i = 0; i < rKpc.length; i++) out[i] = smooth(rKpc[i]) / norm;
  return out;
}

/** Vertical factor of the cosmic-ray halo (see module doc). */
export function haloVertical(profile: 'linear' | 'exponential', zKpc: number, haloHeightKpc: number): number {
  const a = Math.abs(zKpc) / haloHeightKpc;
  return profile === 'linear' ? Math.max(0, 1 - a) : Math.exp(-a);
}
