/**
 * A neutrino measurement to compare with, read from skyspan's YAML format:
 *
 * ```yaml
 * # invented example
 * kind: normalisation          # normalisation | points | band
 * label: invented diffuse fit
 * flavour: all                 # all | e | mu | tau (one flavour: neutrinos plus antineutrinos)
 * energyUnit: TeV
 * valueUnit: GeV^-1 cm^-2 s^-1 sr^-1   # or E^2-weighted, e.g. GeV cm^-2 s^-1 sr^-1
 * e0: 100                      # normalisation, band: reference energy
 * norm: 1.5e-18                # the quoted value (mode of a split normal)
 * errLow: 0.4e-18              # 1-sigma errors below and above (or err: symmetric)
 * errHigh: 0.6e-18
 * index: 2.7                   # normalisation: the assumed spectral index
 * indexRange: [2.5, 2.9]       # band: the range of indices
 * energyRange: [10, 1000]      # optional (required for band), energyUnit
 * profile:                     # optional (normalisation, band): the likelihood profile in norm
 *   norm: [0.5e-18, 1e-18, 1.5e-18, 2e-18]   # valueUnit at e0, increasing
 *   deltaTs: [4.1, 0.9, 0.1, 1.6]            # -2 Delta lnL; or ts: test statistic against zero
 *                                            # flux (then -2 Delta lnL = max(ts) - ts)
 * upperLimit: 3e-18            # optional instead of norm: an upper limit on norm ...
 * cl: 0.9                      # ... at this one-sided confidence level (default 0.9)
 * points:                      # kind points: energy, value, errLow/errHigh or err, ul
 *   - { energy: 50, value: 2e-18, errLow: 5e-19, errHigh: 6e-19 }
 * ```
 *
 * The intensity is the mean over the neutrino analysis's region, per sr. A
 * value in an E^2-weighted unit is divided by E^2 at its energy. Errors are
 * read as a split normal (splitNormal.ts). A profile or an upper limit makes
 * the comparison a likelihood one (profile.ts, Wilks' theorem with one degree
 * of freedom); without `norm`, the profile's best fit and its Delta = 1
 * crossings stand in for the quoted value (plots, the forecast), and an upper
 * limit alone stands in as the limit with no errors. Bad input throws
 * InputError with the key path.
 */
import { readInputText } from '../io/inputFile.js';
import { parse as parseYaml } from 'yaml';
import { z } from 'zod';
import { InputError } from '../core/errors.js';
import { energyUnitFactor, intensityToInternal } from '../physics/units.js';
import { signedRoot, type NormLikelihood } from './profile.js';

/** One-sided confidence level of a neutrino upper limit when `cl` is absent (skyspan's default, the common choice for neutrino limits). */
export const DEFAULT_NEUTRINO_UL_CL = 0.9;

/** A flavour selection: all flavours summed, or one flavour. */
export type Flavour = 'all' | 'e' | 'mu' | 'tau';

/** A value with split-normal errors, internal units (GeV^-1 cm^-2 s^-1 sr^-1). */
export interface QuotedValue { value: number; errLow: number; errHigh: number }

/** A measurement in internal units (GeV, GeV^-1 cm^-2 s^-1 sr^-1). */
export type NeutrinoMeasurement = {
  label: string;
  flavour: Flavour;
  file?: string;
  energyRangeGeV?: [number, number];
} & (
  | { kind: 'normalisation'; e0GeV: number; norm: QuotedValue; index: number; likelihood?: NormLikelihood }
  | { kind: 'band'; e0GeV: number; norm: QuotedValue; indexRange: [number, number]; energyRangeGeV: [number, number]; likelihood?: NormLikelihood }
  | { kind: 'points'; points: (QuotedValue & { energyGeV: number; upperLimit: boolean })[] }
);

