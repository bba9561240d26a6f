/**
 * Calibration of a population's source count to a catalogue: choose N so that
 * the mean number of resolved sources with flux above S_c in a region equals
 * the analyst's count n_cat. Sources are drawn independently, so the expected
 * resolved count is proportional to N, and one Monte Carlo estimate at a
 * reference count N_ref gives N = N_ref n_cat / m (m the mean resolved count
 * over the realisations). Its relative error combines the catalogue's Poisson
 * error 1 / sqrt(n_cat) and the Monte Carlo error of m, in quadrature
 * (independent errors; common practice, no source).
 */
import { ComputeError, InputError } from '../core/errors.js';
import { Random } from '../compare/random.js';
import type { RegionWeights } from '../regions/types.js';
import type { PopulationModel } from './model.js';
import { drawRealisation, populationSampler } from './realise.js';
import { regionWeightsOfSources } from './sourcePixels.js';
import { resolvedFlags, type DetectionThreshold } from './threshold.js';

/** The catalogue count to reproduce. */
export interface CalibrationTarget {
  /** Region of the catalogue (null: the whole sky). */
  region: RegionWeights | null;
  /** Count sources with pivot flux above this (erg cm^-2 s^-1; 0: all resolved ones). */
  fluxAboveErgCm2S: number;
  /** The catalogue's number of sources. */
  count: number;
}

/** Result of {@link calibrateCount}. */
export interface CalibrationResult {
  referenceCount: number;
  /** Mean and standard error of the resolved count at the reference count. */
  meanAtReference: number;
  stdErrorAtReference: number;
  /** Calibrated number of sources in the population. */
  count: number;
  poissonRelSigma: number;
  monteCarloRelSigma: number;
  /** Both, in quadrature. */
  relSigma: number;
  realisations: number;
}

/** Resolved sources above the flux, weighted by the region (one realisation). */
export function resolvedInTarget(model: PopulationModel, threshold: DetectionThreshold, target: CalibrationTarget, rng: Random): number {
  const real = drawRealisation(populationSampler(model), rng);
  const res = resolvedFlags(real, threshold);
  const w = target.region ? regionWeightsOfSources(real, target.region).weight : null;
  let n = 0;
  for (let i = 0; i < real.count; i++) if (res[i] && real.fluxErgCm2S[i] > target.fluxAboveErgCm2S) n += w ? w[i] : 1;
  return n;
}

/** Calibrates model.count (used as the reference count) to the target (see the module comment). */
export function calibrateCount(model: PopulationModel, threshold: DetectionThreshold, target: CalibrationTarget,
  opts: { realisations: number; seed: number; stream?: number }): CalibrationResult {
  if (!(target.count > 0 && Number.isFinite(target.count))) throw new InputError(`catalogue count is ${target.count}, expected > 0`, { keyPath: 'calibration.count' });
  const M = opts.realisations;
  if (!(Number.isInteger(M) && M >= 2)) throw new InputError(`realisations is ${M}, expected an integer >= 2`, { keyPath: 'calibration.realisations' });
  const rng = new Random(opts.seed, 1000 + (opts.stream ?? 0));
  let s = 0, ss = 0;
  for (let r = 0; r < M; r++) { const n = resolvedInTarget(model, threshold, target, rng); s += n; ss += n * n; }
  const mean = s / M, sd = Math.sqrt(Math.max(0, (ss - M * mean * mean) / (M - 1)));
  if (!(mean > 0)) {
    throw new ComputeError(`no source is resolved above ${target.fluxAboveErgCm2S} erg cm^-2 s^-1 in ${M} realisations of ${model.count} sources; ` +
      'raise the reference count or the luminosities, or lower the threshold');
  }
  const se = sd / Math.sqrt(M), mcRel = se / mean, poisson = 1 / Math.sqrt(target.count);
  return {
    referenceCount: model.count, meanAtReference: mean, stdErrorAtReference: se,
    count: (model.count * target.count) / mean, poissonRelSigma: poisson, monteCarloRelSigma: mcRel,
    relSigma: Math.hypot(poisson, mcRel), realisations: M,
  };
}
