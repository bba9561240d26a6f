/**
 * Analytic gas densities (hydrogen atoms or molecules per cm^3) in
 * Galactocentric cylindrical coordinates: R and z in kpc, axisymmetric.
 * Every scalar function takes (rKpc, zKpc) and returns cm^-3.
 */

/**
 * Dickey & Lockman 1990 (ARA&A 28, 215) vertical HI profile near the Sun, as
 * given in Ferriere 2001 (Rev. Mod. Phys. 73, 1031), eq. 8 (from memory):
 * n(z) = 0.395 exp(-z^2 / (2 (90 pc)^2)) + 0.107 exp(-z^2 / (2 (225 pc)^2))
 *        + 0.064 exp(-|z| / 403 pc) cm^-3.
 * Column to one pole: sqrt(pi/2) (0.395 * 90 + 0.107 * 225) pc cm^-3 + 0.064 * 403 pc cm^-3 = 3.10e20 cm^-2.
 */
export function dickeyLockmanCm3(zKpc: number): number {
  const z = zKpc;
  return 0.395 * Math.exp(-(z * z) / (2 * 0.09 * 0.09))
    + 0.107 * Math.exp(-(z * z) / (2 * 0.225 * 0.225))
    + 0.064 * Math.exp(-Math.abs(z) / 0.403);
}

/** Shape parameters of the Dickey-Lockman disc with a radial law and flaring. */
export interface HiDiscParams {
  rSunKpc: number;
  /** Inside this radius the midplane density falls as exp(-(holeRadius - R)/holeScale). */
  holeRadiusKpc: number;
  holeScaleKpc: number;
  /** Beyond the Sun the midplane density falls as exp(-(R - R_sun)/outerScale). */
  outerScaleKpc: number;
  /** Beyond the Sun every scale height grows by exp((R - R_sun)/flareScale). */
  flareScaleKpc: number;
}

/**
 * Defaults of the radial law. A flat midplane density between 3.5 kpc and the
 * Sun follows Ferriere 2001's description of the inner HI disc (from memory);
 * the hole scale 0.5 kpc is an assumption (no source); the outer exponential
 * scale 3.15 kpc (Kalberla & Dedes 2008, A&A 487, 951) and the flaring scale
 * 9.8 kpc (Kalberla & Kerp 2009, ARA&A 47, 27) are from memory.
 */
export const HI_DISC_DEFAULTS: Omit<HiDiscParams, 'rSunKpc'> = {
  holeRadiusKpc: 3.5,
  holeScaleKpc: 0.5,
  outerScaleKpc: 3.15,
  flareScaleKpc: 9.8,
};

/**
 * HI density: the Dickey & Lockman profile at the Sun, its heights scaled by the
 * flaring factor F(R) = exp(max(0, R - R_sun) / flareScale), its midplane value
 * scaled by the radial law (1 between the hole and the Sun). With F the
 * surface density is the radial law times F (the layer thickens, the midplane
 * density follows the law).
 */
export function hiDiscCm3(p: HiDiscParams, rKpc: number, zKpc: number): number {
  let radial = 1;
  let flare = 1;
  if (rKpc < p.holeRadiusKpc) radial = Math.exp(-(p.holeRadiusKpc - rKpc) / p.holeScaleKpc);
  else if (rKpc > p.rSunKpc) {
    radial = Math.exp(-(rKpc - p.rSunKpc) / p.outerScaleKpc);
    flare = Math.exp((rKpc - p.rSunKpc) / p.flareScaleKpc);
  }
  return radial * dickeyLockmanCm3(zKpc / flare);
}

/**
 * HI after Nakanishi & Sofue 2003 (PASJ 55, 191), in the analytic fit read in a
 * secondary public source (midplane 0.94 (0.6 e^{-R/2.4} + 0.24 e^{-((R - 9.5)/4.8)^2}) cm^-3,
 * half width at half maximum 1.06 (116.3 + 19.3 R + 4.1 R^2 - 0.05 R^3) pc, profile
 * n0 2^{-(z/z_half)^2}; the factors 0.94 and 1.06 rescale the paper's R_0 = 8 kpc to 8.5 kpc).
 * Valid for R up to about 30 kpc (the cubic turns over near R = 55 kpc).
 */
export function hiNakanishiSofueCm3(rKpc: number, zKpc: number): number {
  const r = rKpc;
  const n0 = 0.94 * (0.6 * Math.exp(-r / 2.4) + 0.24 * Math.exp(-(((r - 9.5) / 4.8) ** 2)));
  const zHalfKpc = 1.06e-3 * (116.3 + 19.3 * r + 4.1 * r * r - 0.05 * r * r * r);
  const q = zKpc / zHalfKpc;
  return n0 * Math.pow(2, -q * q);
}

/**
 * H2 molecules after Ferriere 2001 (Rev. Mod. Phys. 73, 1031), eq. 3 (from memory,
 * low confidence): n = 0.58 (R/R_sun)^-0.58 exp{-[(R - 4.5)/(R_sun - 4.5)]^2}
 * exp{-[z / (81 pc (R/R_sun)^0.58)]^2} cm^-3, meant for 3.5 <= R <= 20 kpc.
 * Below R = 0.5 kpc the powers use R = 0.5 kpc (no central molecular zone).
 */
export function h2FerriereCm3(rSunKpc: number, rKpc: number, zKpc: number): number {
  const x = Math.max(rKpc, 0.5) / rSunKpc;
  const p = Math.pow(x, 0.58);
  const g = (rKpc - 4.5) / (rSunKpc - 4.5);
  const h = (0.081 * p);
  return (0.58 / p) * Math.exp(-g * g) * Math.exp(-((zKpc / h) ** 2));
}

/**
 * H2 molecules after Nakanishi & Sofue 2006 (PASJ 58, 847) in the analytic fit
 * read in a secondary public source: midplane 0.94 (11.2 e^{-R^2/0.874} + 0.83 e^{-((R - 4)/3.2)^2}) cm^-3,
 * half width at half maximum 1.06 (10.8 e^{0.28 R} + 42.78) pc (another secondary source
 * has 11.2 for 10.8), profile n0 2^{-(z/z_half)^2}. Low confidence: the paper's abstract
 * (read) gives a thickness rising from 48 to 160 pc over R = 0-11 kpc, while this fit's
 * half width is 57 pc at R = 0 and 278 pc at R = 11 kpc.
 */
export function h2NakanishiSofueCm3(rKpc: number, zKpc: number): number {
  const r = rKpc;
  const n0 = 0.94 * (11.2 * Math.exp(-(r * r) / 0.874) + 0.83 * Math.exp(-(((r - 4) / 3.2) ** 2)));
  const zHalfKpc = 1.06e-3 * (10.8 * Math.exp(0.28 * r) + 42.78);
  const q = zKpc / zHalfKpc;
  return n0 * Math.pow(2, -q * q);
}
