/**
 * Measured against predicted: the ratio measured / predicted with its
 * interval, the tension in Gaussian sigmas, and chi^2 over points.
 *
 * Tension (skyspan's definition): with independent Monte Carlo draws of the
 * measured value M and the prediction P, paired by index, d = M - P. The
 * two-sided probability of no difference is p = 2 min(F(0), 1 - F(0)), F the
 * empirical distribution of d, and the tension is the z with
 * 2 (1 - Phi(z)) = p (normal.ts). Counting signs makes it independent of the
 * parametrisation (the same for M/P against 1 or ln M - ln P against 0). For
 * two Gaussian quantities it equals |a - b| / sqrt(sigma_a^2 + sigma_b^2)
 * (Gaussian error propagation, common knowledge). When no draw has the other
 * sign the count only bounds it: z >= z(2/N), reported with `lowerBound`.
 * The Gaussian figure |mean d| / std d is given beside it.
 */
import { InputError } from '../core/errors.js';
import { chiSquareSurvival } from './chiSquare.js';
import { cholesky, quadraticFormInverse } from './cholesky.js';
import type { NeutrinoMeasurement, Flavour } from './measurement.js';
import { sigmaFromTwoSidedP } from './normal.js';
import type { Prediction } from './predict.js';
import { Random } from './random.js';
import { summariseSamples, type SampleSummary } from './summary.js';

/** The tension between two sample sets. */
export interface Tension {
  sigma: number;
  /** True when no draw had the other sign: sigma is a lower bound. */
  lowerBound: boolean;
  /** Two-sided probability of no difference (counting). */
  pValue: number;
  /** |mean d| / std d. */
  gaussianSigma: number;
  /** 'above' when the measurement exceeds the prediction on the median. */
  direction: 'above' | 'below';
  definition: string;
}

/** Definition text carried into outputs. */
export const TENSION_DEFINITION = 'd = measured - predicted over paired independent Monte Carlo draws; p = 2 min(P(d <= 0), P(d >= 0)); tension z with 2 (1 - Phi(z)) = p';

/** Tension from measured and predicted draws (same length; non-finite pairs are skipped). */
export function tensionFromSamples(measured: ArrayLike<number>, predicted: ArrayLike<number>): Tension {
  if (measured.length !== predicted.length) throw new RangeError('tensionFromSamples: sample sets differ in length');
  let below = 0, above = 0, n = 0, s = 0, s2 = 0;
  for (let i = 0; i < measured.length; i++) {
    const d = measured[i] - predicted[i];
    if (!Number.isFinite(d)) continue;
    n++; s += d; s2 += d * d;
    if (d <= 0) below++;
    if (d >= 0) above++;
  }
  const minCount = Math.min(below, above);
  const lowerBound = minCount === 0;
  const p = Math.min(1, (2 * Math.max(minCount, lowerBound ? 1 : 0)) / n);
  const mean = s / n, std = Math.sqrt(Math.max(0, (s2 - n * mean * mean) / (n - 1)));
  return { sigma: sigmaFromTwoSidedP(p), lowerBound, pValue: lowerBound ? 0 : p, gaussianSigma: std > 0 ? Math.abs(mean) / std : Infinity,
    direction: above >= below ? 'above' : 'below', definition: TENSION_DEFINITION };
}

/** Fraction of the all-flavour intensity in the measurement's flavour. */
export function flavourFactor(p: Prediction, flavour: Flavour): number {
  return flavour === 'all' ? 1 : p.flavourFraction[flavour];
}

/** The comparison at the reference energy. */
export interface ReferenceComparison {
  energyGeV: number;
  flavour: Flavour;
  measured: SampleSummary;
  predicted: SampleSummary;
  /** measured / predicted over the paired draws. */
  ratio: SampleSummary;
  tension: Tension;
}

/**
 * Compares a normalisation or band measurement with the prediction at the
 * measurement's E0 (the prediction must have been made at that E0). Measured
 * draws are split normals of the quoted norm, from stream 10 of `seed`.
 */
