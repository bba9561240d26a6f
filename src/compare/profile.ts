/**
 * A neutrino normalisation given as a likelihood: a profile table of
 * -2 Delta ln L against the normalisation, or an upper limit at a stated
 * one-sided confidence level. Both are turned into a signed root
 *
 *   r(mu) = sign(mu - mu_hat) sqrt(q(mu)),   q = -2 Delta ln L,
 *
 * which by Wilks' theorem (Wilks 1938, Ann. Math. Stat. 9, 60) is a standard
 * normal deviate under the hypothesis that the true normalisation is mu, for
 * one degree of freedom: a prediction P then has the two-sided p-value
 * P(chi^2_1 >= q(P)) = 2 (1 - Phi(|r(P)|)) and the tension |r(P)| sigma.
 *
 * - Profile table: mu_hat and q_min from the parabola through the lowest
 *   tabulated point and its neighbours; q is shifted to 0 there; r is linear
 *   between the tabulated points (exact for a parabolic profile, whose r is a
 *   straight line), and continued with the end segments' slopes beyond them
 *   (a Gaussian tail; a note says when this was used).
 * - Upper limit u at one-sided confidence c: a Gaussian measurement centred on
 *   zero whose c-quantile is u (the usual reading of a limit from a null
 *   result; skyspan's choice, stated), r(mu) = z_c mu / u, z_c = Phi^-1(c). Its
 *   p-value is one-sided: 1 - Phi(r(P)), equal to 1 - c at P = u.
 * Units: the normalisation's (GeV^-1 cm^-2 s^-1 sr^-1 inside).
 */
import { InputError } from '../core/errors.js';
import { normalQuantile } from './normal.js';

/** A likelihood of the normalisation (internal units). */
export type NormLikelihood =
  | { kind: 'profile'; norm: Float64Array; deltaTs: Float64Array }
  | { kind: 'upperLimit'; limit: number; confidence: number };

/** A prepared signed root: r at knots (increasing mu), linear between, linear continuation outside. */
export interface SignedRoot {
  kind: NormLikelihood['kind'];
  mu: Float64Array;
  r: Float64Array;
  /** Best fit (0 for an upper limit) and the Delta q = 1 crossings (NaN where the table does not reach). */
  best: number;
  low: number;
  high: number;
}

function segment(mu: Float64Array, x: number): number {
  const n = mu.length;
  let i = 0;
  while (i < n - 2 && x > mu[i + 1]) i++;
  return i;
}

/** r(x) by linear interpolation of the knots (continued linearly beyond them). */
export function signedRootAt(s: SignedRoot, x: number): number {
  const i = segment(s.mu, x);
  return s.r[i] + (s.r[i + 1] - s.r[i]) * (x - s.mu[i]) / (s.mu[i + 1] - s.mu[i]);
}

/** The mu with r(mu) = z (the inverse of {@link signedRootAt}; r is increasing). */
export function muAtSignedRoot(s: SignedRoot, z: number): number {
  const n = s.r.length;
  let i = 0;
  while (i < n - 2 && z > s.r[i + 1]) i++;
  return s.mu[i] + (s.mu[i + 1] - s.mu[i]) * (z - s.r[i]) / (s.r[i + 1] - s.r[i]);
}

/** Builds the signed root of a likelihood; throws InputError for a table that is not a profile around one minimum. */
export function signedRoot(l: NormLikelihood, file?: string): SignedRoot {
  if (l.kind === 'upperLimit') {
    const z = normalQuantile(l.confidence), sigma = l.limit / z;
    return { kind: 'upperLimit', mu: Float64Array.of(0, l.limit), r: Float64Array.of(0, z), best: 0, low: -sigma, high: sigma };
  }
  const n = l.norm.length;
  const where = { file, keyPath: 'profile' };
  if (n < 3 || l.deltaTs.length !== n) throw new InputError(`profile has ${n} normalisations and ${l.deltaTs.length} values`, where, 'give at least 3 pairs');
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(l.norm[i]) || !Number.isFinite(l.deltaTs[i])) throw new InputError(`profile entry ${i} is not finite`, { file, keyPath: `profile[${i}]` });
    if (i > 0 && !(l.norm[i] > l.norm[i - 1])) throw new InputError('profile normalisations must increase', { file, keyPath: `profile.norm[${i}]` });
  }
  let k = 0;
  for (let i = 1; i < n; i++) if (l.deltaTs[i] < l.deltaTs[k]) k = i;
  for (let i = 0; i < n; i++) {
    const worse = i < k ? l.deltaTs[i] < l.deltaTs[i + 1] : i > k ? l.deltaTs[i] < l.deltaTs[i - 1] : false;
    if (worse) throw new InputError(`profile is not single-minimum: -2 Delta lnL falls again at entry ${i}`, { file, keyPath: `profile.deltaTs[${i}]` },
      'give the profile of one best fit (it must rise on both sides of its minimum)');
  }
  // minimum: vertex of the parabola through k-1, k, k+1 (at an end, the end point)
  let best = l.norm[k], qMin = l.deltaTs[k];
  if (k > 0 && k < n - 1) {
    const [x0, x1, x2] = [l.norm[k - 1], l.norm[k], l.norm[k + 1]], [y0, y1, y2] = [l.deltaTs[k - 1], l.deltaTs[k], l.deltaTs[k + 1]];
    const d01 = (y1 - y0) / (x1 - x0), d12 = (y2 - y1) / (x2 - x1), a = (d12 - d01) / (x2 - x0);
    if (a > 0) {
      best = 0.5 * (x0 + x1) - d01 / (2 * a);
      qMin = Math.min(y1, y1 + (best - x1) * (d01 + a * (best - x0)));
    }
  }
  const mu: number[] = [], r: number[] = [];
  for (let i = 0; i < n; i++) {
    const x = l.norm[i];
    if (Math.abs(x - best) <= 1e-12 * Math.max(Math.abs(x), Math.abs(best))) continue;
    if (x > best && (mu.length === 0 || mu[mu.length - 1] < best)) { mu.push(best); r.push(0); }
    mu.push(x); r.push(Math.sign(x - best) * Math.sqrt(Math.max(0, l.deltaTs[i] - qMin)));
  }
  if (mu[mu.length - 1] < best) { mu.push(best); r.push(0); }
  if (mu[0] > best) { mu.unshift(best); r.unshift(0); }
  const s: SignedRoot = { kind: 'profile', mu: Float64Array.from(mu), r: Float64Array.from(r), best, low: NaN, high: NaN };
  for (let i = 1; i < s.r.length; i++) if (!(s.r[i] > s.r[i - 1])) throw new InputError('profile is flat between two entries', { file, keyPath: 'profile' });
  if (s.r[0] <= -1) s.low = muAtSignedRoot(s, -1);
  if (s.r[s.r.length - 1] >= 1) s.high = muAtSignedRoot(s, 1);
  return s;
}
