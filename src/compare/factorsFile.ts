/**
 * Reads the template ensemble's factors for the comparison from JSON, in one of
 * two shapes:
 *
 * 1. skyspan's own short form:
 *    `{ "templates": [ { "name": "t1", "kI": 2.4, "survivalMean": 0.93, "weight": 1 }, ... ] }`
 *    (survivalMean and weight optional, for all templates or none); per gamma-ray
 *    energy instead: `"kIByEnergy": { "energiesGeV": [...], "values": [...] }` and
 *    `"survivalByEnergy"` alike (compare/ensemble.ts reads them log-log, no extrapolation);
 * 2. the JSON table the factors command writes (`{ "rows": [ { "template", "plane",
 *    "energyGeV", "target", "kI", ... } ], ... }`): one target is chosen (the only one, or
 *    `target`); a template whose planes all carry an energy gives a per-energy
 *    table of k_I over its planes, otherwise plane 0 is used (with a note).
 */
import { readInputText } from '../io/inputFile.js';
import { InputError } from '../core/errors.js';
import type { EnergyTable, TemplateFactor } from './ensemble.js';

/** What {@link readFactors} returns. */
export interface FactorsFile { factors: TemplateFactor[]; notes: string[]; target?: string }

interface Row { template: string; plane: number; energyGeV: number | null; target: string; kI: number }

function fromRows(rows: unknown[], file: string, opts: { target?: string }): FactorsFile {
  const rs = rows.map((r, i) => {
    const o = r as Partial<Row>;
    if (typeof o.template !== 'string' || typeof o.target !== 'string' || typeof o.kI !== 'number' || typeof o.plane !== 'number') {
      throw new InputError('row lacks template, target, plane or kI', { file, keyPath: `rows[${i}]` });
    }
    return o as Row;
  });
  const targets = [...new Set(rs.map((r) => r.target))];
  const target = opts.target ?? (targets.length === 1 ? targets[0] : undefined);
  if (target === undefined) throw new InputError(`the factors have ${targets.length} targets (${targets.join(', ')})`, { file, keyPath: 'rows' }, 'choose one with --target');
  if (!targets.includes(target)) throw new InputError(`no target '${target}' (found ${targets.join(', ')})`, { file, keyPath: 'rows' });
  const byTemplate = new Map<string, Row[]>();
  for (const r of rs) if (r.target === target) byTemplate.set(r.template, [...(byTemplate.get(r.template) ?? []), r]);
  const notes: string[] = [];
  const factors: TemplateFactor[] = [];
  for (const [template, list] of byTemplate) {
    if (list.length > 1 && list.every((r) => typeof r.energyGeV === 'number' && r.energyGeV > 0)) {
      const sorted = [...list].sort((a, b) => (a.energyGeV as number) - (b.energyGeV as number));
      factors.push({ template, kIByEnergy: { energiesGeV: sorted.map((r) => r.energyGeV as number), values: sorted.map((r) => r.kI) } });
      continue;
    }
    const best = list.find((r) => r.plane === 1) ?? list[0]; // planes are 1-based in factor tables
    if (list.length > 1) notes.push(`template '${template}': plane ${best.plane} of ${list.length} used (the planes carry no energy)`);
    factors.push({ template, kI: best.kI });
  }
  return { factors, notes, target };
}

/** Parses a factors document (already JSON-parsed). */
export function parseFactors(doc: unknown, file = '<factors>', opts: { target?: string } = {}): FactorsFile {
  const d = doc as { templates?: unknown; rows?: unknown };
  if (d && Array.isArray(d.rows)) return fromRows(d.rows, file, opts);
  if (!d || !Array.isArray(d.templates)) {
    throw new InputError('expected an object with "templates" (a list of { name, kI }) or "rows" (a factors table)', { file, keyPath: '(document)' });
  }
  const factors = d.templates.map((t, i): TemplateFactor => {
    const o = t as Record<string, unknown>;
    const kp = `templates[${i}]`;
    const allowed = ['name', 'kI', 'kIByEnergy', 'survivalMean', 'survivalByEnergy', 'weight'];
    for (const k of Object.keys(o ?? {})) if (!allowed.includes(k)) {
      throw new InputError(`unknown key "${k}"`, { file, keyPath: `${kp}.${k}` }, `allowed: ${allowed.join(', ')}`);
    }
    if (typeof o?.name !== 'string') throw new InputError('name must be a string', { file, keyPath: `${kp}.name` });
    for (const k of ['kI', 'survivalMean', 'weight']) if (o[k] !== undefined && typeof o[k] !== 'number') {
      throw new InputError(`${k} must be a number`, { file, keyPath: `${kp}.${k}` });
    }
    const tableOf = (k: string): EnergyTable | undefined => {
      const t = o[k] as { energiesGeV?: unknown; values?: unknown } | undefined;
      if (t === undefined) return undefined;
      const nums = (x: unknown) => Array.isArray(x) && x.every((v) => typeof v === 'number');
      if (!t || !nums(t.energiesGeV) || !nums(t.values)) throw new InputError(`${k} must be { "energiesGeV": [numbers], "values": [numbers] }`, { file, keyPath: `${kp}.${k}` });
      return { energiesGeV: t.energiesGeV as number[], values: t.values as number[] };
    };
    return { template: o.name, kI: o.kI as number | undefined, kIByEnergy: tableOf('kIByEnergy'), survivalMean: o.survivalMean as number | undefined,
      survivalByEnergy: tableOf('survivalByEnergy'), weight: o.weight as number | undefined };
  });
  return { factors, notes: [] };
}

/** Reads a factors JSON file (see the module comment). */
export function readFactors(path: string, opts: { target?: string } = {}): FactorsFile {
  let doc: unknown;
  const text = readInputText(path);
  try { doc = JSON.parse(text); } catch (e) {
    throw new InputError(`not valid JSON: ${(e as Error).message}`, { file: path });
  }
  return parseFactors(doc, path, opts);
}
