/**
 * Extrapolation factors for an ensemble of templates: for each template, each
 * energy plane and each target region, the factors of factorRow.ts, plus the
 * ensemble summary. Regions are evaluated in each template's own Nside and
 * frame (once per distinct pair), turned into sparse pixel lists, and every
 * plane is summed over those lists; the whole sky costs one pass per plane.
 *
 * Assumption carried into every output: the sky outside the measured region
 * looks like each template (only the template's shape is used; its
 * normalisation cancels).
 */
import { ComputeError, InputError } from '../core/errors.js';
import type { SkyMap } from '../maps/skyMap.js';
import type { FrameName } from '../sphere/frames.js';
import type { RegionDocument } from '../regions/types.js';
import { toRegionPixels, wholeSkyPixels, type RegionPixels, type RegionWeightsLike } from './regionPixels.js';
import { regionSums, wholeSkySums, SUMS_LENGTH, S } from './regionSums.js';
import { factorRow, type FactorRow } from './factorRow.js';
import { summarise, type SummaryRow } from './summary.js';
import { assertNsideFits, estimateMapBytes } from '../core/memory.js';

/** The statement every factor table carries. */
export const EXTRAPOLATION_ASSUMPTION =
  'The sky outside the measured region is assumed to look like each template: only the template shape carries the measurement to the target.';

/** Evaluates a named region at an Nside and frame (the regions layer by default; injectable for tests). */
export type RegionEvaluator = (name: string, opts: { nside: number; frame: 'galactic' | 'equatorial'; mode: 'fraction' | 'centre' }) => RegionWeightsLike;

/** One template of the ensemble. `weight` (>= 0) enters the weighted summary; give it for all or none. */
export interface FactorTemplate { name: string; map: SkyMap; weight?: number }

/** Input of {@link computeFactors}. */
export interface FactorInput {
  templates: FactorTemplate[];
  /** The region document; used by the default evaluator. */
  regions?: RegionDocument;
  measured: string;
  targets: string[];
  /** 'fraction' (default): edge pixels count by covered fraction; 'centre': pixel-centre-in-region. */
  mode?: 'fraction' | 'centre';
  /** Weight the measured region by its exposure when it has one (default true). */
  exposureWeighted?: boolean;
  /** Nside and frame the caller asked for; a template that differs is noted. */
  requested?: { nside?: number; frame?: 'galactic' | 'equatorial' };
  /** Frame of templates whose file does not say it. */
  assumeFrame?: 'galactic' | 'equatorial';
  /** Base folder for files the region document names. */
  baseDir?: string;
  evaluate?: RegionEvaluator;
  /** True for a region name known to be the whole sky, unweighted: its evaluation is skipped (saves a full-sky pass and array). */
  isWholeSky?: (name: string) => boolean;
  /** Memory limit in bytes for the pre-allocation check (default: available memory). */
  memoryLimitBytes?: number;
}

/** A region as evaluated for one template geometry. */
export interface EvaluatedRegion {
  name: string; nside: number; frame: string; mode: string;
  solidAngleSr: number; pixelCount: number; exposureWeighted: boolean; notes: string[];
}

/** Output of {@link computeFactors}. */
export interface FactorResult {
  measured: string;
  targets: string[];
  mode: 'fraction' | 'centre';
  exposureWeighted: boolean;
  rows: FactorRow[];
  summary: SummaryRow[];
  regions: EvaluatedRegion[];
  /** Informational notes (geometry differences, how blanks were treated). */
  notes: string[];
  /** Marked warnings: results that hold but deserve a look (blanks, negative pixels, sub-pixel regions). */
  warnings: string[];
  assumption: string;
}

function templateFrame(t: FactorTemplate, assume?: 'galactic' | 'equatorial'): 'galactic' | 'equatorial' {
  const f: FrameName = t.map.frame;
  if (f === 'galactic' || f === 'equatorial') return f;
  if (assume) return assume;
  throw new InputError(`template '${t.name}' does not say its frame (COORDSYS missing or unknown)`, {},
    'state it with --frame galactic|equatorial');
}

/**
 * Computes every factor for every template, plane and target, and the
 * ensemble summary, with regions from `evaluate` (see factorRow.ts for the definitions and summary.ts for
 * the quantiles). Throws ComputeError for an empty region, a template blank,
 * zero or negative on average over a region, or not enough memory;
 * InputError for bad input.
 */
