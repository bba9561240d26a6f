/**
 * Fit of a spectral model to points: weighted least squares in log space
 * (residuals and upper limits as in logResiduals.ts), minimised by
 * Levenberg-Marquardt (leastSquares.ts).
 *
 * Internal parameters: ln norm, then the shape parameters, with cutoffGeV and
 * breakGeV fitted as their logarithms (so they stay positive). The reported
 * covariance is for the natural parameters (norm, index, cutoffGeV, ...),
 * obtained from the internal one by the Jacobian of the change of variables
 * (linear propagation); `internal` keeps the log-parameter covariance, which
 * is the better one for sampling.
 */
import { InputError } from '../core/errors.js';
import { levenbergMarquardt } from './leastSquares.js';
import { logResiduals, toLogPoints, type UpperLimitMode } from './logResiduals.js';
import type { SpectrumPoints } from './points.js';
import { MODEL_PARAMETERS, evaluateSpectrum, type SpectralKind, type SpectralModel } from './spectrum.js';

/** Result of {@link fitSpectrum}. */
export interface SpectrumFit {
  model: SpectralModel;
  /** Natural parameters by name (norm in GeV^-1 cm^-2 s^-1 sr^-1 at e0GeV). */
  params: Record<string, number>;
  /** Parameter names in the order of the covariance rows. */
  names: string[];
  /** Covariance of the natural parameters, row-major names.length^2. */
  covariance: Float64Array;
  /** The fit's own parameters (lnNorm, ..., lnCutoffGeV / lnBreakGeV) and their covariance. */
  internal: { names: string[]; theta: Float64Array; covariance: Float64Array };
  chi2: number;
  /** Measured points minus free parameters (upper limits not counted). */
  dof: number;
  converged: boolean;
  upperLimits: UpperLimitMode;
}

/** Builds a model from internal parameters (see the module comment). */
export function modelFromInternal(kind: SpectralKind, t: ArrayLike<number>, e0GeV: number): SpectralModel {
  const norm = Math.exp(t[0]);
  switch (kind) {
    case 'powerLaw': return { kind, norm, index: t[1], e0GeV };
    case 'cutoffPowerLaw': return { kind, norm, index: t[1], e0GeV, cutoffGeV: Math.exp(t[2]) };
    case 'logParabola': return { kind, norm, alpha: t[1], beta: t[2], e0GeV };
    case 'brokenPowerLaw': return { kind, norm, index1: t[1], index2: t[2], breakGeV: Math.exp(t[3]) };
  }
}

const INTERNAL_NAMES: Record<SpectralKind, string[]> = {
  powerLaw: ['lnNorm', 'index'],
  cutoffPowerLaw: ['lnNorm', 'index', 'lnCutoffGeV'],
  logParabola: ['lnNorm', 'alpha', 'beta'],
  brokenPowerLaw: ['lnNorm', 'index1', 'index2', 'lnBreakGeV'],
};

/**
 * Fits `kind` to the points. e0GeV defaults to the geometric mean energy of the
 * measured points (for the broken law the break is fitted instead).
 * Needs more measured points than free parameters.
 */
export function fitSpectrum(points: SpectrumPoints, kind: SpectralKind,
  options: { e0GeV?: number; upperLimits?: UpperLimitMode } = {}): SpectrumFit {
  const upperLimits = options.upperLimits ?? 'penalty';
  const lp = toLogPoints(points, upperLimits);
  const p = INTERNAL_NAMES[kind].length;
  if (lp.measured <= p) {
    throw new InputError(`${lp.measured} measured points for ${p} free parameters of ${kind}`, { file: points.source },
      'give more points or choose a model with fewer parameters (powerLaw has 2)');
  }
  // start: straight line through the measured points in ln I vs ln E (unweighted)
  let sx = 0, sy = 0, sxx = 0, sxy = 0, m = 0, minE = Infinity, maxE = -Infinity;
  for (let k = 0; k < lp.n; k++) if (!lp.upper[k]) {
    sx += lp.logE[k]; sy += lp.logV[k]; sxx += lp.logE[k] ** 2; sxy += lp.logE[k] * lp.logV[k]; m++;
    minE = Math.min(minE, lp.logE[k]); maxE = Math.max(maxE, lp.logE[k]);
  }
  const mx = sx / m, slope = (sxy - m * mx * (sy / m)) / (sxx - m * mx * mx || 1);
  const e0GeV = options.e0GeV ?? Math.exp(mx);
  const ln0 = sy / m + slope * (Math.log(e0GeV) - mx);
  const start: Record<SpectralKind, number[]> = {
    powerLaw: [ln0, -slope],
    cutoffPowerLaw: [ln0, -slope - 0.3, maxE + 1],
    logParabola: [ln0, -slope, 0],
    brokenPowerLaw: [sy / m, -slope, -slope, mx],
  };
  const logM = new Float64Array(lp.n);
  const residuals = (t: Float64Array, out: Float64Array) => {
    const model = modelFromInternal(kind, t, e0GeV);
    for (let k = 0; k < lp.n; k++) logM[k] = Math.log(evaluateSpectrum(model, Math.exp(lp.logE[k])));
    logResiduals(lp, logM, out);
  };
  const r = levenbergMarquardt(residuals, start[kind], lp.n);
  const model = modelFromInternal(kind, r.theta, e0GeV);
  // natural parameters: norm = exp(t0); exp() for log-fitted ones; Jacobian is diagonal
  const names = [...MODEL_PARAMETERS[kind]];
  const jac = new Float64Array(p), params: Record<string, number> = {};
  INTERNAL_NAMES[kind].forEach((nm, j) => {
    const isLog = nm.startsWith('ln');
    const val = isLog ? Math.exp(r.theta[j]) : r.theta[j];
    params[names[j]] = val;
    jac[j] = isLog ? val : 1;
  });
  const cov = new Float64Array(p * p);
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) cov[a * p + b] = jac[a] * jac[b] * r.covariance[a * p + b];
  if (kind !== 'brokenPowerLaw') params.e0GeV = e0GeV;
  return {
    model, params, names, covariance: cov,
    internal: { names: INTERNAL_NAMES[kind], theta: r.theta, covariance: r.covariance },
    chi2: r.chi2, dof: lp.measured - p, converged: r.converged, upperLimits,
  };
}
