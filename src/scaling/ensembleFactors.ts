/**
 * Extrapolation factors for an ensemble of templates held in memory: for each
 * template, each energy plane and each target region, the factors of
 * factorRow.ts, plus the ensemble summary. Regions are evaluated in each
 * template's own Nside and frame (once per distinct pair, factorJob.ts),
 * turned into sparse pixel lists, and every plane is summed over those lists;
 * the whole sky costs one pass per plane. Template files are better streamed
 * (streamFactors.ts), which gives the same numbers without holding the maps.
 *
 * Assumption carried into every output: the sky outside the measured region
 * looks like each template (only the template's shape is used; its
 * normalisation cancels).
 */
import { InputError } from '../core/errors.js';
import type { FrameName } from '../sphere/frames.js';
import { regionSums, wholeSkySums, SUMS_LENGTH } from './regionSums.js';
import { composeFactorResult, FactorJob, type RegionEvaluator } from './factorJob.js';
import type { FactorInput, FactorResult, FactorTemplate } from './factorTypes.js';

export { EXTRAPOLATION_ASSUMPTION, type FactorInput, type FactorResult, type FactorTemplate, type EvaluatedRegion } from './factorTypes.js';
export type { RegionEvaluator } from './factorJob.js';

/** The frame of a template: its file's, else `assume`; an InputError when neither says. */
export function templateFrame(name: string, f: FrameName, assume?: 'galactic' | 'equatorial'): 'galactic' | 'equatorial' {
  if (f === 'galactic' || f === 'equatorial') return f;
  if (assume) return assume;
  throw new InputError(`template '${name}' does not say its frame (COORDSYS missing or unknown)`, {},
    'state it with --frame galactic|equatorial');
}

/** Throws an InputError when two templates share a name. */
export function assertDistinctNames(names: string[]): void {
  const seen = new Set<string>();
  for (const n of names) {
    if (seen.has(n)) throw new InputError(`two templates are named '${n}'`, {}, 'give each template a distinct name');
    seen.add(n);
  }
}

/**
 * Computes every factor for every template, plane and target, and the
 * ensemble summary, with regions from `evaluate` (see factorRow.ts for the definitions and summary.ts for
 * the quantiles). Throws ComputeError for an empty region, a template blank,
 * zero or negative on average over a region, or not enough memory;
 * InputError for bad input.
 */
export function computeFactorsWith(input: FactorInput, evaluate: RegionEvaluator): FactorResult {
  if (input.templates.length === 0) throw new InputError('no templates given', {}, 'name template files or a folder');
  const job = new FactorJob(input, evaluate);
  assertDistinctNames(input.templates.map((t) => t.name));
  input.templates.forEach((t, i) => addTemplateInMemory(job, i, 0, t, input.assumeFrame));
  return composeFactorResult([job.log]);
}

/**
 * Adds the rows of template `t` (held in memory), the `ordinal`-th of source
 * `file`, to `job`: each plane summed over the regions of its geometry.
 */
export function addTemplateInMemory(job: FactorJob, file: number, ordinal: number, t: FactorTemplate, assumeFrame?: 'galactic' | 'equatorial'): void {
  const frame = templateFrame(t.name, t.map.frame, assumeFrame);
  const { nside } = t.map;
  const g = job.openTemplate(file, ordinal, t.name, nside, frame, t.weight);
  const nested = t.map.ordering === 'NESTED';
  const sky = new Float64Array(SUMS_LENGTH);
  t.map.planes.forEach((plane, p) => {
    wholeSkySums(plane, sky);
    const sa = g.a.full ? null : new Float64Array(SUMS_LENGTH);
    if (sa) regionSums(plane, nside, nested, g.a, null, sa);
    const sbs = g.bs.map((b) => {
      if (b.full) return null;
      const sb = new Float64Array(SUMS_LENGTH);
      regionSums(plane, nside, nested, b, g.a, sb);
      return sb;
    });
    job.addPlane(file, ordinal, t.name, g, { nside, frame }, p, t.map.energiesGeV ? t.map.energiesGeV[p] : null, sa, sbs, sky);
  });
}
