/**
 * Runs a plan file's `populations` section: builds the models (one per
 * variant), calibrates each to the catalogue count when asked, runs the
 * realisations, pools them, and summarises N(>S) per region, the
 * unresolved-source intensity in the measured region, the all-source
 * intensity in the neutrino region, and the correction term's samples
 * (correction.ts). Variants share the realisations in proportion to their
 * weights, so the pooled spread holds the population-parameter spread, the
 * realisation spread and (when calibrated) the catalogue's Poisson error.
 */
import { dirname } from 'node:path';
import { InputError } from '../core/errors.js';
import { summariseSamples, type SampleSummary } from '../compare/summary.js';
import { readSkyMap } from '../io/mapFile.js';
import { evaluateRegion } from '../regions/evaluate.js';
import type { RegionDocument, RegionWeights } from '../regions/types.js';
import type { SkyMap } from '../maps/skyMap.js';
import { readTemplateSpec } from '../templates/readSpecFile.js';
import type { TemplateSpec } from '../templates/templateSpec.js';
import { calibrateCount, type CalibrationResult } from './calibrate.js';
import { calibrateLuminosityScale, type LuminosityCalibration } from './calibrateLuminosity.js';
import { scaleLuminosity } from './luminosity.js';
import { fluxGrid } from './counts.js';
import type { UnresolvedTerm } from './correction.js';
import { emptyPlotSvg, renderSourceCountsSvg } from './countsSvg.js';
import { column, runPopulation, type PopulationRun } from './run.js';
import { parsePopulationSection, populationModels, sectionThreshold } from './section.js';
import type { PopulationSection } from './sectionSchema.js';
import { countsCsv, intensitiesCsv } from './tables.js';

/**
 * What {@link runPopulationSection} needs from the plan: the region document
 * (when the section names regions), the folder for relative paths, the file
 * name for messages; optional readers and a region-weight provider (to share
 * the plan's evaluated regions).
 */
export interface PopulationContext {
  regions: RegionDocument | null;
  /** Folder for relative paths (threshold map, template spec); default: the file's folder or '.'. */
  baseDir?: string;
  file?: string;
  keyPath?: string;
  readMap?: (path: string, column?: string | number) => SkyMap;
  readTemplateSpec?: (path: string) => TemplateSpec;
  regionWeights?: (name: string, nside: number) => RegionWeights;
}

/** Summary of one count region: N(>S) of all and of resolved sources per grid flux. */
export interface RegionCounts { region: string; all: SampleSummary[]; resolved: SampleSummary[] }

/** Output of {@link runPopulationSection}. */
export interface PopulationSectionResult {
  name: string;
  energiesGeV: Float64Array;
  grid: Float64Array;
  realisations: number;
  variants: {
    label: string; weight: number; count: number; realisations: number;
    calibration: CalibrationResult | null; luminosityCalibration: LuminosityCalibration | null;
  }[];
  counts: RegionCounts[];
  catalogue: { region: string; fluxErgCm2S: number; count: number; modelMean: number; modelP16: number; modelP84: number }[];
  unresolvedMeasured: SampleSummary[] | null;
  neutrinoAll: SampleSummary[] | null;
  /** Samples for the correction (both regions given), else null. */
  term: UnresolvedTerm | null;
  tables: { counts: string; intensities: string };
  svg: string;
  assumptions: string[];
  notes: string[];
  warnings: string[];
}

const SKY = '(sky)';

function interpLogLog(grid: Float64Array, vals: ArrayLike<number>, s: number): number {
  const K = grid.length;
  if (s <= grid[0]) return vals[0];
  if (s >= grid[K - 1]) return vals[K - 1];
  let k = 0;
  while (grid[k + 1] < s) k++;
  const t = Math.log(s / grid[k]) / Math.log(grid[k + 1] / grid[k]);
  const a = vals[k], b = vals[k + 1];
  return a > 0 && b > 0 ? Math.exp(Math.log(a) + t * Math.log(b / a)) : a + t * (b - a);
}

