/**
 * Summaries of Monte Carlo samples: median, 16/84 and 2.5/97.5 percentiles,
 * mean and standard deviation, with non-finite samples counted, dropped and
 * reported. A set whose samples are mostly non-finite cannot be summarised
 * honestly and is a ComputeError. Quantiles: type 7 of Hyndman & Fan 1996
 * (scaling/quantiles.ts, the one quantile module).
 */
import { ComputeError } from '../core/errors.js';
import { kahanSum } from '../core/math.js';
import { quantileSorted } from '../scaling/quantiles.js';

/** Summary of one Monte Carlo quantity. Percentiles are of the finite samples. */
export interface SampleSummary {
  /** Samples drawn. */
  n: number;
  /** Finite samples, the ones summarised. */
  finite: number;
  median: number;
  /** Lower one-sigma point: the Phi(-1) = 15.87 percent quantile. */
  p16: number;
  /** Upper one-sigma point: the Phi(+1) = 84.13 percent quantile. */
  p84: number;
  p2_5: number;
  p97_5: number;
  mean: number;
  /** Sample standard deviation (n - 1 in the denominator). */
  std: number;
  /** Marked problems, e.g. "12 of 20000 samples (0.06 %) non-finite, dropped". Empty when clean. */
  warnings: string[];
}

/** Options of {@link summariseSamples}. */
export interface SummaryOptions {
  /** Name of the quantity, for messages. */
  label?: string;
  /** Largest tolerated fraction of non-finite samples (default 0.5); above it, ComputeError. */
  maxNonFiniteFraction?: number;
}

/** Copies the finite values of `samples` into a new sorted Float64Array. */
export function sortedFinite(samples: ArrayLike<number>): Float64Array {
  let m = 0;
  for (let i = 0; i < samples.length; i++) if (Number.isFinite(samples[i])) m++;
  const out = new Float64Array(m);
  let k = 0;
  for (let i = 0; i < samples.length; i++) if (Number.isFinite(samples[i])) out[k++] = samples[i];
  return out.sort();
}

/**
 * Summarises samples. Non-finite samples (NaN, +-Infinity: e.g. a negative
 * draw of an intensity taken to a logarithm) are dropped and reported in
 * `warnings`; if more than `maxNonFiniteFraction` of them are non-finite, or
 * none is finite, throws ComputeError.
 */
export function summariseSamples(samples: ArrayLike<number>, options: SummaryOptions = {}): SampleSummary {
  const label = options.label ?? 'quantity';
  const maxBad = options.maxNonFiniteFraction ?? 0.5;
  const n = samples.length;
  const sorted = sortedFinite(samples);
  const finite = sorted.length;
  const bad = n - finite;
  if (finite === 0 || bad > maxBad * n) {
    throw new ComputeError(`Monte Carlo of ${label}: ${bad} of ${n} samples are non-finite ` +
      `(more than ${(100 * maxBad).toFixed(0)} %); the result cannot be trusted ` +
      '(check for zero or negative intensities, factors or survival probabilities)');
  }
  const mean = kahanSum(sorted) / finite;
  let ss = 0;
  for (let i = 0; i < finite; i++) { const d = sorted[i] - mean; ss += d * d; }
  const warnings: string[] = [];
  if (bad > 0) {
    warnings.push(`${label}: ${bad} of ${n} samples (${(100 * bad / n).toPrecision(2)} %) non-finite, dropped; ` +
      'the summary is of the finite ones');
  }
  return {
    n, finite,
    median: quantileSorted(sorted, 0.5),
    p16: quantileSorted(sorted, 0.15865525393145707),
    p84: quantileSorted(sorted, 0.8413447460685429),
    p2_5: quantileSorted(sorted, 0.025),
    p97_5: quantileSorted(sorted, 0.975),
    mean,
    std: finite > 1 ? Math.sqrt(ss / (finite - 1)) : 0,
    warnings,
  };
}
