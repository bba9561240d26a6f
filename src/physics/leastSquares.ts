/**
 * Levenberg-Marquardt for small problems (a handful of parameters, tens of
 * points): minimises sum r_i(theta)^2 with a central-difference Jacobian, and returns the covariance (J^T J)^-1 at the minimum
 * (residuals already divided by their sigmas, so no rescaling by chi^2/dof).
 * Method: Levenberg 1944, Q. Appl. Math. 2, 164; Marquardt 1963, J. SIAM 11, 431
 * (Marquardt's diagonal scaling). Dense matrices are row-major Float64Array.
 */
import { ComputeError } from '../core/errors.js';

/** Residual function: writes n residuals for parameters theta into out. */
export type ResidualFn = (theta: Float64Array, out: Float64Array) => void;

/** Result of {@link levenbergMarquardt}. */
export interface LeastSquaresResult {
  theta: Float64Array;
  /** Covariance of theta, p x p row-major, (J^T J)^-1. */
  covariance: Float64Array;
  chi2: number;
  iterations: number;
  converged: boolean;
}

/** Inverts a p x p row-major matrix by Gauss-Jordan elimination with partial pivoting; null if singular. */
export function invertMatrix(a: Float64Array, p: number): Float64Array | null {
  const m = new Float64Array(a), inv = new Float64Array(p * p);
  for (let i = 0; i < p; i++) inv[i * p + i] = 1;
  for (let c = 0; c < p; c++) {
    let piv = c, best = Math.abs(m[c * p + c]);
    for (let r = c + 1; r < p; r++) { const v = Math.abs(m[r * p + c]); if (v > best) { best = v; piv = r; } }
    if (!(best > 0) || !Number.isFinite(best)) return null;
    if (piv !== c) for (let k = 0; k < p; k++) {
      let t = m[c * p + k]; m[c * p + k] = m[piv * p + k]; m[piv * p + k] = t;
      t = inv[c * p + k]; inv[c * p + k] = inv[piv * p + k]; inv[piv * p + k] = t;
    }
    const d = m[c * p + c];
    for (let k = 0; k < p; k++) { m[c * p + k] /= d; inv[c * p + k] /= d; }
    for (let r = 0; r < p; r++) {
      if (r === c) continue;
      const f = m[r * p + c];
      if (f === 0) continue;
      for (let k = 0; k < p; k++) { m[r * p + k] -= f * m[c * p + k]; inv[r * p + k] -= f * inv[c * p + k]; }
    }
  }
  return inv;
}

function sumSq(r: Float64Array): number {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += r[i] * r[i];
  return s;
}

/** Central-difference Jacobian (n x p, row-major) of the residuals at theta. */
export function jacobian(fn: ResidualFn, theta: Float64Array, n: number, step = 1e-5): Float64Array {
  const p = theta.length, J = new Float64Array(n * p);
  const rp = new Float64Array(n), rm = new Float64Array(n), t = new Float64Array(theta);
  for (let j = 0; j < p; j++) {
    const h = step * Math.max(1, Math.abs(theta[j]));
    t[j] = theta[j] + h; fn(t, rp);
    t[j] = theta[j] - h; fn(t, rm);
    t[j] = theta[j];
    for (let i = 0; i < n; i++) J[i * p + j] = (rp[i] - rm[i]) / (2 * h);
  }
  return J;
}

/**
 * Minimises the sum of squared residuals from theta0. Throws ComputeError when
 * the residuals are not finite at the start or J^T J is singular at the end.
 */
export function levenbergMarquardt(fn: ResidualFn, theta0: ArrayLike<number>, n: number,
  options: { maxIterations?: number; tolerance?: number } = {}): LeastSquaresResult {
  const p = theta0.length, maxIt = options.maxIterations ?? 200, tol = options.tolerance ?? 1e-12;
  let theta = Float64Array.from(theta0);
  const r = new Float64Array(n), rTry = new Float64Array(n);
  fn(theta, r);
  let chi2 = sumSq(r);
  if (!Number.isFinite(chi2)) throw new ComputeError('fit: residuals are not finite at the starting point');
  let lambda = 1e-3, converged = false, it = 0;
  const A = new Float64Array(p * p), g = new Float64Array(p);
  for (; it < maxIt; it++) {
    const J = jacobian(fn, theta, n);
    A.fill(0); g.fill(0);
    for (let i = 0; i < n; i++) for (let a = 0; a < p; a++) {
      const ja = J[i * p + a];
      g[a] += ja * r[i];
      for (let b = 0; b < p; b++) A[a * p + b] += ja * J[i * p + b];
    }
    let improved = false;
    for (let tries = 0; tries < 30 && !improved; tries++) {
      const M = new Float64Array(A);
      for (let a = 0; a < p; a++) M[a * p + a] += lambda * (A[a * p + a] > 0 ? A[a * p + a] : 1);
      const Minv = invertMatrix(M, p);
      if (!Minv) { lambda *= 10; continue; }
      const t = new Float64Array(p);
      for (let a = 0; a < p; a++) { let s = 0; for (let b = 0; b < p; b++) s += Minv[a * p + b] * g[b]; t[a] = theta[a] - s; }
      fn(t, rTry);
      const c = sumSq(rTry);
      if (Number.isFinite(c) && c <= chi2) {
        const rel = (chi2 - c) / Math.max(chi2, 1e-300);
        theta = t; r.set(rTry); chi2 = c; lambda = Math.max(lambda / 10, 1e-12); improved = true;
        if (rel < tol) converged = true;
      } else lambda *= 10;
    }
    if (!improved || converged) { converged = true; break; }
  }
  const J = jacobian(fn, theta, n);
  A.fill(0);
  for (let i = 0; i < n; i++) for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) A[a * p + b] += J[i * p + a] * J[i * p + b];
  const cov = invertMatrix(A, p);
  if (!cov) throw new ComputeError('fit: the parameters are not constrained by the points (singular J^T J); use a simpler model or more points');
  return { theta, covariance: cov, chi2, iterations: it, converged };
}
