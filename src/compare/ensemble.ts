/**
 * The template ensemble as the comparison sees it: per template, the intensity
 * extrapolation factor k_I from the measured region A to the neutrino region,
 * optionally the template's mean gamma-ray survival probability in A (for the
 * de-absorption, intrinsic = measured / survival), and a weight. Each Monte
 * Carlo sample picks one template with probability proportional to its weight,
 * so k_I and survival of one template always go together.
 */
import { InputError } from '../core/errors.js';
import type { Random } from './random.js';

/** One template's numbers (k_I dimensionless, survival in (0, 1], weight >= 0, default 1). */
export interface TemplateFactor {
  template: string;
  kI: number;
  survivalMean?: number;
  weight?: number;
}

/** Validated ensemble with cumulative weights for sampling. */
export interface Ensemble {
  names: string[];
  kI: Float64Array;
  /** Survival per template (1 everywhere when none is given). */
  survival: Float64Array;
  hasSurvival: boolean;
  weight: Float64Array;
  cumulative: Float64Array;
  /** Weighted medians: the centre used when the template is not varied. */
  kICentral: number;
  survivalCentral: number;
}

/** Weighted median: the smallest value whose cumulative weight reaches half the total (common practice, no source). */
export function weightedMedian(values: ArrayLike<number>, weights: ArrayLike<number>): number {
  const idx = Array.from({ length: values.length }, (_, i) => i).sort((a, b) => values[a] - values[b]);
  let total = 0;
  for (const i of idx) total += weights[i];
  let acc = 0;
  for (let r = 0; r < idx.length; r++) {
    acc += weights[idx[r]];
    if (acc >= 0.5 * total * (1 - 1e-12)) {
      // an exact half at the boundary: average with the next, as for an even count
      if (Math.abs(acc - 0.5 * total) <= 1e-12 * total && r + 1 < idx.length) return 0.5 * (values[idx[r]] + values[idx[r + 1]]);
      return values[idx[r]];
    }
  }
  return NaN;
}

/** Checks the factors (throws InputError naming the entry) and prepares sampling. */
export function buildEnsemble(factors: readonly TemplateFactor[], file?: string): Ensemble {
  if (factors.length === 0) throw new InputError('no templates in the factors', { file, keyPath: 'templates' });
  const n = factors.length;
  const withS = factors.filter((f) => f.survivalMean !== undefined).length;
  if (withS !== 0 && withS !== n) {
    throw new InputError(`survivalMean given for ${withS} of ${n} templates`, { file, keyPath: 'templates' }, 'give it for all templates or none');
  }
  const withW = factors.filter((f) => f.weight !== undefined).length;
  if (withW !== 0 && withW !== n) throw new InputError(`weight given for ${withW} of ${n} templates`, { file, keyPath: 'templates' }, 'give it for all or none');
  const e: Ensemble = {
    names: [], kI: new Float64Array(n), survival: new Float64Array(n).fill(1), hasSurvival: withS === n,
    weight: new Float64Array(n).fill(1), cumulative: new Float64Array(n), kICentral: NaN, survivalCentral: 1,
  };
  const seen = new Set<string>();
  factors.forEach((f, i) => {
    const kp = `templates[${i}]`;
    if (typeof f.template !== 'string' || f.template === '') throw new InputError('template name missing', { file, keyPath: `${kp}.name` });
    if (seen.has(f.template)) throw new InputError(`template '${f.template}' appears twice`, { file, keyPath: `${kp}.name` });
    seen.add(f.template);
    if (!(f.kI > 0 && Number.isFinite(f.kI))) throw new InputError(`kI is ${f.kI}, expected a finite number > 0`, { file, keyPath: `${kp}.kI` });
    if (f.survivalMean !== undefined && !(f.survivalMean > 0 && f.survivalMean <= 1)) {
      throw new InputError(`survivalMean is ${f.survivalMean}, expected a probability in (0, 1]`, { file, keyPath: `${kp}.survivalMean` });
    }
    if (f.weight !== undefined && !(f.weight >= 0 && Number.isFinite(f.weight))) {
      throw new InputError(`weight is ${f.weight}, expected a finite number >= 0`, { file, keyPath: `${kp}.weight` });
    }
    e.names.push(f.template);
    e.kI[i] = f.kI;
    if (f.survivalMean !== undefined) e.survival[i] = f.survivalMean;
    if (f.weight !== undefined) e.weight[i] = f.weight;
  });
  let acc = 0;
  for (let i = 0; i < n; i++) { acc += e.weight[i]; e.cumulative[i] = acc; }
  if (!(acc > 0)) throw new InputError('all template weights are zero', { file, keyPath: 'templates' });
  e.kICentral = weightedMedian(e.kI, e.weight);
  e.survivalCentral = weightedMedian(e.survival, e.weight);
  return e;
}

/** Index of a template drawn with probability proportional to its weight. */
export function drawTemplate(e: Ensemble, rng: Random): number {
  const n = e.cumulative.length;
  const u = rng.uniform() * e.cumulative[n - 1];
  let i = 0;
  while (i < n - 1 && u >= e.cumulative[i]) i++;
  return i;
}