const finite = z.number().refine(Number.isFinite, 'must be a finite number');
const positive = finite.refine((v) => v > 0, 'must be > 0');
const nonNeg = finite.refine((v) => v >= 0, 'must be >= 0');
const range = z.tuple([positive, positive]).refine((r) => r[1] > r[0], 'must be [low, high] with low < high');
const errs = { err: nonNeg.optional(), errLow: nonNeg.optional(), errHigh: nonNeg.optional() };
const common = {
  label: z.string().optional(),
  flavour: z.enum(['all', 'e', 'mu', 'tau']).default('all'),
  energyUnit: z.string(),
  valueUnit: z.string(),
  energyRange: range.optional(),
};
const likelihood = {
  profile: z.strictObject({ norm: z.array(finite).min(3), deltaTs: z.array(finite).optional(), ts: z.array(finite).optional() })
    .refine((p) => (p.deltaTs === undefined) !== (p.ts === undefined), 'give deltaTs or ts (one of them)').optional(),
  upperLimit: positive.optional(),
  cl: finite.refine((c) => c > 0.5 && c < 1, 'must be a one-sided confidence level between 0.5 and 1, e.g. 0.9').optional(),
};
const schema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('normalisation'), ...common, e0: positive, norm: positive.optional(), ...errs, ...likelihood, index: finite }),
  z.strictObject({ kind: z.literal('band'), ...common, e0: positive, norm: positive.optional(), ...errs, ...likelihood, indexRange: z.tuple([finite, finite]).refine((r) => r[1] >= r[0], 'must be [low, high]'), energyRange: range }),
  z.strictObject({ kind: z.literal('points'), ...common, points: z.array(z.strictObject({ energy: positive, value: positive, ...errs, ul: z.boolean().default(false) })).min(1) }),
]);

function keyPathOf(path: readonly PropertyKey[]): string {
  return path.map((p, i) => (typeof p === 'number' ? `[${p}]` : (i === 0 ? String(p) : `.${String(p)}`))).join('') || '(document)';
}

function quoted(v: { err?: number; errLow?: number; errHigh?: number }, where: { file?: string; keyPath: string }, allowNone: boolean): [number, number] {
  const lo = v.errLow ?? v.err, hi = v.errHigh ?? v.err;
  if (lo === undefined || hi === undefined) {
    if (allowNone) return [0, 0];
    throw new InputError('errors missing', where, 'give err, or errLow and errHigh');
  }
  return [lo, hi];
}

/** Validates a parsed document (an object) and converts it to internal units. */
export function parseMeasurement(doc: unknown, file?: string): NeutrinoMeasurement {
  const r = schema.safeParse(doc);
  if (!r.success) {
    const issue = r.error.issues[0];
    throw new InputError(issue.message, { file, keyPath: keyPathOf(issue.path) },
      'see the measurement format: kind normalisation, points or band');
  }
  const d = r.data;
  const ef = energyUnitFactor(d.energyUnit, { file, keyPath: 'energyUnit' });
  const toI = (v: number, eGeV: number, keyPath: string) => intensityToInternal(v, d.valueUnit, eGeV, { file, keyPath });
  const base = { label: d.label ?? (file ?? 'neutrino measurement'), flavour: d.flavour as Flavour, file,
    energyRangeGeV: d.energyRange ? [d.energyRange[0] * ef, d.energyRange[1] * ef] as [number, number] : undefined };
  if (d.kind === 'points') {
    const points = d.points.map((p, i) => {
      const e = p.energy * ef;
      const [lo, hi] = quoted(p, { file, keyPath: `points[${i}].err` }, p.ul);
      return { energyGeV: e, value: toI(p.value, e, `points[${i}].value`), errLow: toI(lo, e, `points[${i}].errLow`),
        errHigh: toI(hi, e, `points[${i}].errHigh`), upperLimit: p.ul };
    });
    return { ...base, kind: 'points', points };
  }
  const e0 = d.e0 * ef;
  const { norm, likelihood } = normAndLikelihood(d, (v, k) => toI(v, e0, k), file);
  if (d.kind === 'normalisation') return { ...base, kind: 'normalisation', e0GeV: e0, norm, index: d.index, likelihood };
  return { ...base, kind: 'band', e0GeV: e0, norm, indexRange: [d.indexRange[0], d.indexRange[1]], energyRangeGeV: base.energyRangeGeV!, likelihood };
}

