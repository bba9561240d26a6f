/**
 * How the comparison reads a positive measurement quoted as
 * "value -errLow +errHigh": a two-piece log-normal with its median at the
 * value. With z standard normal,
 *
 *   x = value exp(s- z) for z < 0,   x = value exp(s+ z) for z >= 0,
 *   s- = -ln(1 - errLow / value),    s+ = ln(1 + errHigh / value),
 *
 * so x > 0 always, P(x <= value) = 1/2, and the Phi(-1) = 15.87 % and
 * Phi(+1) = 84.13 % points are value - errLow and value + errHigh exactly
 * (quantile: value exp(s Phi^-1(p)), s = s- below the median, s+ above).
 * skyspan's choice (the widths are the fit's log errors, physics/logResiduals.ts);
 * it differs from the split normal (splitNormal.ts), whose mode, not median,
 * is the value and which can go negative. When errLow >= value the 15.87 %
 * point would be <= 0, which no positive distribution has: s- = errLow / value
 * is used (as in the fit) and a note names the point.
 */
import { logErrorWidths } from '../physics/logResiduals.js';
import { normalQuantile } from './normal.js';
import type { Random } from './random.js';

/** Log widths of points, with a note for each point whose lower error reaches zero. */
export function logNormalWidths(value: ArrayLike<number>, errLow: ArrayLike<number>, errHigh: ArrayLike<number>,
  energyGeV: ArrayLike<number>, source?: string): { sLow: Float64Array; sHigh: Float64Array; notes: string[] } {
  const n = value.length, sLow = new Float64Array(n), sHigh = new Float64Array(n), notes: string[] = [];
  for (let i = 0; i < n; i++) {
    [sLow[i], sHigh[i]] = logErrorWidths(value[i], errLow[i], errHigh[i]);
    if (!(errLow[i] < value[i])) {
      notes.push(`gamma-ray point at ${energyGeV[i]} GeV${source ? ` (${source})` : ''}: errLow >= value, so no positive distribution has its 15.87 % point there; lower log width errLow/value = ${sLow[i].toPrecision(3)} used`);
    }
  }
  return { sLow, sHigh, notes };
}

/** One draw of the two-piece log-normal (see the module comment). */
export function drawLogNormalPoint(value: number, sLow: number, sHigh: number, rng: Random): number {
  const z = rng.normal();
  return value * Math.exp(z * (z < 0 ? sLow : sHigh));
}

/** Quantile p (0..1) of the two-piece log-normal: value exp(s Phi^-1(p)). */
export function logNormalPointQuantile(p: number, value: number, sLow: number, sHigh: number): number {
  const z = normalQuantile(p);
  return value * Math.exp(z * (z < 0 ? sLow : sHigh));
}