/** Runs the section (see the module comment); `section` may be raw data (checked here) or checked. */
export function runPopulationSection(section: PopulationSection | unknown, ctx: PopulationContext): PopulationSectionResult {
  const kp = ctx.keyPath ?? 'populations';
  const sec = parsePopulationSection(section, ctx.file, kp);
  const baseDir = ctx.baseDir ?? (ctx.file ? dirname(ctx.file) : '.');
  const src = {
    file: ctx.file, keyPath: kp, baseDir,
    readMap: ctx.readMap ?? ((p: string, c?: string | number) => readSkyMap(p, { column: c })),
    readTemplateSpec: ctx.readTemplateSpec ?? readTemplateSpec,
  };
  const variants = populationModels(sec, src), threshold = sectionThreshold(sec, src);
  const cache = new Map<string, RegionWeights>();
  const region = (name: string | undefined, key: string): RegionWeights | null => {
    if (name === undefined) return null;
    if (!cache.has(name)) {
      if (ctx.regionWeights) cache.set(name, ctx.regionWeights(name, sec.nside));
      else {
        if (!ctx.regions) throw new InputError(`names region '${name}' but no region document was given`, { file: ctx.file, keyPath: `${kp}.${key}` });
        cache.set(name, evaluateRegion(ctx.regions, name, { nside: sec.nside, frame: 'galactic', baseDir }));
      }
    }
    return cache.get(name)!;
  };
  const measured = region(sec.regions.measured, 'regions.measured'), neutrino = region(sec.regions.neutrino, 'regions.neutrino');
  const countNames = [...new Set([SKY, ...sec.regions.counts, ...sec.catalogue.map((c) => c.region ?? SKY)])];
  const countRegions = countNames.map((n, i) => ({ name: n, weights: n === SKY ? null : region(n, `regions.counts[${i}]`) }));
  const sRef = threshold.kind === 'exposure' ? threshold.fluxErgCm2S : minPositive(threshold.kind === 'map' ? threshold.map.planes[0] : null);
  const g = sec.fluxGrid ?? { minErgCm2S: sRef / 100, maxErgCm2S: sRef * 100, points: 41 };
  if (!(g.maxErgCm2S > g.minErgCm2S)) throw new InputError(`maxErgCm2S ${g.maxErgCm2S} is not above minErgCm2S ${g.minErgCm2S}`, { file: ctx.file, keyPath: `${kp}.fluxGrid` });
  const grid = fluxGrid(g.minErgCm2S, g.maxErgCm2S, g.points);
  const wSum = variants.reduce((a, v) => a + v.weight, 0);
  if (!(wSum > 0)) throw new InputError('variant weights sum to zero', { file: ctx.file, keyPath: `${kp}.variants` });
  const runs: PopulationRun[] = [], info: PopulationSectionResult['variants'] = [];
  variants.forEach((v, j) => {
    let model = v.model, cal: CalibrationResult | null = null, lcal: LuminosityCalibration | null = null;
    if (sec.calibration) {
      const c = sec.calibration;
      const target = { region: region(c.region, 'calibration.region'), fluxAboveErgCm2S: c.fluxAboveErgCm2S, count: c.count };
      const opts = { realisations: c.realisations, seed: sec.seed, stream: j };
      if (c.adjust === 'count') {
        cal = calibrateCount(model, threshold, target, opts);
        model = { ...model, count: cal.count };
      } else {
        lcal = calibrateLuminosityScale(model, threshold, target, opts);
        model = { ...model, luminosity: scaleLuminosity(model.luminosity, lcal.scale) };
      }
    }
    const M = variants.length === 1 ? sec.realisations : Math.max(2, Math.round((sec.realisations * v.weight) / wSum));
    runs.push(runPopulation({
      model, threshold, measured, neutrino, exposureWeighted: sec.exposureWeighted, countRegions, grid,
      realisations: M, seed: sec.seed, stream: j, countRelSigma: cal ? cal.relSigma : 0, luminosityRelSigma: lcal ? lcal.relSigma : 0,
    }));
    info.push({ label: v.label, weight: v.weight, count: model.count, realisations: M, calibration: cal, luminosityCalibration: lcal });
  });
  const total = runs.reduce((a, r) => a + r.realisations, 0), nE = sec.energiesTeV.length, K = grid.length;
  const pool = (pick: (r: PopulationRun) => Float64Array | null, width: number): Float64Array => {
    const out = new Float64Array(total * width);
    let off = 0;
    for (const r of runs) { out.set(pick(r)!, off); off += r.realisations * width; }
    return out;
  };
  const summaries = (a: Float64Array, width: number, label: string) => Array.from({ length: width }, (_, k) => summariseSamples(column(a, width, k), { label }));
  const counts: RegionCounts[] = countNames.map((n, i) => ({
    region: n,
    all: summaries(pool((r) => r.counts[i].all, K), K, `N(>S) in ${n}`),
    resolved: summaries(pool((r) => r.counts[i].resolved, K), K, `resolved N(>S) in ${n}`),
  }));
  const catalogue = sec.catalogue.map((c) => {
    const rc = counts[countNames.indexOf(c.region ?? SKY)];
    const at = (f: (s: SampleSummary) => number) => interpLogLog(grid, rc.resolved.map(f), c.fluxErgCm2S);
    return { region: c.region ?? SKY, fluxErgCm2S: c.fluxErgCm2S, count: c.count, modelMean: at((s) => s.mean), modelP16: at((s) => s.p16), modelP84: at((s) => s.p84) };
  });
  const um = measured ? pool((r) => r.unresolvedMeasured, nE) : null, tn = neutrino ? pool((r) => r.allNeutrino, nE) : null;
  const energiesGeV = Float64Array.from(sec.energiesTeV, (e) => e * 1e3);
  const unresolvedMeasured = um ? summaries(um, nE, 'unresolved intensity in the measured region') : null;
  const neutrinoAll = tn ? summaries(tn, nE, 'source intensity in the neutrino region') : null;
  const result: PopulationSectionResult = {
    name: sec.name, energiesGeV, grid, realisations: total, variants: info, counts, catalogue, unresolvedMeasured, neutrinoAll,
    term: um && tn ? { energiesGeV, samples: total, measured: um, neutrino: tn } : null,
    tables: { counts: '', intensities: '' }, svg: '',
    assumptions: assumptionsOf(sec), notes: notesOf(sec, info), warnings: [],
  };
  result.tables = { counts: countsCsv(result), intensities: intensitiesCsv(result) };
  const plot = {
    title: `${sec.name}: log N - log S (${total} realisations)`,
    curves: counts.flatMap((c) => [
      { label: `${c.region}, all`, fluxErgCm2S: grid, mean: c.all.map((s) => s.mean), low: c.all.map((s) => s.p16), high: c.all.map((s) => s.p84) },
      { label: `${c.region}, resolved`, fluxErgCm2S: grid, mean: c.resolved.map((s) => s.mean), low: c.resolved.map((s) => s.p16), high: c.resolved.map((s) => s.p84), dashed: true },
    ]),
    points: catalogue.map((c) => ({ label: `catalogue, ${c.region}`, fluxErgCm2S: c.fluxErgCm2S, count: c.count })),
  };
  try {
    result.svg = renderSourceCountsSvg(plot);
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    result.warnings.push(`no source falls in the flux grid ${g.minErgCm2S} to ${g.maxErgCm2S} erg cm^-2 s^-1: the log N - log S plot is empty (set fluxGrid)`);
    result.svg = emptyPlotSvg(plot.title);
  }
  return result;
}

