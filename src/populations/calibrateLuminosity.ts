/**
 * Calibration by the luminosity scale: multiply every luminosity (L_min and
 * L_max, or the median) by k so that the mean resolved count above S_c in the
 * region equals the catalogue's n_cat, the number of sources held fixed. The
 * mean count m(k) rises with k; it is estimated with the same random numbers
 * for every k (common random numbers, so that m(k) is monotone in k) and k is
 * found by bisection in ln k. The catalogue's Poisson error 1 / sqrt(n_cat)
 * and the Monte Carlo error of m become an error of k through the local slope
 * d ln m / d ln k (first-order propagation; common practice, no source).
 */
import { ComputeError, InputError } from '../core/errors.js';
import { Random } from '../compare/random.js';
import type { CalibrationTarget } from './calibrate.js';
import { resolvedInTarget } from './calibrate.js';
import { scaleLuminosity } from './luminosity.js';
import type { PopulationModel } from './model.js';
import type { DetectionThreshold } from './threshold.js';

/** Result of {@link calibrateLuminosityScale}. */
export interface LuminosityCalibration {
  scale: number;
  /** Relative one-sigma of the scale (Poisson and Monte Carlo, through the slope). */
  relSigma: number;
  /** d ln m / d ln k at the solution. */
  slope: number;
  meanAtScale: number;
  realisations: number;
}

/** Finds k (see the module comment); searches k from 1e-4 to 1e4. */
export function calibrateLuminosityScale(model: PopulationModel, threshold: DetectionThreshold, target: CalibrationTarget,
  opts: { realisations: number; seed: number; stream?: number }): LuminosityCalibration {
  if (!(target.count > 0 && Number.isFinite(target.count))) throw new InputError(`catalogue count is ${target.count}, expected > 0`, { keyPath: 'calibration.count' });
  const M = opts.realisations;
  let lastSd = 0;
  const meanAt = (k: number): number => {
    const rng = new Random(opts.seed, 2000 + (opts.stream ?? 0)); // the same draws for every k
    const m = { ...model, luminosity: scaleLuminosity(model.luminosity, k) };
    let s = 0, ss = 0;
    for (let r = 0; r < M; r++) { const n = resolvedInTarget(m, threshold, target, rng); s += n; ss += n * n; }
    const mean = s / M;
    lastSd = Math.sqrt(Math.max(0, (ss - M * mean * mean) / (M - 1)));
    return mean;
  };
  let lo = Math.log(1e-4), hi = Math.log(1e4);
  if (meanAt(Math.exp(hi)) < target.count) throw new ComputeError(`even luminosities 1e4 times larger resolve fewer than ${target.count} sources; raise the source count`);
  if (meanAt(Math.exp(lo)) > target.count) throw new ComputeError(`even luminosities 1e4 times smaller resolve more than ${target.count} sources; lower the source count`);
  for (let it = 0; it < 40 && hi - lo > 1e-4; it++) {
    const mid = 0.5 * (lo + hi);
    if (meanAt(Math.exp(mid)) < target.count) lo = mid; else hi = mid;
  }
  const k = Math.exp(0.5 * (lo + hi)), mean = meanAt(k), sd = lastSd;
  const up = meanAt(k * 1.1), down = meanAt(k / 1.1);
  const slope = up > 0 && down > 0 ? Math.log(up / down) / (2 * Math.log(1.1)) : NaN;
  if (!(slope > 0)) throw new ComputeError('the resolved count does not change with the luminosity scale; cannot calibrate by luminosity');
  const relM = Math.hypot(1 / Math.sqrt(target.count), mean > 0 ? sd / Math.sqrt(M) / mean : 0);
  return { scale: k, relSigma: relM / slope, slope, meanAtScale: mean, realisations: M };
}