type NormDoc = { norm?: number; err?: number; errLow?: number; errHigh?: number; upperLimit?: number; cl?: number;
  profile?: { norm: number[]; deltaTs?: number[]; ts?: number[] } };

/** The quoted value and the likelihood of a normalisation or band (see the module comment). */
function normAndLikelihood(d: NormDoc, toI: (v: number, keyPath: string) => number, file?: string): { norm: QuotedValue; likelihood?: NormLikelihood } {
  const given = [d.norm !== undefined, d.profile !== undefined, d.upperLimit !== undefined].filter(Boolean).length;
  if (given === 0) throw new InputError('no normalisation', { file, keyPath: 'norm' }, 'give norm with errors, a profile, or an upperLimit');
  if (d.upperLimit !== undefined && given > 1) throw new InputError('upperLimit given together with norm or profile', { file, keyPath: 'upperLimit' }, 'give one of them');
  if (d.cl !== undefined && d.upperLimit === undefined) throw new InputError('cl given without upperLimit', { file, keyPath: 'cl' });
  if (d.upperLimit !== undefined) {
    const limit = toI(d.upperLimit, 'upperLimit');
    return { norm: { value: limit, errLow: 0, errHigh: 0 }, likelihood: { kind: 'upperLimit', limit, confidence: d.cl ?? DEFAULT_NEUTRINO_UL_CL } };
  }
  let likelihood: NormLikelihood | undefined;
  if (d.profile) {
    const q = d.profile.deltaTs ?? d.profile.ts!;
    if (q.length !== d.profile.norm.length) throw new InputError(`profile has ${d.profile.norm.length} norm and ${q.length} ${d.profile.deltaTs ? 'deltaTs' : 'ts'} values`, { file, keyPath: 'profile' });
    const maxTs = Math.max(...q);
    likelihood = { kind: 'profile', norm: Float64Array.from(d.profile.norm, (v, i) => toI(v, `profile.norm[${i}]`)),
      deltaTs: Float64Array.from(q, (v) => (d.profile!.deltaTs ? v : maxTs - v)) };
  }
  if (d.norm !== undefined) {
    const [lo, hi] = quoted(d, { file, keyPath: 'err' }, false);
    return { norm: { value: toI(d.norm, 'norm'), errLow: toI(lo, 'errLow'), errHigh: toI(hi, 'errHigh') }, likelihood };
  }
  const s = signedRoot(likelihood!, file);
  if (!(Number.isFinite(s.low) && Number.isFinite(s.high))) {
    throw new InputError('the profile does not reach -2 Delta lnL = 1 on both sides of its minimum', { file, keyPath: 'profile' }, 'extend the table, or give norm with errors');
  }
  return { norm: { value: s.best, errLow: s.best - s.low, errHigh: s.high - s.best }, likelihood };
}

/** Reads a measurement YAML (or JSON) file. */
export function readMeasurement(path: string): NeutrinoMeasurement {
  const text = readInputText(path);
  let doc: unknown;
  try { doc = parseYaml(text); } catch (e) {
    throw new InputError(`not valid YAML: ${(e as Error).message.split('\n')[0]}`, { file: path });
  }
  return parseMeasurement(doc, path);
}

/**
 * Measured intensity at energyGeV from a normalisation or band's central index
 * (power law norm (E/E0)^-index; the band's mid index), or NaN for points.
 */
export function measuredPowerLaw(m: NeutrinoMeasurement, energyGeV: number, index?: number): number {
  if (m.kind === 'points') return NaN;
  const g = index ?? (m.kind === 'normalisation' ? m.index : 0.5 * (m.indexRange[0] + m.indexRange[1]));
  return m.norm.value * Math.pow(energyGeV / m.e0GeV, -g);
}
