/**
 * Radial distributions of Galactic sources (pulsars, supernova remnants) as
 * functions of Galactocentric radius R, normalised to 1 at the Sun's radius.
 *
 * Form A: f(R) = (R / R_sun)^a exp(-b (R - R_sun) / R_sun), peak at R = a R_sun / b.
 * Form B (Yusifov & Kucuk 2004, A&A 422, 545):
 *   f(R) = ((R + R1) / (R_sun + R1))^a exp(-b (R - R_sun) / (R_sun + R1)), peak at a (R_sun + R1) / b - R1.
 * Parameters (all from memory, not read in the papers):
 *   Lorimer et al. 2006 (MNRAS 372, 777), pulsars: a = 1.9, b = 5.0;
 *   Green 2015 (MNRAS 454, 1517), SNRs: a = 1.09, b = 3.87;
 *   Case & Bhattacharya 1998 (ApJ 504, 761), SNRs: a = 2.00, b = 3.53;
 *   Yusifov & Kucuk 2004, pulsars: a = 1.64, b = 4.01, R1 = 0.55 kpc (peak 3.15 kpc agrees with the abstract).
 */

/** Names of the built-in source radial laws. */
export const RADIAL_LAW_NAMES = ['lorimer2006', 'green2015', 'case1998', 'yusifov2004'] as const;
export type RadialLawName = (typeof RADIAL_LAW_NAMES)[number];

/** Parameters of a radial law: exponents a, b and offset r1Kpc (0 for form A). */
export interface RadialLawParams {
  readonly a: number;
  readonly b: number;
  readonly r1Kpc: number;
}

/** Published parameters of each law (from memory; see module doc). */
export const RADIAL_LAWS: Readonly<Record<RadialLawName, RadialLawParams>> = {
  lorimer2006: { a: 1.9, b: 5.0, r1Kpc: 0 },
  green2015: { a: 1.09, b: 3.87, r1Kpc: 0 },
  case1998: { a: 2.0, b: 3.53, r1Kpc: 0 },
  yusifov2004: { a: 1.64, b: 4.01, r1Kpc: 0.55 },
};

/**
 * Source density at radius rKpc relative to the Sun's radius (1 at R = rSunKpc).
 * Valid for R >= 0; zero at R = 0 when r1 = 0 and a > 0.
 */
export function radialLaw(p: RadialLawParams, rKpc: number, rSunKpc: number): number {
  const scale = rSunKpc + p.r1Kpc;
  return Math.pow((rKpc + p.r1Kpc) / scale, p.a) * Math.exp((-p.b * (rKpc - rSunKpc)) / scale);
}

/** Radius (kpc) where the law peaks: a (R_sun + R1) / b - R1 (from setting df/dR = 0). */
export function radialLawPeakKpc(p: RadialLawParams, rSunKpc: number): number {
  return (p.a * (rSunKpc + p.r1Kpc)) / p.b - p.r1Kpc;
}
