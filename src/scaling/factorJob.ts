/**
 * The bookkeeping of a factor job, whatever computes the sums (whole maps in
 * memory, a streamed file, a worker thread, a shard on another machine):
 * regions evaluated once per (Nside, frame), rows formed from each plane's
 * sums (factorRow.ts), and every note and warning logged with the template
 * source (file) that caused it, so that partial jobs combine into exactly
 * the result one job gives ({@link composeFactorResult}).
 */
import { ComputeError, InputError } from '../core/errors.js';
import type { RegionDocument } from '../regions/types.js';
import { toRegionPixels, wholeSkyPixels, type RegionPixels, type RegionWeightsLike } from './regionPixels.js';
import { S } from './regionSums.js';
import { factorRow, type FactorRow } from './factorRow.js';
import { summarise } from './summary.js';
import { assertNsideFits, estimateMapBytes } from '../core/memory.js';
import { EXTRAPOLATION_ASSUMPTION, type EvaluatedRegion, type FactorResult } from './factorTypes.js';

/** Evaluates a named region at an Nside and frame (the regions layer by default; injectable for tests). */
export type RegionEvaluator = (name: string, opts: { nside: number; frame: 'galactic' | 'equatorial'; mode: 'fraction' | 'centre' }) => RegionWeightsLike;

/** The settings of a factor job (everything but the templates). */
export interface FactorJobSettings {
  regions?: RegionDocument;
  measured: string;
  targets: string[];
  mode?: 'fraction' | 'centre';
  exposureWeighted?: boolean;
  requested?: { nside?: number; frame?: 'galactic' | 'equatorial' };
  assumeFrame?: 'galactic' | 'equatorial';
  baseDir?: string;
  evaluate?: RegionEvaluator;
  isWholeSky?: (name: string) => boolean;
  memoryLimitBytes?: number;
}

/**
 * One logged note or warning: `file` the template source, `rank` its place
 * within the source (2j for template j's opening, 2j + 1 for its regions and
 * planes), `geom` the (Nside, frame) whose evaluation caused it, else null.
 */
export interface JobEvent { file: number; rank: number; geom: string | null; kind: 'note' | 'warning'; text: string }

/** What a (partial) job produced, in a form that can be saved and combined. */
export interface FactorJobLog {
  measured: string;
  targets: string[];
  mode: 'fraction' | 'centre';
  rows: { file: number; row: FactorRow }[];
  regions: { file: number; geom: string; region: EvaluatedRegion }[];
  events: JobEvent[];
  templates: { file: number; name: string; weight?: number }[];
}

/** The regions of one geometry: the measured region and each target. */
export interface Geometry { a: RegionPixels; bs: RegionPixels[] }

/** A factor job in progress (see module doc). */
export class FactorJob {
  readonly log: FactorJobLog;
  private readonly cache = new Map<string, Geometry>();
  private readonly mode: 'fraction' | 'centre';
  private readonly useExposure: boolean;

  constructor(private readonly input: FactorJobSettings, private readonly evaluate: RegionEvaluator) {
    if (input.targets.length === 0) throw new InputError('no target region given', {}, 'name at least one target region');
    this.mode = input.mode ?? 'fraction';
    this.useExposure = input.exposureWeighted ?? true;
    this.log = { measured: input.measured, targets: [...input.targets], mode: this.mode, rows: [], regions: [], events: [], templates: [] };
  }

  private event(file: number, rank: number, geom: string | null, kind: 'note' | 'warning', text: string): void {
    this.log.events.push({ file, rank, geom, kind, text });
  }

