/**
 * Relative exposure of a ground-based array versus declination, and the
 * declination band the site sees.
 *
 * A detector at geographic latitude a0 that accepts events up to a zenith angle
 * theta_m, running uniformly in sidereal time, sees a direction at declination
 * delta for the hour angles |h| < alpha_m with
 *   xi = (cos theta_m - sin a0 sin delta) / (cos a0 cos delta),
 *   alpha_m = 0 if xi > 1, pi if xi < -1, arccos(xi) otherwise,
 * and its exposure, weighted by the projected area cos(zenith) of a flat array,
 * is proportional to
 *   omega(delta) = cos a0 cos delta sin alpha_m + alpha_m sin a0 sin delta
 * (Sommers 2001, Astropart. Phys. 14, 271, eqs. 2-3). This is one half of the
 * integral over hour angle of cos(zenith) where zenith < theta_m, since
 * cos(zenith) = sin a0 sin delta + cos a0 cos delta cos h. The time-weighted
 * variant (exposure time only, no cos(zenith) factor) is alpha_m alone.
 */
import { HALF_PI, PI } from '../core/math.js';

/** How a site's exposure is weighted: by cos(zenith) (flat array) or by time alone. */
export type ExposureWeighting = 'zenith' | 'time';

/**
 * Half-width alpha_m (rad, 0..pi) of the hour-angle range in which a direction at
 * declination decRad stays within maxZenithRad of the zenith of a site at
 * latitude siteLatRad (Sommers 2001, eq. 3). At the celestial poles (or for a
 * site at a pole) the zenith angle is constant and alpha_m is 0 or pi.
 */
export function hourAngleHalfWidth(decRad: number, siteLatRad: number, maxZenithRad: number): number {
  const den = Math.cos(siteLatRad) * Math.cos(decRad);
  const num = Math.cos(maxZenithRad) - Math.sin(siteLatRad) * Math.sin(decRad);
  if (!(Math.abs(den) > 1e-300)) return num <= 0 ? PI : 0;
  const xi = num / den;
  return xi > 1 ? 0 : xi < -1 ? PI : Math.acos(xi);
}

/**
 * Unnormalised relative exposure at declination decRad for a site at
 * siteLatRad accepting zenith angles up to maxZenithRad (all radians).
 * 'zenith': omega = cos a0 cos delta sin alpha_m + alpha_m sin a0 sin delta
 * (Sommers 2001, eq. 2; units: radians of hour angle times cos(zenith));
 * 'time': alpha_m (rad of hour angle). Valid for decRad and siteLatRad in
 * [-pi/2, pi/2] and maxZenithRad in (0, pi/2].
 *
 * @example
 * relativeExposure(0, Math.PI / 6, Math.PI / 4, 'zenith') // 0.5000... (raw; 0.591552 of the maximum)
 */
export function relativeExposure(
  decRad: number, siteLatRad: number, maxZenithRad: number, weighting: ExposureWeighting,
): number {
  const am = hourAngleHalfWidth(decRad, siteLatRad, maxZenithRad);
  if (weighting === 'time') return am;
  const v = Math.cos(siteLatRad) * Math.cos(decRad) * Math.sin(am) + am * Math.sin(siteLatRad) * Math.sin(decRad);
  return v > 0 ? v : 0;
}

/**
 * Maximum over declination of {@link relativeExposure} and where it is reached:
 * divide by `max` to normalise the exposure to a maximum of 1. Found by a scan
 * of 3601 declinations and golden-section refinement (common practice, no
 * source); the location is accurate to about 1e-10 rad.
 */
export function exposureNormalisation(
  siteLatRad: number, maxZenithRad: number, weighting: ExposureWeighting,
): { max: number; decRad: number } {
  const f = (d: number): number => relativeExposure(d, siteLatRad, maxZenithRad, weighting);
  const n = 3600;
  let best = 0, bestV = -1;
  for (let i = 0; i <= n; i++) {
    const d = -HALF_PI + (PI * i) / n;
    const v = f(d);
    if (v > bestV) { bestV = v; best = i; }
  }
  let a = -HALF_PI + (PI * Math.max(0, best - 1)) / n;
  let b = -HALF_PI + (PI * Math.min(n, best + 1)) / n;
  const g = (Math.sqrt(5) - 1) / 2;
  let c = b - g * (b - a), d = a + g * (b - a);
  let fc = f(c), fd = f(d);
  for (let it = 0; it < 80 && b - a > 1e-13; it++) {
    if (fc >= fd) { b = d; d = c; fd = fc; c = b - g * (b - a); fc = f(c); }
    else { a = c; c = d; fc = fd; d = a + g * (b - a); fd = f(d); }
  }
  const dm = (a + b) / 2;
  const vm = f(dm);
  return vm >= bestV ? { max: vm, decRad: dm } : { max: bestV, decRad: -HALF_PI + (PI * best) / n };
}

/**
 * Declination band [minRad, maxRad] a site at siteLatRad sees within
 * maxZenithRad of its zenith at upper culmination: |delta - a0| <= theta_m,
 * clipped to the poles (spherical geometry, common knowledge). Exactly where
 * alpha_m > 0.
 */
export function declinationBand(siteLatRad: number, maxZenithRad: number): { minRad: number; maxRad: number } {
  return { minRad: Math.max(-HALF_PI, siteLatRad - maxZenithRad), maxRad: Math.min(HALF_PI, siteLatRad + maxZenithRad) };
}
