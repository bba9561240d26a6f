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
 * points:                      # kind points: energy, value, errLow/errHigh or err, ul
 *   - { energy: 50, value: 2e-18, errLow: 5e-19, errHigh: 6e-19 }
 * ```
 *
 * The intensity is the mean over the neutrino analysis's region, per sr. A
 * value in an E^2-weighted unit is divided by E^2 at its energy. Errors are
 * read as a split normal (splitNormal.ts). Bad input throws InputError with the
 * key path.
 */
import { readInputText } from '../io/inputFile.js';
import { parse as parseYaml } from 'yaml';
import { z } from 'zod';
import { InputError } from '../core/errors.js';
import { energyUnitFactor, intensityToInternal } from '../physics/units.js';

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
  | { kind: 'normalisation'; e0GeV: number; norm: QuotedValue; index: number }
  | { kind: 'band'; e0GeV: number; norm: QuotedValue; indexRange: [number, number]; energyRangeGeV: [number, number] }
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
const schema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('normalisation'), ...common, e0: positive, norm: positive, ...errs, index: finite }),
  z.strictObject({ kind: z.literal('band'), ...common, e0: positive, norm: positive, ...errs, indexRange: z.tuple([finite, finite]).refine((r) => r[1] >= r[0], 'must be [low, high]'), energyRange: range }),
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
  const [lo, hi] = quoted(d, { file, keyPath: 'err' }, false);
  const norm = { value: toI(d.norm, e0, 'norm'), errLow: toI(lo, e0, 'errLow'), errHigh: toI(hi, e0, 'errHigh') };
  if (d.kind === 'normalisation') return { ...base, kind: 'normalisation', e0GeV: e0, norm, index: d.index };
  return { ...base, kind: 'band', e0GeV: e0, norm, indexRange: [d.indexRange[0], d.indexRange[1]], energyRangeGeV: base.energyRangeGeV! };
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