export function computeFactorsWith(input: FactorInput, evaluate: RegionEvaluator): FactorResult {
  const mode = input.mode ?? 'fraction';
  const useExposure = input.exposureWeighted ?? true;
  if (input.templates.length === 0) throw new InputError('no templates given', {}, 'name template files or a folder');
  if (input.targets.length === 0) throw new InputError('no target region given', {}, 'name at least one target region');
  const notes: string[] = [], warnings: string[] = [], regions: EvaluatedRegion[] = [];
  const cache = new Map<string, { a: RegionPixels; bs: RegionPixels[] }>();
  const geometry = (nside: number, frame: 'galactic' | 'equatorial') => {
    const key = `${nside}/${frame}`;
    let g = cache.get(key);
    if (g) return g;
    const one = (name: string, exposure: boolean): RegionPixels => {
      if (input.isWholeSky?.(name)) {
        const r = wholeSkyPixels(name, nside, frame, mode);
        regions.push({ name, nside, frame, mode, solidAngleSr: r.solidAngleSr, pixelCount: r.pixelCount, exposureWeighted: false, notes: [] });
        return r;
      }
      // Peak of a region evaluation: dense Float32 fraction and exposure (8 bytes a pixel) plus as much again of working arrays.
      assertNsideFits(estimateMapBytes(nside, 1, 16), `evaluating region '${name}'`, nside, input.memoryLimitBytes);
      const w = evaluate(name, { nside, frame, mode });
      const r = toRegionPixels(w, exposure);
      if (!(r.pixelCount > 0)) {
        throw new ComputeError(`region '${name}' is empty at Nside ${nside} in ${frame} coordinates (${mode} mode); no factor can be formed`);
      }
      if (r.pixelCount < 1) {
        warnings.push(`WARNING: region '${name}' covers ${r.pixelCount.toPrecision(3)} of a pixel at Nside ${nside}; factors rest on sub-pixel coverage`);
      }
      if (w.exposure && !exposure) notes.push(`region '${name}': exposure weighting ignored (${useExposure ? 'targets are unweighted' : 'exposure weighting off'})`);
      regions.push({ name, nside, frame, mode, solidAngleSr: r.solidAngleSr, pixelCount: r.pixelCount,
        exposureWeighted: r.exposure !== null, notes: r.notes });
      return r;
    };
    g = { a: one(input.measured, useExposure), bs: input.targets.map((t) => one(t, false)) };
    cache.set(key, g);
    return g;
  };

  const names = new Set<string>();
  for (const t of input.templates) {
    if (names.has(t.name)) throw new InputError(`two templates are named '${t.name}'`, {}, 'give each template a distinct name');
    names.add(t.name);
  }
  const rows: FactorRow[] = [];
  const sa = new Float64Array(SUMS_LENGTH), sb = new Float64Array(SUMS_LENGTH), sky = new Float64Array(SUMS_LENGTH);
  for (const t of input.templates) {
    const frame = templateFrame(t, input.assumeFrame);
    const { nside } = t.map;
    const req = input.requested;
    if (req && ((req.nside !== undefined && req.nside !== nside) || (req.frame !== undefined && req.frame !== frame))) {
      notes.push(`template '${t.name}' is at Nside ${nside} in ${frame} coordinates` +
        ` (requested Nside ${req.nside ?? nside}, ${req.frame ?? frame}); its regions were evaluated at Nside ${nside} in ${frame}`);
    }
    const { a, bs } = geometry(nside, frame);
    const nested = t.map.ordering === 'NESTED';
    t.map.planes.forEach((plane, p) => {
      const energyGeV = t.map.energiesGeV ? t.map.energiesGeV[p] : null;
      wholeSkySums(plane, sky);
      if (a.full) sa.set(sky); else regionSums(plane, nside, nested, a, null, sa);
      for (const b of bs) {
        if (b.full) { sb.set(sky); sb[S.CROSS] = sa[S.FT]; } else regionSums(plane, nside, nested, b, a, sb);
        const row = factorRow(sa, sb, sky, { template: t.name, plane: p, energyGeV, measured: a.name, target: b.name,
          nside, frame, solidAngleMeasuredSr: a.solidAngleSr, solidAngleTargetSr: b.solidAngleSr });
        rows.push(row);
      }
      const e = energyGeV === null ? '' : ` (${energyGeV} GeV)`;
      if (sa[S.BLANK_COUNT] > 0) warnings.push(`WARNING: template '${t.name}' plane ${p}${e}: ${sa[S.BLANK_COUNT]} blank pixels in measured region '${a.name}' excluded`);
      if (sa[S.NEG_COUNT] > 0) warnings.push(`WARNING: template '${t.name}' plane ${p}${e}: ${sa[S.NEG_COUNT]} negative pixels in measured region '${a.name}'`);
      if (sky[S.BLANK_COUNT] > 0) notes.push(`template '${t.name}' plane ${p}${e}: ${sky[S.BLANK_COUNT]} blank pixels on the sky, excluded from every mean; fluxes count them at their region's mean`);
    });
  }
  for (const r of rows) {
    if (r.blankTarget > 0) warnings.push(`WARNING: template '${r.template}' plane ${r.plane}: ${r.blankTarget} blank pixels in target '${r.target}' excluded`);
    if (r.negativeTarget > 0) warnings.push(`WARNING: template '${r.template}' plane ${r.plane}: ${r.negativeTarget} negative pixels in target '${r.target}'`);
  }
  const summary = summarise(rows, templateWeights(input.templates));
  return { measured: input.measured, targets: [...input.targets], mode, exposureWeighted: regions.some((r) => r.exposureWeighted),
    rows, summary, regions, notes: [...new Set(notes)], warnings: [...new Set(warnings)], assumption: EXTRAPOLATION_ASSUMPTION };
}

function templateWeights(ts: FactorTemplate[]): Map<string, number> | null {
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
