/**
 * Fit of a proton spectrum to measured gamma-ray (or all-flavour neutrino)
 * points through the KAB 2006 functions, and the spectra it predicts.
 *
 * The points are intensities I(E) = (1/4 pi) (integral of n_H ds) q(E) with q
 * from {@link ppEmissivity}; the fitted proton normalisation therefore absorbs
 * the target column and 1/(4 pi): it is an effective amplitude, and only the
 * shape (index, cutoff) is physical. Proton model: power law N (E_p/E0)^-index,
 * optionally times exp(-E_p/E_c). Residuals, asymmetric errors and upper limits
 * as in ../logResiduals.ts; minimiser and covariance as in ../leastSquares.ts.
 * Assumes all of the measured emission is hadronic (pp).
 */
import { InputError } from '../../core/errors.js';
import { levenbergMarquardt } from '../leastSquares.js';
import { logResiduals, toLogPoints, type UpperLimitMode } from '../logResiduals.js';
import type { SpectrumPoints } from '../points.js';
import type { SpectralModel } from '../spectrum.js';
import { KAB_MIN_ENERGY_GEV, ppEmissivity, type Secondary } from './emissivity.js';

/** Which secondary the fitted points are. */
export type ProtonFitTarget = 'gamma' | 'neutrinoAllFlavour';

/** Result of {@link fitProtonSpectrum}. */
export interface ProtonFit {
  method: 'kab2006';
  target: ProtonFitTarget;
  /** The fitted proton spectrum (effective normalisation, see the module comment). */
  protons: SpectralModel;
  /** Internal parameters lnNorm, index[, lnCutoffGeV] and their covariance (row-major). */
  names: string[];
  theta: Float64Array;
  covariance: Float64Array;
  chi2: number;
  dof: number;
  converged: boolean;
  assumptions: string[];
}

/** Proton model from internal parameters. */
export function protonModelFromInternal(theta: ArrayLike<number>, e0GeV: number): SpectralModel {
  return theta.length > 2
    ? { kind: 'cutoffPowerLaw', norm: Math.exp(theta[0]), index: theta[1], e0GeV, cutoffGeV: Math.exp(theta[2]) }
    : { kind: 'powerLaw', norm: Math.exp(theta[0]), index: theta[1], e0GeV };
}

/**
 * Fits the proton spectrum. e0GeV (the proton reference energy) defaults to
 * 10 times the geometric mean energy of the measured points; a cutoff starts
 * at 100 times the highest point energy.
 */
export function fitProtonSpectrum(points: SpectrumPoints, options: {
  target?: ProtonFitTarget; cutoff?: boolean; e0GeV?: number; upperLimits?: UpperLimitMode;
  /** z_c = Phi^-1(confidence) of the upper limits, for upperLimits 'oneSided'. */
  upperLimitZ?: number;
} = {}): ProtonFit {
  const target = options.target ?? 'gamma';
  const lp = toLogPoints(points, options.upperLimits ?? 'penalty', options.upperLimitZ);
  const p = options.cutoff ? 3 : 2;
  if (lp.measured <= p) {
    throw new InputError(`${lp.measured} measured points for ${p} proton-spectrum parameters`, { file: points.source },
      'give more points or fit without a cutoff');
  }
  let meanLogE = 0, maxLogE = -Infinity;
  for (let k = 0; k < lp.n; k++) {
    if (!(Math.exp(lp.logE[k]) >= KAB_MIN_ENERGY_GEV)) {
      throw new InputError(`point at ${Math.exp(lp.logE[k])} GeV is below ${KAB_MIN_ENERGY_GEV} GeV, outside the KAB 2006 range`,
        { file: points.source }, 'drop the lower points or use the K_pi rule');
    }
    if (!lp.upper[k]) { meanLogE += lp.logE[k] / lp.measured; maxLogE = Math.max(maxLogE, lp.logE[k]); }
  }
  const e0GeV = options.e0GeV ?? 10 * Math.exp(meanLogE);
  const logM = new Float64Array(lp.n);
  const model = (t: ArrayLike<number>) => protonModelFromInternal(t, e0GeV);
  const fill = (t: ArrayLike<number>) => {
    const m = model(t);
    for (let k = 0; k < lp.n; k++) logM[k] = Math.log(ppEmissivity(target, Math.exp(lp.logE[k]), m));
  };
  // start: index from a straight line, then the normalisation that matches on average
  let sx = 0, sy = 0, sxx = 0, sxy = 0, m = 0;
  for (let k = 0; k < lp.n; k++) if (!lp.upper[k]) { sx += lp.logE[k]; sy += lp.logV[k]; sxx += lp.logE[k] ** 2; sxy += lp.logE[k] * lp.logV[k]; m++; }
  const slope = (sxy - (sx * sy) / m) / (sxx - (sx * sx) / m || 1);
  const start = p === 3 ? [0, -slope - 0.1, maxLogE + Math.log(100)] : [0, -slope];
  fill(start);
  let off = 0;
  for (let k = 0; k < lp.n; k++) if (!lp.upper[k]) off += (lp.logV[k] - logM[k]) / m;
  start[0] = off;
  const r = levenbergMarquardt((t, out) => { fill(t); logResiduals(lp, logM, out); }, start, lp.n);
  return {
    method: 'kab2006', target, protons: model(r.theta),
    names: p === 3 ? ['lnNorm', 'index', 'lnCutoffGeV'] : ['lnNorm', 'index'],
    theta: r.theta, covariance: r.covariance, chi2: r.chi2, dof: lp.measured - p, converged: r.converged,
    assumptions: ['all of the fitted emission is hadronic (pp collisions)',
      'KAB 2006 parametrisation, E_p >= 0.1 TeV, extrapolated above 1e5 TeV'],
  };
}

/** Intensities of `secondary` at the energies from a proton fit (same units as the fitted points). */
export function predictFromProtons(fit: ProtonFit, secondary: Secondary, energiesGeV: ArrayLike<number>): Float64Array {
  const out = new Float64Array(energiesGeV.length);
  for (let i = 0; i < out.length; i++) out[i] = ppEmissivity(secondary, energiesGeV[i], fit.protons);
  return out;
}