function minPositive(plane: ArrayLike<number> | null): number {
  let m = Infinity;
  if (plane) for (let i = 0; i < plane.length; i++) if (plane[i] > 0 && plane[i] < 1e29 && plane[i] < m) m = plane[i];
  if (!Number.isFinite(m)) throw new InputError('the threshold map has no positive pixel', { keyPath: 'populations.threshold.map' });
  return m;
}

function assumptionsOf(sec: PopulationSection): string[] {
  const a = [
    'sources are drawn independently from the spatial density, luminosity function and spectrum of the population model (a fixed number per realisation)',
    'a source is resolved, and masked, when its flux at the pivot exceeds the survey threshold at its position; all others stay in the diffuse intensity',
    'fluxes are unabsorbed: pair production on the way is not applied to individual sources',
  ];
  if (sec.calibration) a.push(`the ${sec.calibration.adjust === 'count' ? 'source count' : 'luminosity scale'} is calibrated so that, on average, ${sec.calibration.count} sources are resolved above ${sec.calibration.fluxAboveErgCm2S} erg cm^-2 s^-1 in ${sec.calibration.region ?? 'the whole sky'} (Poisson error included)`);
  if (sec.threshold.psfDeg !== undefined && sec.size) a.push('extended sources need a flux larger by sqrt(r^2 + psf^2) / psf');
  return a;
}

function notesOf(sec: PopulationSection, info: PopulationSectionResult['variants']): string[] {
  return info.map((v) => `${v.label}: ${Math.round(v.count)} sources, ${v.realisations} realisations` +
    (v.calibration ? `, calibrated from ${v.calibration.referenceCount} (relative error ${(100 * v.calibration.relSigma).toFixed(1)} %)` : '') +
    (v.luminosityCalibration ? `, luminosities scaled by ${v.luminosityCalibration.scale.toPrecision(4)} (relative error ${(100 * v.luminosityCalibration.relSigma).toFixed(1)} %)` : '') +
    `; seed ${sec.seed}`);
}