  /** The regions at (nside, frame), evaluated on first use (by template source `file`, at `rank`, see {@link JobEvent}). */
  geometry(file: number, nside: number, frame: 'galactic' | 'equatorial', rank = 1): Geometry {
    const key = `${nside}/${frame}`;
    const got = this.cache.get(key);
    if (got) return got;
    const { input, mode, useExposure } = this;
    const push = (region: EvaluatedRegion) => this.log.regions.push({ file, geom: key, region });
    const one = (name: string, exposure: boolean): RegionPixels => {
      if (input.isWholeSky?.(name)) {
        const r = wholeSkyPixels(name, nside, frame, mode);
        push({ name, nside, frame, mode, solidAngleSr: r.solidAngleSr, pixelCount: r.pixelCount, exposureWeighted: false, notes: [] });
        return r;
      }
      // Peak of a region evaluation: dense Float32 fraction and exposure (8 bytes a pixel) plus as much again of working arrays.
      assertNsideFits(estimateMapBytes(nside, 1, 16), `evaluating region '${name}'`, nside, input.memoryLimitBytes);
      const w = this.evaluate(name, { nside, frame, mode });
      const r = toRegionPixels(w, exposure);
      if (!(r.pixelCount > 0)) {
        throw new ComputeError(`region '${name}' is empty at Nside ${nside} in ${frame} coordinates (${mode} mode); no factor can be formed`);
      }
      if (r.pixelCount < 1) {
        this.event(file, rank, key, 'warning', `WARNING: region '${name}' covers ${r.pixelCount.toPrecision(3)} of a pixel at Nside ${nside}; factors rest on sub-pixel coverage`);
      }
      if (w.exposure && !exposure) this.event(file, rank, key, 'note', `region '${name}': exposure weighting ignored (${useExposure ? 'targets are unweighted' : 'exposure weighting off'})`);
      push({ name, nside, frame, mode, solidAngleSr: r.solidAngleSr, pixelCount: r.pixelCount, exposureWeighted: r.exposure !== null, notes: r.notes });
      return r;
    };
    const g = { a: one(input.measured, useExposure), bs: input.targets.map((t) => one(t, false)) };
    this.cache.set(key, g);
    return g;
  }

  /** Registers template `name`, the `ordinal`-th of source `file`, at (nside, frame) and returns its regions. */
  openTemplate(file: number, ordinal: number, name: string, nside: number, frame: 'galactic' | 'equatorial', weight?: number): Geometry {
    this.log.templates.push(weight === undefined ? { file, name } : { file, name, weight });
    const req = this.input.requested;
    if (req && ((req.nside !== undefined && req.nside !== nside) || (req.frame !== undefined && req.frame !== frame))) {
      this.event(file, 2 * ordinal, null, 'note', `template '${name}' is at Nside ${nside} in ${frame} coordinates` +
        ` (requested Nside ${req.nside ?? nside}, ${req.frame ?? frame}); its regions were evaluated at Nside ${nside} in ${frame}`);
    }
    return this.geometry(file, nside, frame, 2 * ordinal + 1);
  }

  /**
   * Forms the rows of plane `p` from its sums: `sa` of the measured region
   * (null when it is the whole sky), `sbs` of each target (null for a whole-sky
   * target), `sky` of the whole sky (see regionSums.ts).
   */
  addPlane(file: number, ordinal: number, name: string, g: Geometry, at: { nside: number; frame: string }, p: number, energyGeV: number | null,
    sa: Float64Array | null, sbs: (Float64Array | null)[], sky: Float64Array): void {
    const { a, bs } = g;
    const A = sa ?? sky;
    bs.forEach((b, i) => {
      let sb = sbs[i];
      if (!sb) { sb = Float64Array.from(sky); sb[S.CROSS] = A[S.FT]; }
      const row = factorRow(A, sb, sky, { template: name, plane: p, energyGeV, measured: a.name, target: b.name,
        nside: at.nside, frame: at.frame, solidAngleMeasuredSr: a.solidAngleSr, solidAngleTargetSr: b.solidAngleSr });
      this.log.rows.push({ file, row });
    });
    const e = energyGeV === null ? '' : ` (${energyGeV} GeV)`, rank = 2 * ordinal + 1;
    if (A[S.BLANK_COUNT] > 0) this.event(file, rank, null, 'warning', `WARNING: template '${name}' plane ${p}${e}: ${A[S.BLANK_COUNT]} blank pixels in measured region '${a.name}' excluded`);
    if (A[S.NEG_COUNT] > 0) this.event(file, rank, null, 'warning', `WARNING: template '${name}' plane ${p}${e}: ${A[S.NEG_COUNT]} negative pixels in measured region '${a.name}'`);
    if (sky[S.BLANK_COUNT] > 0) this.event(file, rank, null, 'note', `template '${name}' plane ${p}${e}: ${sky[S.BLANK_COUNT]} blank pixels on the sky, excluded from every mean; fluxes count them at their region's mean`);
  }
}

