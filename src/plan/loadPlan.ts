/**
 * Reading a plan: YAML text to a checked {@link PlanDocument}, then to a
 * {@link ResolvedPlan} with every relative path resolved against the plan's
 * folder, the region document parsed, the neutrino measurement read, and the
 * names the plan uses checked against the region document. Every problem is
 * one line naming the plan file and the key path.
 */
import { readInputText } from '../io/inputFile.js';
import { dirname, isAbsolute, resolve } from 'node:path';
import { parse as parseYaml } from 'yaml';
import { InputError } from '../core/errors.js';
import { checkWith } from '../regions/schema.js';
import { parseRegionDocument, regionNames } from '../regions/document.js';
import type { RegionDocument } from '../regions/types.js';
import { parseMeasurement, readMeasurement, type NeutrinoMeasurement } from '../compare/measurement.js';
import { validateFlavourRatio } from '../physics/hadronic/flavour.js';
import { planSchema, type PlanDocument } from './schema.js';

/** A plan ready to run: paths absolute, regions and measurement parsed. */
export interface ResolvedPlan {
  /** The plan file (absolute), or undefined for a plan given as an object. */
  file: string | undefined;
  dir: string;
  plan: PlanDocument;
  regions: RegionDocument;
  /** The region file (absolute) when the regions come from a file. */
  regionsFile: string | undefined;
  measurement: NeutrinoMeasurement;
  measurementFile: string | undefined;
  gammaPointsFile: string | undefined;
  /** The neutrino template and its acceptance map (absolute), when the plan names them. */
  neutrinoTemplateFile?: string;
  acceptanceFile?: string;
  templateFiles: string[];
  buildSpecs: string[];
  /** Whether the shipped ensemble is used. */
  shipped: boolean;
}

function parseText(text: string, file: string | undefined): unknown {
  try { return parseYaml(text); } catch (e) {
    throw new InputError(`not valid YAML: ${(e as Error).message.split('\n')[0]}`, { file }, 'check the indentation and quoting');
  }
}

/** Checks a plan document (already parsed from YAML) and fills in the defaults. */
export function checkPlan(doc: unknown, file?: string): PlanDocument {
  if (doc === null || typeof doc !== 'object' || Array.isArray(doc)) {
    throw new InputError(`found ${doc === null || doc === undefined ? 'an empty document' : Array.isArray(doc) ? 'a list' : typeof doc}, expected a map of plan keys (title, templates, regions, gamma, neutrino, ...)`, { file, keyPath: '(document)' });
  }
  const plan = checkWith(planSchema, doc, '', file);
  if (!plan.gamma && !plan.forecast) {
    throw new InputError('found neither gamma nor forecast, expected at least one of them', { file, keyPath: 'gamma' },
      'give the gamma-ray measurement to compare, or a forecast footprint');
  }
  const t = plan.templates;
  if (t.shipped === false && !t.files && !t.build) {
    throw new InputError('found shipped: false and no files or build, expected some templates', { file, keyPath: 'templates.shipped' });
  }
  try { validateFlavourRatio(plan.methods.flavourRatio, 'methods.flavourRatio'); } catch (e) {
    if (e instanceof InputError) throw new InputError(e.problem, { file, keyPath: 'methods.flavourRatio' });
    throw e;
  }
  return plan;
}

function abs(dir: string, p: string): string {
  return isAbsolute(p) ? p : resolve(dir, p);
}

function readText(path: string, file: string | undefined, keyPath: string): string {
  return readInputText(path, { file, keyPath });
}

/** Resolves a checked plan (see the module comment); `dir` is the folder relative paths start from. */
export function resolvePlan(plan: PlanDocument, file: string | undefined, dir: string): ResolvedPlan {
  let regions: RegionDocument, regionsFile: string | undefined;
  if (typeof plan.regions === 'string') {
    regionsFile = abs(dir, plan.regions);
    regions = parseRegionDocument(readText(regionsFile, file, 'regions'), regionsFile);
  } else {
    // an inline document resolves its catalogue paths against the plan's folder
    regions = parseRegionDocument(plan.regions, file ?? resolve(dir, 'plan.yaml'));
  }
  const names = new Set(regionNames(regions));
  const need = (n: string | undefined, keyPath: string) => {
    if (n !== undefined && !names.has(n)) {
      throw new InputError(`found region '${n}', expected one of: ${[...names].join(', ')}`, { file, keyPath }, 'name a region of the region document');
    }
  };
  need(plan.gamma?.region, 'gamma.region');
  need(plan.gamma?.mask, 'gamma.mask');
  need(plan.neutrino.region, 'neutrino.region');
  plan.targets.forEach((t, i) => need(t, `targets[${i}]`));
  need(plan.forecast?.footprint, 'forecast.footprint');
  let measurement: NeutrinoMeasurement, measurementFile: string | undefined;
  if (typeof plan.neutrino.measurement === 'string') {
    measurementFile = abs(dir, plan.neutrino.measurement);
    readText(measurementFile, file, 'neutrino.measurement');
    measurement = readMeasurement(measurementFile);
  } else {
    try { measurement = parseMeasurement(plan.neutrino.measurement, file); } catch (e) {
      if (e instanceof InputError && e.location.keyPath) {
        throw new InputError(e.problem, { file, keyPath: `neutrino.measurement.${e.location.keyPath}` });
      }
      throw e;
    }
  }
  const ref = plan.methods.referenceEnergyTeV;
  if (ref !== undefined && measurement.kind !== 'points' && Math.abs(ref * 1e3 - measurement.e0GeV) > 1e-9 * measurement.e0GeV) {
    throw new InputError(`found ${ref} TeV, expected the measurement's reference energy ${measurement.e0GeV / 1e3} TeV`, { file, keyPath: 'methods.referenceEnergyTeV' },
      'leave it out to use the measurement\'s');
  }
  if (measurement.kind === 'points' && plan.gamma && ref === undefined) {
    throw new InputError('found a points measurement and no reference energy, expected methods.referenceEnergyTeV', { file, keyPath: 'methods.referenceEnergyTeV' });
  }
  if (plan.neutrino.acceptance !== undefined && plan.neutrino.template === undefined) {
    throw new InputError('found an acceptance map and no neutrino template, expected neutrino.template too', { file, keyPath: 'neutrino.acceptance' },
      'the acceptance weighs the projection onto the neutrino template');
  }
  const t = plan.templates;
  const shipped = t.shipped ?? (!t.files && !t.build);
  return {
    file, dir, plan, regions, regionsFile, measurement, measurementFile,
    gammaPointsFile: plan.gamma ? abs(dir, plan.gamma.points) : undefined,
    ...(plan.neutrino.template ? { neutrinoTemplateFile: abs(dir, plan.neutrino.template) } : {}),
    ...(plan.neutrino.acceptance ? { acceptanceFile: abs(dir, plan.neutrino.acceptance) } : {}),
    templateFiles: (t.files ?? []).map((p) => abs(dir, p)),
    buildSpecs: (t.build ?? []).map((p) => abs(dir, p)),
    shipped,
  };
}

/** Reads, checks and resolves the plan file at `path`. */
export function loadPlan(path: string): ResolvedPlan {
  const file = resolve(path);
  const text = readInputText(file, { file: path });
  const plan = checkPlan(parseText(text, path), path);
  return resolvePlan(plan, file, dirname(file));
}

/** Parses and checks plan text (YAML) without resolving it; for tests and tools. */
export function parsePlanText(text: string, file?: string): PlanDocument {
  return checkPlan(parseText(text, file), file);
}
