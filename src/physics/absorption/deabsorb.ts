/**
 * De-absorption of a measured gamma-ray spectrum: intrinsic = measured / P,
 * with P the survival probability (per point, e.g. the emission-weighted mean
 * over a region from the template builder). When several templates give
 * several P per point, the central value uses their median and the spread
 * (16th to 84th percentile of measured / P over the templates) is reported as
 * a separate systematic, not folded into the statistical errors (skyspan's
 * choice, no source). Assumes the absorption happens between source and
 * observer and that P was computed for the same energies.
 */
import { InputError } from '../../core/errors.js';
import type { SpectrumPoints } from '../points.js';

/** Points with the de-absorption applied and the template spread of the correction. */
export interface DeabsorbedPoints extends SpectrumPoints {
  /** Median survival probability used per point. */
  survival: Float64Array;
  /** 16th and 84th percentiles of the intrinsic value over the survival set (equal to value when only one set). */
  systLow: Float64Array;
  systHigh: Float64Array;
  assumptions: string[];
}

function quantile(sorted: number[], q: number): number {
  if (sorted.length === 1) return sorted[0];
  const pos = q * (sorted.length - 1), k = Math.floor(pos), f = pos - k;
  return k + 1 < sorted.length ? sorted[k] * (1 - f) + sorted[k + 1] * f : sorted[k];
}

/**
 * Divides the points by their survival probabilities. `survival` is one array
 * (one P per point) or several (one per template). Errors scale with the value.
 */
export function deabsorbPoints(points: SpectrumPoints, survival: ArrayLike<number> | ArrayLike<number>[]): DeabsorbedPoints {
  const sets: ArrayLike<number>[] = Array.isArray(survival) && typeof survival[0] !== 'number'
    ? (survival as ArrayLike<number>[]) : [survival as ArrayLike<number>];
  const n = points.value.length;
  sets.forEach((s, j) => {
    if (s.length !== n) throw new InputError(`survival set ${j} has ${s.length} values for ${n} points`, { keyPath: `survival[${j}]` });
    for (let i = 0; i < n; i++) if (!(s[i] > 0 && s[i] <= 1)) {
      throw new InputError(`survival probability ${s[i]} must be in (0, 1]`, { keyPath: `survival[${j}][${i}]` });
    }
  });
  const out: DeabsorbedPoints = {
    ...points, energyGeV: Float64Array.from(points.energyGeV), value: new Float64Array(n), errLow: new Float64Array(n),
    errHigh: new Float64Array(n), upperLimit: Uint8Array.from(points.upperLimit),
    survival: new Float64Array(n), systLow: new Float64Array(n), systHigh: new Float64Array(n),
    assumptions: ['intrinsic = measured / survival; survival from the absorption model and the emission geometry assumed'],
  };
  for (let i = 0; i < n; i++) {
    const ps = sets.map((s) => s[i]).sort((a, b) => a - b);
    const p = quantile(ps, 0.5);
    const vals = ps.map((q) => points.value[i] / q).sort((a, b) => a - b);
    out.survival[i] = p;
    out.value[i] = points.value[i] / p;
    out.errLow[i] = points.errLow[i] / p;
    out.errHigh[i] = points.errHigh[i] / p;
    out.systLow[i] = quantile(vals, 0.16);
    out.systHigh[i] = quantile(vals, 0.84);
  }
  return out;
}
