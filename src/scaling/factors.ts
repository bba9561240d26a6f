/**
 * The factor entry point of the library: {@link computeFactors} evaluates the
 * named regions of a region document with the regions layer and hands them to
 * the ensemble computation (ensembleFactors.ts, where the definitions live).
 */
import { InputError } from '../core/errors.js';
import { evaluateRegion } from '../regions/evaluate.js';
import type { RegionDocument } from '../regions/types.js';
import { computeFactorsWith, type FactorInput, type FactorResult, type RegionEvaluator } from './ensembleFactors.js';
import type { FactorJobSettings } from './factorJob.js';

/** True when region `name` is `sky` with nothing subtracted (directly or through references). */
function isPlainSky(doc: RegionDocument, name: string, depth: number): boolean {
  const n = doc.regions.get(name);
  if (!n || n.except.length > 0 || depth > 32) return false;
  if (n.kind === 'sky') return true;
  return n.kind === 'ref' ? isPlainSky(doc, n.name, depth + 1) : false;
}

/**
 * Extrapolation factors of every template, plane and target region (see
 * ensembleFactors.ts and factorRow.ts for definitions): regions come from
 * `input.regions` through the regions layer unless `input.evaluate` is given.
 *
 * @example
 * const r = computeFactors({ templates: [{ name: 'gas', map }], regions: doc,
 *   measured: 'survey', targets: ['plane', 'sky'], mode: 'centre' });
 * r.rows[0].kI; // mean template in 'plane' over mean in 'survey'
 */
export function computeFactors(input: FactorInput): FactorResult {
  const r = regionEvaluator(input);
  return computeFactorsWith({ ...input, isWholeSky: r.isWholeSky }, r.evaluate);
}

/**
 * The region evaluator of a job's settings: `settings.evaluate`, else the
 * regions layer over `settings.regions`; and the whole-sky test that spares
 * evaluating a plain `sky` region.
 */
export function regionEvaluator(input: FactorJobSettings): { evaluate: RegionEvaluator; isWholeSky?: (name: string) => boolean } {
  const evaluate: RegionEvaluator = input.evaluate ?? ((name, o) => {
    if (!input.regions) throw new InputError('no region document given', {}, 'pass a region file');
    return evaluateRegion(input.regions, name, { ...o, baseDir: input.baseDir });
  });
  const doc = input.regions;
  const isWholeSky = input.isWholeSky ?? (doc && !input.evaluate ? (name: string) => isPlainSky(doc, name, 0) : undefined);
  return { evaluate, isWholeSky };
}
