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
 *
 * The Monte Carlo p-value carries its own uncertainty: with k of the N draws
 * on the minority side, p = 2k/N has the binomial standard error
 * 2 sqrt(q (1 - q) / N), q = k/N; when fewer than {@link FEW_CROSSINGS} draws
 * cross, a 95 % upper bound on p is given too, 2 q_up with
 * q_up = chi^2_{2k+2}(0.95) / (2N) (the Poisson limit of the binomial, Garwood
 * 1936, Biometrika 28, 437), and the tension's 95 % lower bound from it.
 *
 * A measurement given as a likelihood (profile or upper limit; profile.ts) is
 * compared through its signed root r: F = mean over the prediction draws of
 * Phi(r(P_s)) is the probability that the measurement lies below the
 * prediction (Wilks' theorem, one degree of freedom); p = 2 min(F, 1 - F)
 * two-sided for a profile, p = 1 - F one-sided for an upper limit. For a
 * prediction without spread this is P(chi^2_1 >= q(P)). Its Monte Carlo
 * uncertainty is the standard error of that mean.
 */
import { InputError } from '../core/errors.js';
import { chiSquareSurvival, chiSquareUpperQuantile } from './chiSquare.js';
import { cholesky, quadraticFormInverse } from './cholesky.js';
import type { NeutrinoMeasurement, Flavour } from './measurement.js';
import { normalCdf, normalQuantile, sigmaFromTwoSidedP } from './normal.js';
import { muAtSignedRoot, signedRoot, signedRootAt, type SignedRoot } from './profile.js';
import type { Prediction } from './predict.js';
import { quantileSorted } from '../scaling/quantiles.js';
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
  /** Two-sided (a value or profile) or one-sided (an upper limit). */
  sided: 'two' | 'one';
  /** Monte Carlo standard error of pValue (binomial for counted draws). */
  pValueStdError: number;
  /** Draws used, and how many of them decided p (on the minority side; all of them for a likelihood). */
  draws: number;
  decidingDraws: number;
  /** When few draws decided p: a 95 % upper bound on p and the tension's 95 % lower bound from it. */
  pValueUpper95?: number;
  sigmaLower95?: number;
  definition: string;
}

/** Below this many crossing draws a counted p-value also gets a 95 % upper bound (common practice, no source). */
export const FEW_CROSSINGS = 25;

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
  const q = minCount / n;
  const few = minCount < FEW_CROSSINGS;
  const pUp = few ? Math.min(1, chiSquareUpperQuantile(0.05, 2 * minCount + 2) / n) : undefined;
  return { sigma: sigmaFromTwoSidedP(p), lowerBound, pValue: lowerBound ? 0 : p, gaussianSigma: std > 0 ? Math.abs(mean) / std : Infinity,
    direction: above >= below ? 'above' : 'below', sided: 'two', pValueStdError: 2 * Math.sqrt(q * (1 - q) / n), draws: n, decidingDraws: minCount,
    pValueUpper95: pUp, sigmaLower95: pUp === undefined ? undefined : sigmaFromTwoSidedP(pUp), definition: TENSION_DEFINITION };
}

/** Definition text of the likelihood comparison. */
export const LIKELIHOOD_DEFINITION = 'F = mean over the prediction draws of Phi(r(P)), r the signed root of the measurement\'s -2 Delta lnL (Wilks\' theorem, 1 dof); ' +
  'p = 2 min(F, 1 - F) for a profile (tension z with 2 (1 - Phi(z)) = p), p = 1 - F one-sided for an upper limit (z = Phi^-1(1 - p))';

/** Tension of prediction draws against a likelihood's signed root (see the module comment). */
export function tensionFromLikelihood(sr: SignedRoot, predicted: ArrayLike<number>): Tension {
  const n = predicted.length;
  let s = 0, s2 = 0;
  for (let i = 0; i < n; i++) { const h = normalCdf(signedRootAt(sr, predicted[i])); s += h; s2 += h * h; }
  const F = s / n, se = Math.sqrt(Math.max(0, (s2 / n - F * F) / Math.max(1, n - 1)));
  const sorted = Float64Array.from(predicted).sort();
  const med = quantileSorted(sorted, 0.5), half = 0.5 * (quantileSorted(sorted, 0.8413447460685429) - quantileSorted(sorted, 0.15865525393145707));
  const sideSigma = med > sr.best ? (sr.kind === 'upperLimit' ? sr.high : sr.high - sr.best) : sr.best - sr.low;
  const gaussianSigma = Math.abs(med - sr.best) / Math.hypot(Number.isFinite(sideSigma) ? sideSigma : NaN, half);
  if (sr.kind === 'upperLimit') {
    const p = Math.min(1, Math.max(0, 1 - F));
    return { sigma: Math.max(0, -normalQuantile(p)), lowerBound: false, pValue: p, gaussianSigma, direction: 'below', sided: 'one',
      pValueStdError: se, draws: n, decidingDraws: n, definition: LIKELIHOOD_DEFINITION };
  }
  const p = Math.min(1, 2 * Math.min(F, 1 - F));
  return { sigma: sigmaFromTwoSidedP(p), lowerBound: false, pValue: p, gaussianSigma, direction: F > 0.5 ? 'below' : 'above', sided: 'two',
    pValueStdError: 2 * se, draws: n, decidingDraws: n, definition: LIKELIHOOD_DEFINITION };
}

