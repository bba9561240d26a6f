/**
 * Residuals of a model against spectrum points in log space, shared by the
 * spectral fit and the proton-spectrum fit.
 *
 * Measured point i with value v, errors e- and e+: the log errors are
 * s+ = ln(1 + e+/v) and s- = -ln(1 - e-/v) (s- = e-/v when e- >= v).
 * The residual is (ln m - ln v) / s, with s = s+ when the model m lies above
 * the point and s- when below: the error on the side of the model (common
 * practice, no source; Barlow 2003, arXiv:physics/0306138, discusses this and
 * better-founded alternatives). The chi^2 is continuous but has a kink where
 * m crosses v; the fit handles this in practice for points with s+ ~ s-.
 *
 * Upper limit u: no residual while m <= u; above, (ln m - ln u) / s_ul, a one-
 * sided penalty whose width s_ul is the mean log error of the measured points
 * (skyspan's choice, no source). Upper limits do not count in the degrees of
 * freedom. With `upperLimits: 'ignore'` they are left out altogether.
 *
 * With `upperLimits: 'oneSided'` an upper limit u at one-sided confidence
 * level c (SpectrumPoints.ulConfidence, default {@link DEFAULT_UL_CONFIDENCE})
 * is read as a Gaussian measurement centred on zero flux whose c-quantile is
 * u, sigma = u / z_c with z_c = Phi^-1(c); the residual is m / sigma = z_c m / u,
 * so a model at the limit adds z_c^2 to chi^2 (2.71 at 95 %) and lower models
 * less (skyspan's choice, stated; the usual reading of a limit from a null
 * measurement, common practice, no source).
 */
import type { SpectrumPoints } from './points.js';

/** How a fit treats upper limits. */
export type UpperLimitMode = 'penalty' | 'ignore' | 'oneSided';

/** Confidence level of upper limits when the points do not state it (one-sided 95 %, the most common convention; skyspan's default). */
export const DEFAULT_UL_CONFIDENCE = 0.95;

/** Precomputed log values and log errors of the points. */
export interface LogPoints {
  n: number;
  logE: Float64Array;
  logV: Float64Array;
  sLow: Float64Array;
  sHigh: Float64Array;
  upper: Uint8Array;
  /** Number of measured (non-limit) points. */
  measured: number;
  /** How upper limits enter, and z_c = Phi^-1(confidence) for 'oneSided' (the caller computes it). */
  ulMode: UpperLimitMode;
  ulZ: number;
}

/**
 * Log errors of a point with value v > 0 and errors eLow, eHigh >= 0:
 * [s-, s+] = [-ln(1 - eLow/v), ln(1 + eHigh/v)], with s- = eLow/v when eLow >= v
 * (a lower error reaching zero has no log image). Shared by the fits and by the
 * comparison's log-normal draws, so both read a point the same way.
 */
export function logErrorWidths(v: number, eLow: number, eHigh: number): [number, number] {
  return [eLow < v ? -Math.log1p(-eLow / v) : eLow / v, Math.log1p(eHigh / v)];
}

/** Turns points into log values and log errors (see the module comment); `upperLimitZ` = z_c, needed for 'oneSided'. */
export function toLogPoints(points: SpectrumPoints, upperLimits: UpperLimitMode = 'penalty', upperLimitZ?: number): LogPoints {
  if (upperLimits === 'oneSided' && !(upperLimitZ! > 0)) throw new RangeError(`toLogPoints: 'oneSided' needs z_c > 0, got ${upperLimitZ}`);
  const idx: number[] = [];
  for (let i = 0; i < points.value.length; i++) if (!points.upperLimit[i] || upperLimits !== 'ignore') idx.push(i);
  const n = idx.length;
  const lp: LogPoints = { n, logE: new Float64Array(n), logV: new Float64Array(n), sLow: new Float64Array(n),
    sHigh: new Float64Array(n), upper: new Uint8Array(n), measured: 0, ulMode: upperLimits,
    ulZ: upperLimits === 'oneSided' ? upperLimitZ! : NaN };
  let sum = 0;
  idx.forEach((i, k) => {
    const v = points.value[i];
    lp.logE[k] = Math.log(points.energyGeV[i]);
    lp.logV[k] = Math.log(v);
    lp.upper[k] = points.upperLimit[i];
    if (!points.upperLimit[i]) {
      [lp.sLow[k], lp.sHigh[k]] = logErrorWidths(v, points.errLow[i], points.errHigh[i]);
      sum += 0.5 * (lp.sHigh[k] + lp.sLow[k]);
      lp.measured++;
    }
  });
  const sUl = lp.measured > 0 ? sum / lp.measured : 0.1;
  for (let k = 0; k < n; k++) if (lp.upper[k]) { lp.sLow[k] = sUl; lp.sHigh[k] = sUl; }
  return lp;
}

/** Writes residuals given model log values logM (one per point) into out. */
export function logResiduals(lp: LogPoints, logM: Float64Array, out: Float64Array): void {
  for (let k = 0; k < lp.n; k++) {
    const d = logM[k] - lp.logV[k];
    if (lp.upper[k]) out[k] = lp.ulMode === 'oneSided' ? lp.ulZ * Math.exp(d) : d > 0 ? d / lp.sHigh[k] : 0;
    else out[k] = d / (d > 0 ? lp.sHigh[k] : lp.sLow[k]);
  }
}
