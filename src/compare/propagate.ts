/**
 * Error propagation two ways: a seeded Monte Carlo over input distributions,
 * and first-order (linear) propagation, sigma_f^2 = g^T C g with g the
 * gradient by central differences (the standard first-order formula; common
 * practice, no source). The linear result is a cross-check of the Monte
 * Carlo where it is valid: small relative errors, smooth function.
 */
import { InputError } from '../core/errors.js';
import { Random } from './random.js';
import { summariseSamples, type SampleSummary } from './summary.js';

/** An input of a Monte Carlo. `choice` picks one of `values` with equal probability. */
export type InputDistribution =
  | { kind: 'fixed'; value: number }
  | { kind: 'normal'; mean: number; sigma: number }
  | { kind: 'splitNormal'; mode: number; sigmaLow: number; sigmaHigh: number }
  | { kind: 'uniform'; low: number; high: number }
  | { kind: 'choice'; values: readonly number[] };

/** Sample count and seed; defaults 20000 and 1. */
export interface MonteCarloOptions {
  samples?: number;
  seed?: number;
  /** Largest tolerated fraction of non-finite output samples (default 0.5). */
  maxNonFiniteFraction?: number;
}

/** Default sample count of every Monte Carlo in compare/. */
export const DEFAULT_SAMPLES = 20000;
/** Default seed. */
export const DEFAULT_SEED = 1;

/** Checks and fills in Monte Carlo options; throws InputError for a bad count or seed. */
export function resolveMonteCarloOptions(options: MonteCarloOptions = {}): { samples: number; seed: number } {
  const samples = options.samples ?? DEFAULT_SAMPLES;
  const seed = options.seed ?? DEFAULT_SEED;
  if (!(Number.isInteger(samples) && samples >= 100 && samples <= 10_000_000)) {
    throw new InputError(`sample count is ${samples}, expected an integer from 100 to 10000000`, { keyword: 'samples' });
  }
  if (!(Number.isSafeInteger(seed) && seed >= 0)) {
    throw new InputError(`seed is ${seed}, expected an integer from 0 to 2^53 - 1`, { keyword: 'seed' });
  }
  return { samples, seed };
}

/** Draws n samples of one distribution into `out` (allocated when absent). */
export function drawSamples(dist: InputDistribution, n: number, rng: Random, out = new Float64Array(n)): Float64Array {
  switch (dist.kind) {
    case 'fixed': out.fill(dist.value, 0, n); break;
    case 'normal': for (let i = 0; i < n; i++) out[i] = dist.mean + dist.sigma * rng.normal(); break;
    case 'splitNormal': for (let i = 0; i < n; i++) out[i] = rng.splitNormal(dist.mode, dist.sigmaLow, dist.sigmaHigh); break;
    case 'uniform': for (let i = 0; i < n; i++) out[i] = dist.low + (dist.high - dist.low) * rng.uniform(); break;
    case 'choice': {
      const m = dist.values.length;
      if (m === 0) throw new InputError('a choice distribution needs at least one value');
      for (let i = 0; i < n; i++) out[i] = dist.values[rng.integer(m)];
      break;
    }
  }
  return out;
}

/** Centre and one-sigma width of a distribution for linear propagation (the mode for a split normal, mean half-error). */
export function linearInput(dist: InputDistribution): { centre: number; sigma: number } {
  switch (dist.kind) {
    case 'fixed': return { centre: dist.value, sigma: 0 };
    case 'normal': return { centre: dist.mean, sigma: dist.sigma };
    case 'splitNormal': return { centre: dist.mode, sigma: 0.5 * (dist.sigmaLow + dist.sigmaHigh) };
    case 'uniform': return { centre: 0.5 * (dist.low + dist.high), sigma: (dist.high - dist.low) / Math.sqrt(12) };
    case 'choice': {
      const m = dist.values.length;
      const mean = dist.values.reduce((a, b) => a + b, 0) / m;
      const v = dist.values.reduce((a, b) => a + (b - mean) * (b - mean), 0) / Math.max(1, m - 1);
      return { centre: mean, sigma: Math.sqrt(v) };
    }
  }
}

/** Result of {@link monteCarlo}. */
export interface MonteCarloResult {
  samples: Float64Array;
  summary: SampleSummary;
  seed: number;
}

/**
 * Monte Carlo propagation: draws every input independently (in the order of
 * the keys of `inputs`, all samples of one input before the next), evaluates
 * `fn` per sample and summarises. Same inputs, options and key order give
 * the same samples exactly.
 *
 * @example
 * monteCarlo({ a: { kind: 'normal', mean: 1, sigma: 0.1 } }, (x) => 2 * x.a, { samples: 1000, seed: 1 }).summary.median // about 2
 */
