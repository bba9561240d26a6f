/**
 * Quantiles of an ensemble, optionally weighted.
 *
 * Unweighted: the linear-interpolation definition, type 7 of Hyndman & Fan
 * (1996, Am. Stat. 50, 361), which is numpy.percentile's default
 * (method='linear'): sorted x_1..x_n, h = (n - 1) q, interpolate between
 * x_floor(h)+1 and x_floor(h)+2.
 *
 * Weighted (skyspan's definition, documented here): normalise the weights to
 * sum 1, sort by value, give each sorted value the position
 *   u_i = (C_i - w_i / 2 - w_1 / 2) / (1 - w_1 / 2 - w_n / 2),
 * with C_i the cumulative weight up to and including i, and interpolate x
 * linearly in u at u = q. u_1 = 0 and u_n = 1, and with equal weights
 * u_i = (i - 1) / (n - 1), so the definition reduces exactly to type 7.
 * Zero weights are dropped first.
 *
 * This is skyspan's one quantile module: the factor summary (summary.ts), the
 * comparison's central k_I and survival (compare/ensemble.ts) and every Monte
 * Carlo summary (compare/summary.ts, through {@link quantileSorted}) use it, so
 * the same values and weights give the same median everywhere. Example: values
 * [1, 2, 3] with weights [1, 1, 2] have u = [0, 0.4, 1] and median
 * 2 + (0.5 - 0.4) / 0.6 = 2.1667.
 */
import { InputError } from '../core/errors.js';

/**
 * The q-quantile (0 <= q <= 1) of `values`, weighted when `weights` is given.
 * Throws InputError on an empty set, a non-finite value, or a weight that is
 * negative or not finite, or when all weights are zero.
 *
 * @example
 * quantile([1, 2, 3, 4], null, 0.5); // 2.5, as numpy.percentile([1,2,3,4], 50)
 */
export function quantile(values: ArrayLike<number>, weights: ArrayLike<number> | null, q: number): number {
  return quantiles(values, weights, [q])[0];
}

/** Several quantiles at once (see {@link quantile}); one sort. */
export function quantiles(values: ArrayLike<number>, weights: ArrayLike<number> | null, qs: number[]): number[] {
  const n0 = values.length;
  if (weights && weights.length !== n0) {
    throw new InputError(`${weights.length} weights for ${n0} values`, {}, 'give one weight per template');
  }
  const order: number[] = [];
  for (let i = 0; i < n0; i++) {
    if (!Number.isFinite(values[i])) throw new InputError(`value ${values[i]} is not finite`, {});
    if (weights) {
      const w = weights[i];
      if (!(w >= 0 && w < Infinity)) throw new InputError(`weight ${w} must be finite and >= 0`, {});
      if (w === 0) continue;
    }
    order.push(i);
  }
  if (order.length === 0) throw new InputError('no values (or only zero weights) to take quantiles of', {});
  order.sort((a, b) => values[a] - values[b]);
  const n = order.length;
  const x = order.map((i) => values[i]);
  for (const q of qs) {
    if (!(q >= 0 && q <= 1)) throw new InputError(`quantile ${q} is outside 0..1`, {});
  }
  if (n === 1) return qs.map(() => x[0]);
  const u = new Float64Array(n);
  if (!weights) {
    for (let i = 0; i < n; i++) u[i] = i / (n - 1);
  } else {
    let total = 0;
    for (const i of order) total += weights[i];
    const w = order.map((i) => weights[i] / total);
    const lo = w[0] / 2, hi = 1 - w[n - 1] / 2;
    let c = 0;
    for (let i = 0; i < n; i++) {
      c += w[i];
      u[i] = (c - w[i] / 2 - lo) / (hi - lo);
    }
    u[0] = 0;
    u[n - 1] = 1;
  }
  return qs.map((q) => interpolate(u, x, q));
}

/**
 * Type-7 quantile q (0..1) of values already sorted ascending and finite
 * (the unweighted case of {@link quantiles} without the checks and the copy,
 * for large Monte Carlo sample sets): h = (n - 1) q, linear between the order
 * statistics around h. NaN for an empty array.
 */
export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h), hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

function interpolate(u: Float64Array, x: number[], q: number): number {
  const n = x.length;
  if (q <= 0) return x[0];
  if (q >= 1) return x[n - 1];
  let i = 1;
  while (i < n - 1 && u[i] < q) i++;
  // u[i-1] < q <= u[i]
  const du = u[i] - u[i - 1];
  const t = du > 0 ? (q - u[i - 1]) / du : 0;
  return x[i - 1] + t * (x[i] - x[i - 1]);
}
