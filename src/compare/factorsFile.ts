/**
 * Reads the template ensemble's factors for the comparison from JSON, in one of
 * two shapes:
 *
 * 1. skyspan's own short form:
 *    `{ "templates": [ { "name": "t1", "kI": 2.4, "survivalMean": 0.93, "weight": 1 }, ... ] }`
 *    (survivalMean and weight optional, for all templates or none);
 * 2. the JSON table the factors command writes (`{ "rows": [ { "template", "plane",
 *    "energyGeV", "target", "kI", ... } ], ... }`): one target is chosen (the only one, or
 *    `target`), and per template the plane whose energy is nearest, in log energy, to
 *    `energyGeV` (plane 0 when the planes carry no energy).
 */
import { readInputText } from '../io/inputFile.js';
import { InputError } from '../core/errors.js';
import type { TemplateFactor } from './ensemble.js';

/** What {@link readFactors} returns. */
export interface FactorsFile { factors: TemplateFactor[]; notes: string[]; target?: string }

interface Row { template: string; plane: number; energyGeV: number | null; target: string; kI: number }

function fromRows(rows: unknown[], file: string, opts: { target?: string; energyGeV?: number }): FactorsFile {
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
    let best = list[0];
    if (list.length > 1 && opts.energyGeV !== undefined && list.every((r) => typeof r.energyGeV === 'number' && r.energyGeV > 0)) {
      const d = (r: Row) => Math.abs(Math.log((r.energyGeV as number) / opts.energyGeV!));
      best = list.reduce((a, b) => (d(b) < d(a) ? b : a));
    } else if (list.length > 1) best = list.find((r) => r.plane === 0) ?? list[0];
    if (list.length > 1) notes.push(`template '${template}': plane ${best.plane}${best.energyGeV ? ` (${best.energyGeV} GeV)` : ''} of ${list.length} used`);
    factors.push({ template, kI: best.kI });
  }
  return { factors, notes, target };
}

/** Parses a factors document (already JSON-parsed). */
export function parseFactors(doc: unknown, file = '<factors>', opts: { target?: string; energyGeV?: number } = {}): FactorsFile {
  const d = doc as { templates?: unknown; rows?: unknown };
  if (d && Array.isArray(d.rows)) return fromRows(d.rows, file, opts);
  if (!d || !Array.isArray(d.templates)) {
    throw new InputError('expected an object with "templates" (a list of { name, kI }) or "rows" (a factors table)', { file, keyPath: '(document)' });
  }
  const factors = d.templates.map((t, i): TemplateFactor => {
    const o = t as Record<string, unknown>;
    const kp = `templates[${i}]`;
    for (const k of Object.keys(o ?? {})) if (!['name', 'kI', 'survivalMean', 'weight'].includes(k)) {
      throw new InputError(`unknown key "${k}"`, { file, keyPath: `${kp}.${k}` }, 'allowed: name, kI, survivalMean, weight');
    }
    if (typeof o?.name !== 'string') throw new InputError('name must be a string', { file, keyPath: `${kp}.name` });
    for (const k of ['kI', 'survivalMean', 'weight']) if (o[k] !== undefined && typeof o[k] !== 'number') {
      throw new InputError(`${k} must be a number`, { file, keyPath: `${kp}.${k}` });
    }
    return { template: o.name, kI: o.kI as number, survivalMean: o.survivalMean as number | undefined, weight: o.weight as number | undefined };
  });
  return { factors, notes: [] };
}

/** Reads a factors JSON file (see the module comment). */
export function readFactors(path: string, opts: { target?: string; energyGeV?: number } = {}): FactorsFile {
  let doc: unknown;
  const text = readInputText(path);
  try { doc = JSON.parse(text); } catch (e) {
    throw new InputError(`not valid JSON: ${(e as Error).message}`, { file: path });
  }
  return parseFactors(doc, path, opts);
}
