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
 */
import type { SpectrumPoints } from './points.js';

/** How a fit treats upper limits. */
export type UpperLimitMode = 'penalty' | 'ignore';

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
}

/** Turns points into log values and log errors (see the module comment). */
export function toLogPoints(points: SpectrumPoints, upperLimits: UpperLimitMode = 'penalty'): LogPoints {
  const idx: number[] = [];
  for (let i = 0; i < points.value.length; i++) if (!points.upperLimit[i] || upperLimits === 'penalty') idx.push(i);
  const n = idx.length;
  const lp: LogPoints = { n, logE: new Float64Array(n), logV: new Float64Array(n), sLow: new Float64Array(n),
    sHigh: new Float64Array(n), upper: new Uint8Array(n), measured: 0 };
  let sum = 0;
  idx.forEach((i, k) => {
    const v = points.value[i];
    lp.logE[k] = Math.log(points.energyGeV[i]);
    lp.logV[k] = Math.log(v);
    lp.upper[k] = points.upperLimit[i];
    if (!points.upperLimit[i]) {
      const el = points.errLow[i], eh = points.errHigh[i];
      lp.sHigh[k] = Math.log1p(eh / v);
      lp.sLow[k] = el < v ? -Math.log1p(-el / v) : el / v;
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
    if (lp.upper[k]) out[k] = d > 0 ? d / lp.sHigh[k] : 0;
    else out[k] = d / (d > 0 ? lp.sHigh[k] : lp.sLow[k]);
  }
}