export function compareAtReference(p: Prediction, m: NeutrinoMeasurement, seed = p.seed): ReferenceComparison {
  if (m.kind === 'points') throw new InputError('a points measurement has no reference normalisation', { file: m.file, keyPath: 'kind' }, 'use the chi^2 over points');
  if (Math.abs(p.e0GeV - m.e0GeV) > 1e-9 * m.e0GeV) {
    throw new InputError(`prediction made at E0 = ${p.e0GeV} GeV, measurement at ${m.e0GeV} GeV`, { file: m.file, keyPath: 'e0' }, 'predict at the measurement\'s E0');
  }
  const n = p.combinedAtE0.length, f = flavourFactor(p, m.flavour);
  const rng = new Random(seed, 10);
  const meas = new Float64Array(n), pred = new Float64Array(n), ratio = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    meas[i] = rng.splitNormal(m.norm.value, m.norm.errLow, m.norm.errHigh);
    pred[i] = f * p.combinedAtE0[i];
    ratio[i] = meas[i] / pred[i];
  }
  return {
    energyGeV: m.e0GeV, flavour: m.flavour,
    measured: summariseSamples(meas, { label: 'measured normalisation' }),
    predicted: summariseSamples(pred, { label: 'predicted intensity at E0' }),
    ratio: summariseSamples(ratio, { label: 'measured / predicted' }),
    tension: tensionFromSamples(meas, pred),
  };
}

/** chi^2 of the prediction over measured points. */
export interface PointsComparison {
  chi2: number;
  dof: number;
  pValue: number;
  sigma: number;
  /** Per point: energy, measured, predicted median, the error used, and the pull. */
  rows: { energyGeV: number; measured: number; predicted: number; sigmaMeasured: number; sigmaPredicted: number; pull: number; upperLimit: boolean }[];
  definition: string;
}

/**
 * chi^2 = r^T (C_pred + D_meas)^-1 r over the measured (non-limit) points,
 * r = measured - predicted median; C_pred is the covariance of the combined
 * prediction draws between the points' energies (it holds the correlation the
 * shared template, absorption and method choice create); D_meas is diagonal,
 * each point's error on the side of the prediction (errHigh when the
 * prediction lies above; common practice, no source). dof = number of points
 * (nothing is fitted). The prediction must include the points' energies.
 */
export function chiSquareOverPoints(p: Prediction, m: NeutrinoMeasurement): PointsComparison {
  if (m.kind !== 'points') throw new InputError('chi^2 needs a points measurement', { file: m.file, keyPath: 'kind' });
  const f = flavourFactor(p, m.flavour), n = p.combinedAtE0.length, mE = p.energiesNuGeV.length;
  const col = (e: number) => {
    for (let j = 0; j < mE; j++) if (Math.abs(p.energiesNuGeV[j] - e) <= 1e-9 * e) return j;
    return -1;
  };
  const rows: PointsComparison['rows'] = [];
  const used: number[] = [];
  m.points.forEach((pt, i) => {
    const j = col(pt.energyGeV);
    if (j < 0) throw new InputError(`no prediction at ${pt.energyGeV} GeV`, { file: m.file, keyPath: `points[${i}].energy` }, 'the point lies outside the range the gamma rays cover');
    const c = p.components.find((x) => x.name === 'combined')!.atEnergies[j];
    const pred = f * c.median;
    const sigP = f * 0.5 * (c.p84 - c.p16);
    const sigM = pred > pt.value ? pt.errHigh : pt.errLow;
    rows.push({ energyGeV: pt.energyGeV, measured: pt.value, predicted: pred, sigmaMeasured: sigM, sigmaPredicted: sigP,
      pull: pt.upperLimit ? NaN : (pt.value - pred) / Math.hypot(sigM, sigP), upperLimit: pt.upperLimit });
    if (!pt.upperLimit) used.push(j);
  });
  const k = used.length;
  const meas = rows.filter((r) => !r.upperLimit);
  const cov = new Float64Array(k * k), mean = new Float64Array(k);
  for (let a = 0; a < k; a++) { let s = 0; for (let i = 0; i < n; i++) s += p.combinedAtEnergies[i * mE + used[a]]; mean[a] = s / n; }
  for (let a = 0; a < k; a++) for (let b = 0; b <= a; b++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += (p.combinedAtEnergies[i * mE + used[a]] - mean[a]) * (p.combinedAtEnergies[i * mE + used[b]] - mean[b]);
    cov[a * k + b] = cov[b * k + a] = (f * f * s) / (n - 1);
  }
  for (let a = 0; a < k; a++) cov[a * k + a] += meas[a].sigmaMeasured ** 2;
  const L = cholesky(cov, k);
  const r = meas.map((x) => x.measured - x.predicted);
  const chi2 = k === 0 ? 0 : L ? quadraticFormInverse(L, r, k) : NaN;
  const pValue = k === 0 ? 1 : chiSquareSurvival(chi2, k);
  return { chi2, dof: k, pValue, sigma: sigmaFromTwoSidedP(pValue), rows,
    definition: 'chi^2 = r^T (C_pred + D_meas)^-1 r, r = measured - predicted median, C_pred from the combined draws, D_meas the error on the side of the prediction; dof = points' };
}