/**
 * One phrase for a tension's p-value and its Monte Carlo uncertainty, e.g.
 * "two-sided p = 0.0239 +- 0.0011 (binomial), decided by 239 of 20000 draws".
 */
export function describePValue(t: Tension): string {
  const f = (x: number) => x.toPrecision(3);
  const kind = t.definition === TENSION_DEFINITION ? 'binomial' : 'standard error of the mean over the draws';
  const decided = t.decidingDraws === t.draws ? `all ${t.draws} draws enter` : `decided by ${t.decidingDraws} of ${t.draws} draws`;
  const bound = t.pValueUpper95 !== undefined ? `; few draws decided it: p < ${f(t.pValueUpper95)} and tension > ${t.sigmaLower95!.toFixed(2)} sigma at 95 % confidence` : '';
  return `${t.sided}-sided p = ${t.lowerBound ? `< ${f(2 / t.draws)}` : `${f(t.pValue)} +- ${f(t.pValueStdError)} (${kind})`}, ${decided}${bound}`;
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
  /** How the measured draws were made (differs between a split normal and a likelihood). */
  measuredDefinition: string;
  notes: string[];
}

/**
 * Compares a normalisation or band measurement with the prediction at the
 * measurement's E0 (the prediction must have been made at that E0). Measured
 * draws, from stream 10 of `seed`: split normals of the quoted norm (its mode
 * is the quoted value, so their median differs from it), or, for a
 * likelihood, draws of its confidence distribution mu = r^-1(z), z ~ N(0, 1)
 * (median = best fit); the tension then comes from {@link tensionFromLikelihood}.
 */
export function compareAtReference(p: Prediction, m: NeutrinoMeasurement, seed = p.seed): ReferenceComparison {
  if (m.kind === 'points') throw new InputError('a points measurement has no reference normalisation', { file: m.file, keyPath: 'kind' }, 'use the chi^2 over points');
  if (Math.abs(p.e0GeV - m.e0GeV) > 1e-9 * m.e0GeV) {
    throw new InputError(`prediction made at E0 = ${p.e0GeV} GeV, measurement at ${m.e0GeV} GeV`, { file: m.file, keyPath: 'e0' }, 'predict at the measurement\'s E0');
  }
  const n = p.combinedAtE0.length, f = flavourFactor(p, m.flavour);
  const rng = new Random(seed, 10);
  const sr = m.likelihood ? signedRoot(m.likelihood, m.file) : null;
  const meas = new Float64Array(n), pred = new Float64Array(n), ratio = new Float64Array(n);
  let outside = 0;
  for (let i = 0; i < n; i++) {
    meas[i] = sr ? muAtSignedRoot(sr, rng.normal()) : rng.splitNormal(m.norm.value, m.norm.errLow, m.norm.errHigh);
    pred[i] = f * p.combinedAtE0[i];
    ratio[i] = meas[i] / pred[i];
    if (sr && sr.kind === 'profile' && (pred[i] < sr.mu[0] || pred[i] > sr.mu[sr.mu.length - 1])) outside++;
  }
  const notes: string[] = [];
  const ul = m.likelihood?.kind === 'upperLimit' ? m.likelihood : null;
  if (outside > 0) notes.push(`${outside} of ${n} predicted draws lie outside the profile table; its signed root was continued linearly there (a Gaussian tail)`);
  const measuredDefinition = !sr ? `split-normal draws of the quoted value ${m.norm.value.toPrecision(4)} -${m.norm.errLow.toPrecision(3)} +${m.norm.errHigh.toPrecision(3)} (mode = quoted value; their median is not the quoted value when the errors differ)`
    : sr.kind === 'profile' ? 'draws of the profile\'s confidence distribution (median = best fit, 16/84 % = the -2 Delta lnL = 1 crossings)'
      : `upper limit ${ul!.limit.toPrecision(4)} at ${(100 * ul!.confidence).toPrecision(3)} % one-sided: draws of a Gaussian centred on zero whose quantile is the limit`;
  return {
    energyGeV: m.e0GeV, flavour: m.flavour,
    measured: summariseSamples(meas, { label: 'measured normalisation' }),
    predicted: summariseSamples(pred, { label: 'predicted intensity at E0' }),
    ratio: summariseSamples(ratio, { label: 'measured / predicted' }),
    tension: sr ? tensionFromLikelihood(sr, pred) : tensionFromSamples(meas, pred),
    measuredDefinition, notes,
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