export function monteCarlo(
  inputs: Record<string, InputDistribution>,
  fn: (x: Record<string, number>) => number,
  options: MonteCarloOptions & { label?: string } = {},
): MonteCarloResult {
  const { samples: n, seed } = resolveMonteCarloOptions(options);
  const rng = new Random(seed);
  const names = Object.keys(inputs);
  const columns = names.map((k) => drawSamples(inputs[k], n, rng));
  const out = new Float64Array(n);
  const x: Record<string, number> = {};
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < names.length; j++) x[names[j]] = columns[j][i];
    out[i] = fn(x);
  }
  const summary = summariseSamples(out, { label: options.label, maxNonFiniteFraction: options.maxNonFiniteFraction });
  return { samples: out, summary, seed };
}

/** Result of {@link linearPropagate}. */
export interface LinearResult {
  value: number;
  sigma: number;
  /** d f / d x_i at the centre. */
  gradient: Float64Array;
  /** Variance contributed by each input alone, g_i^2 sigma_i^2 (uncorrelated inputs). */
  variances: Float64Array;
}

/**
 * First-order propagation: f(x0) and sigma_f^2 = sum_i (df/dx_i)^2 sigma_i^2
 * for uncorrelated inputs, or g^T C g when a covariance C (row-major m x m) is
 * given. Derivatives by central differences with step 1e-4 sigma_i (inputs
 * with sigma 0 are skipped).
 */
export function linearPropagate(fn: (x: Float64Array) => number, centre: ArrayLike<number>, sigma: ArrayLike<number>,
  covariance?: ArrayLike<number>): LinearResult {
  const m = centre.length;
  const x = Float64Array.from(centre);
  const value = fn(x);
  const gradient = new Float64Array(m), variances = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    if (!(sigma[i] > 0)) continue;
    const h = 1e-4 * sigma[i];
    x[i] = centre[i] + h; const up = fn(x);
    x[i] = centre[i] - h; const down = fn(x);
    x[i] = centre[i];
    gradient[i] = (up - down) / (2 * h);
    variances[i] = gradient[i] * gradient[i] * sigma[i] * sigma[i];
  }
  let total = 0;
  if (covariance) {
    for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) total += gradient[i] * covariance[i * m + j] * gradient[j];
  } else {
    for (let i = 0; i < m; i++) total += variances[i];
  }
  return { value, sigma: Math.sqrt(Math.max(0, total)), gradient, variances };
}

/** How a linear propagation and a Monte Carlo summary compare. */
export interface LinearCheck {
  linearValue: number;
  linearSigma: number;
  mcMedian: number;
  /** Monte Carlo one-sigma half-width, (p84 - p16) / 2. */
  mcHalfWidth: number;
  /** (mcHalfWidth - linearSigma) / linearSigma. */
  relativeWidthDifference: number;
  /** (mcMedian - linearValue) / linearSigma. */
  centreShiftInSigma: number;
  /** Linear propagation is meaningful here: relative output error below `maxRelativeError`. */
  valid: boolean;
  /** Both differences within the tolerance. */
  agrees: boolean;
  note: string;
}

/**
 * Compares linear propagation with a Monte Carlo summary. Linear propagation
 * is called valid when linearSigma / |linearValue| < maxRelativeError (default
 * 0.2): beyond that, second-order terms matter (common practice, no source).
 * Agreement: width and centre within `tolerance` (default 0.1) of linearSigma.
 */
export function checkLinear(linear: { value: number; sigma: number }, mc: SampleSummary,
  options: { tolerance?: number; maxRelativeError?: number } = {}): LinearCheck {
  const tol = options.tolerance ?? 0.1, maxRel = options.maxRelativeError ?? 0.2;
  const half = 0.5 * (mc.p84 - mc.p16);
  const relW = linear.sigma > 0 ? (half - linear.sigma) / linear.sigma : (half === 0 ? 0 : Infinity);
  const shift = linear.sigma > 0 ? (mc.median - linear.value) / linear.sigma : (mc.median === linear.value ? 0 : Infinity);
  const valid = Number.isFinite(linear.value) && linear.value !== 0 && linear.sigma / Math.abs(linear.value) < maxRel;
  const agrees = Math.abs(relW) <= tol && Math.abs(shift) <= tol;
  const note = !valid
    ? `linear propagation not valid here (relative error ${(linear.sigma / Math.abs(linear.value)).toPrecision(2)} >= ${maxRel}); the Monte Carlo stands alone`
    : agrees ? `linear and Monte Carlo agree (width ${(100 * relW).toFixed(1)} %, centre ${shift.toFixed(3)} sigma)`
      : `linear and Monte Carlo differ (width ${(100 * relW).toFixed(1)} %, centre ${shift.toFixed(3)} sigma): non-linear or asymmetric inputs`;
  return { linearValue: linear.value, linearSigma: linear.sigma, mcMedian: mc.median, mcHalfWidth: half,
    relativeWidthDifference: relW, centreShiftInSigma: shift, valid, agrees, note };
}
