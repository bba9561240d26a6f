/**
 * The shapes of a factor job's input and result (see ensembleFactors.ts and
 * factorJob.ts), and the assumption every factor table carries.
 */
import type { SkyMap } from '../maps/skyMap.js';
import type { FactorRow } from './factorRow.js';
import type { SummaryRow } from './summary.js';
import type { FactorJobSettings } from './factorJob.js';

/** The statement every factor table carries. */
export const EXTRAPOLATION_ASSUMPTION =
  'The sky outside the measured region is assumed to look like each template: only the template shape carries the measurement to the target.';

/** One template of the ensemble. `weight` (>= 0) enters the weighted summary; give it for all or none. */
export interface FactorTemplate { name: string; map: SkyMap; weight?: number }

/** Input of {@link computeFactors}: the templates and the job's settings (factorJob.ts). */
export interface FactorInput extends FactorJobSettings {
  templates: FactorTemplate[];
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