function byFile<T extends { file: number; rank?: number }>(xs: T[]): T[] {
  return xs.map((x, i) => ({ x, i })).sort((u, v) => u.x.file - v.x.file || (u.x.rank ?? 0) - (v.x.rank ?? 0) || u.i - v.i).map((u) => u.x);
}

/**
 * The result of one or more job logs covering disjoint template sources,
 * ordered by source: rows, regions and messages as one job over all sources
 * in order gives them (a geometry's regions and messages count once, at the
 * first source that used it), and the ensemble summary. `weights`, when
 * given, are the template weights in that order (one per template).
 */
export function composeFactorResult(logs: FactorJobLog[], weights?: number[]): FactorResult {
  const first = logs[0];
  let templates = byFile(logs.flatMap((l) => l.templates));
  if (weights) {
    if (weights.length !== templates.length) {
      throw new InputError(`${weights.length} weights for ${templates.length} templates (${templates.map((t) => t.name).join(', ')})`, {});
    }
    templates = templates.map((t, i) => ({ ...t, weight: weights[i] }));
  }
  if (templates.length === 0) throw new InputError('no templates given', {}, 'name template files or a folder');
  const names = new Set<string>();
  for (const t of templates) {
    if (names.has(t.name)) throw new InputError(`two templates are named '${t.name}'`, {}, 'give each template a distinct name');
    names.add(t.name);
  }
  const owner = new Map<string, number>();
  const owns = (geom: string, file: number) => { if (!owner.has(geom)) owner.set(geom, file); return owner.get(geom) === file; };
  const regionEntries = byFile(logs.flatMap((l) => l.regions));
  for (const r of regionEntries) owns(r.geom, r.file);
  const regions = regionEntries.filter((r) => owner.get(r.geom) === r.file).map((r) => r.region);
  const notes: string[] = [], warnings: string[] = [];
  for (const ev of byFile(logs.flatMap((l) => l.events))) {
    if (ev.geom !== null && !owns(ev.geom, ev.file)) continue;
    (ev.kind === 'note' ? notes : warnings).push(ev.text);
  }
  const rows = byFile(logs.flatMap((l) => l.rows)).map((r) => r.row);
  for (const r of rows) {
    if (r.blankTarget > 0) warnings.push(`WARNING: template '${r.template}' plane ${r.plane}: ${r.blankTarget} blank pixels in target '${r.target}' excluded`);
    if (r.negativeTarget > 0) warnings.push(`WARNING: template '${r.template}' plane ${r.plane}: ${r.negativeTarget} negative pixels in target '${r.target}'`);
  }
  const summary = summarise(rows, templateWeights(templates));
  return { measured: first.measured, targets: [...first.targets], mode: first.mode, exposureWeighted: regions.some((r) => r.exposureWeighted),
    rows, summary, regions, notes: [...new Set(notes)], warnings: [...new Set(warnings)], assumption: EXTRAPOLATION_ASSUMPTION };
}

function templateWeights(ts: { name: string; weight?: number }[]): Map<string, number> | null {
  const given = ts.filter((t) => t.weight !== undefined).length;
  if (given === 0) return null;
  if (given !== ts.length) {
    throw new InputError(`weights given for ${given} of ${ts.length} templates`, {}, 'give a weight for every template or none');
  }
  const m = new Map<string, number>();
  for (const t of ts) {
    if (!(t.weight! >= 0 && t.weight! < Infinity)) throw new InputError(`template '${t.name}': weight ${t.weight} must be finite and >= 0`, {});
    m.set(t.name, t.weight!);
  }
  return m;
}
