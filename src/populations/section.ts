/**
 * From a plan file's `populations` section (sectionSchema.ts) to the models
 * and the survey threshold: units converted at this edge (TeV -> GeV, deg ->
 * rad, pc kept for sizes), the template spec read for a `templateSpec`
 * density, every problem one InputError naming the key path.
 *
 * Keys: name, description; count (sources in the Galaxy, the reference count
 * when calibrated); spatial {distribution (a template source law, constant,
 * ball) | templateSpec, scaleHeightKpc, rSunKpc (8.5), zSunKpc (0), rMaxKpc
 * (25), radiusKpc (ball)}; luminosity {kind powerLaw: alpha, minErgPerS,
 * maxErgPerS | logNormal: medianErgPerS, sigmaDex} (E0^2 dN/dE at the pivot);
 * spectrum {pivotTeV (10), index (2.5), indexSpread (0), cutoffTeV (none)};
 * size {radiusPc | minPc, maxPc}; energiesTeV; threshold {fluxErgCm2S,
 * referenceDecDeg, siteLatDeg, maxZenithDeg, weighting, exposurePower | map,
 * column; psfDeg}; regions {measured, neutrino, counts[]}; exposureWeighted;
 * calibration {region, fluxAboveErgCm2S, count, realisations}; catalogue
 * [{region, fluxErgCm2S, count}]; fluxGrid {minErgCm2S, maxErgCm2S, points};
 * variants [{label, alpha, index, distribution, scaleHeightKpc, weight}];
 * realisations (40); seed (1); nside (64, for the region weights).
 */
import { isAbsolute, resolve } from 'node:path';
import { parse as parseYaml } from 'yaml';
import type { z } from 'zod';
import { InputError } from '../core/errors.js';
import { degToRad } from '../sphere/angles.js';
import type { SkyMap } from '../maps/skyMap.js';
import { RADIAL_LAWS, type RadialLawName } from '../templates/radialLaws.js';
import type { TemplateSpec } from '../templates/templateSpec.js';
import { checkLuminosity } from './luminosity.js';
import type { LuminosityFunction, PopulationModel, SourceSizeModel, SpatialModel } from './model.js';
import { populationSectionSchema, type PopulationSection, type PopulationVariant } from './sectionSchema.js';
import type { DetectionThreshold } from './threshold.js';

/** Where the section came from, for messages and relative paths. */
export interface SectionSource {
  file?: string;
  /** Key path of the section in its file (default 'populations'). */
  keyPath?: string;
  baseDir: string;
  readMap: (path: string, column?: string | number) => SkyMap;
  readTemplateSpec: (path: string) => TemplateSpec;
}

function keyPathOf(prefix: string, path: readonly PropertyKey[]): string {
  let s = prefix;
  for (const p of path) s += typeof p === 'number' ? `[${p}]` : (s ? '.' : '') + String(p);
  return s || '(top level)';
}

/** Checks a section given as YAML text or an object (InputError with the key path of the first problem). */
export function parsePopulationSection(input: string | unknown, file?: string, prefix = 'populations'): PopulationSection {
  let data = input;
  if (typeof input === 'string') {
    try { data = parseYaml(input); } catch (e) { throw new InputError(`not valid YAML: ${(e as Error).message.split('\n')[0]}`, { file }); }
  }
  const r = populationSectionSchema.safeParse(data);
  if (!r.success) {
    const issue: z.core.$ZodIssue = r.error.issues[0];
    throw new InputError(issue.message, { file, keyPath: keyPathOf(prefix, issue.path) });
  }
  return r.data;
}

const abs = (base: string, p: string) => (isAbsolute(p) ? p : resolve(base, p));

function spatialOf(sec: PopulationSection, src: SectionSource, kp: string, v?: PopulationVariant): SpatialModel {
  const s = sec.spatial, where = { file: src.file, keyPath: `${kp}.spatial` };
  let dist: string | undefined = v?.distribution ?? s.distribution, h = v?.scaleHeightKpc ?? s.scaleHeightKpc;
  let rSun = s.rSunKpc ?? 8.5, zSun = s.zSunKpc ?? 0;
  if (s.templateSpec !== undefined) {
    const spec = src.readTemplateSpec(abs(src.baseDir, s.templateSpec));
    if (!spec.sources) throw new InputError('names a template spec without a sources block', { ...where, keyPath: `${kp}.spatial.templateSpec` });
    dist = v?.distribution ?? spec.sources.distribution; h = v?.scaleHeightKpc ?? spec.sources.scaleHeightKpc;
    rSun = spec.observer.rSunKpc; zSun = spec.observer.zSunKpc;
  }
  if (dist === undefined) throw new InputError('needs distribution or templateSpec', where);
  if (dist === 'ball') {
    if (s.radiusKpc === undefined) throw new InputError('is missing (a ball needs its radius)', { ...where, keyPath: `${kp}.spatial.radiusKpc` });
    return { kind: 'ball', radiusKpc: s.radiusKpc };
  }
  if (h === undefined) throw new InputError('is missing (a disc needs its scale height)', { ...where, keyPath: `${kp}.spatial.scaleHeightKpc` });
  const law = dist === 'constant' ? null : RADIAL_LAWS[dist as RadialLawName];
  return { kind: 'disc', law, lawName: dist, scaleHeightKpc: h, rSunKpc: rSun, zSunKpc: zSun, rMaxKpc: s.rMaxKpc };
}

function luminosityOf(sec: PopulationSection, kp: string, file: string | undefined, v?: PopulationVariant): LuminosityFunction {
  const l = sec.luminosity;
  const need = (k: string, x: number | undefined): number => {
    if (x === undefined) throw new InputError(`is missing (needed by kind ${l.kind})`, { file, keyPath: `${kp}.luminosity.${k}` });
    return x;
  };
  const lf: LuminosityFunction = l.kind === 'powerLaw'
    ? { kind: 'powerLaw', alpha: v?.alpha ?? need('alpha', l.alpha), minErgPerS: need('minErgPerS', l.minErgPerS), maxErgPerS: need('maxErgPerS', l.maxErgPerS) }
    : { kind: 'logNormal', medianErgPerS: need('medianErgPerS', l.medianErgPerS), sigmaDex: need('sigmaDex', l.sigmaDex) };
  try { checkLuminosity(lf, `${kp}.luminosity`); } catch (e) {
    if (e instanceof InputError) throw new InputError(e.problem, { file, keyPath: e.location.keyPath });
    throw e;
  }
  return lf;
}

function sizeOf(sec: PopulationSection, kp: string, file: string | undefined): SourceSizeModel {
  const s = sec.size;
  if (!s) return { kind: 'point' };
  if (s.radiusPc !== undefined) return { kind: 'fixed', radiusPc: s.radiusPc };
  if (s.minPc !== undefined && s.maxPc !== undefined && s.maxPc >= s.minPc) return { kind: 'logUniform', minPc: s.minPc, maxPc: s.maxPc };
  throw new InputError('needs radiusPc, or minPc <= maxPc', { file, keyPath: `${kp}.size` });
}

/** The population models of the section: the base model, then one per variant, with their weights. */
export function populationModels(sec: PopulationSection, src: SectionSource): { label: string; weight: number; model: PopulationModel }[] {
  const kp = src.keyPath ?? 'populations';
  const build = (v?: PopulationVariant): PopulationModel => ({
    name: sec.name, count: sec.count,
    spatial: spatialOf(sec, src, kp, v), luminosity: luminosityOf(sec, kp, src.file, v),
    spectrum: {
      pivotGeV: sec.spectrum.pivotTeV * 1e3, index: v?.index ?? sec.spectrum.index, indexSpread: sec.spectrum.indexSpread,
      cutoffGeV: sec.spectrum.cutoffTeV === null ? null : sec.spectrum.cutoffTeV * 1e3,
    },
    size: sizeOf(sec, kp, src.file), energiesGeV: sec.energiesTeV.map((e) => e * 1e3),
  });
  if (sec.variants.length === 0) return [{ label: 'base', weight: 1, model: build() }];
  return sec.variants.map((v, i) => ({ label: v.label ?? `variant ${i + 1}`, weight: v.weight, model: build(v) }));
}

/** The survey's detection threshold of the section. */
export function sectionThreshold(sec: PopulationSection, src: SectionSource): DetectionThreshold {
  const t = sec.threshold, kp = `${src.keyPath ?? 'populations'}.threshold`, file = src.file;
  const psfRad = t.psfDeg === undefined ? null : degToRad(t.psfDeg);
  if (t.map !== undefined) {
    if (t.fluxErgCm2S !== undefined) throw new InputError('gives both map and fluxErgCm2S', { file, keyPath: kp }, 'use one of them');
    const path = abs(src.baseDir, t.map);
    return { kind: 'map', map: src.readMap(path, t.column), psfRad, file: path };
  }
  const need = (k: string, x: number | undefined): number => {
    if (x === undefined) throw new InputError('is missing (an exposure-scaled threshold needs it)', { file, keyPath: `${kp}.${k}` }, 'or give map: a HEALPix threshold map');
    return x;
  };
  return {
    kind: 'exposure', fluxErgCm2S: need('fluxErgCm2S', t.fluxErgCm2S), referenceDecRad: degToRad(need('referenceDecDeg', t.referenceDecDeg)),
    siteLatRad: degToRad(need('siteLatDeg', t.siteLatDeg)), maxZenithRad: degToRad(need('maxZenithDeg', t.maxZenithDeg)),
    weighting: t.weighting, exposurePower: t.exposurePower, psfRad,
  };
}
