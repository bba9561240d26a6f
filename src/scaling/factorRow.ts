/**
 * From region sums to the extrapolation factors of one template plane and one
 * target region, with every check that keeps an untrustworthy number out of a
 * table. Definitions (T the template, f_A, f_B covered fractions, w the
 * measured region's relative exposure, sums over valid pixels; HEALPix pixels
 * have equal area, Gorski et al. 2005, so dOmega cancels in the means):
 *
 *   <T>_A,w = sum(w f_A T) / sum(w f_A)          mean in the measured region
 *   <T>_B   = sum(f_B T) / sum(f_B)              mean in the target region
 *   k_I     = <T>_B / <T>_A,w                    intensity factor
 *   F_B     = <T>_B * Omega_B                    template flux from B (sr x T units)
 *   k_F     = F_B / <T>_A,w                      flux factor, sr
 *   k_4pi   = <T>_sky / <T>_A,w                  4 pi-average factor (F_sky / 4 pi / <T>_A,w)
 *   c_AB    = sum(f_A f_B T) / sum(f_B T)        fraction of B's template flux inside A
 *
 * Omega_B = sum(f_B) x pixel area counts blank pixels too, so F_B fills each
 * blank pixel of B with B's mean (equal to sum(f_B T dOmega) when there is no
 * blank). c_AB uses the geometric coverage f_A, not the exposure.
 * These are the usual template-ratio definitions (common practice, no source).
 */
import { ComputeError } from '../core/errors.js';
import { S } from './regionSums.js';

/** The factors of one template plane for one target (see module doc). */
export interface FactorRow {
  template: string;
  /** 0-based plane (energy) index. */
  plane: number;
  energyGeV: number | null;
  target: string;
  nside: number;
  frame: string;
  /** <T>_A,w in the template's unit. */
  meanMeasured: number;
  /** <T>_B in the template's unit. */
  meanTarget: number;
  kI: number;
  /** Flux factor in sr. */
  kFSr: number;
  fourPiFactor: number;
  solidAngleMeasuredSr: number;
  solidAngleTargetSr: number;
  coveredFluxFraction: number;
  /** Blank pixels (f > 0) excluded from the measured and the target region. */
  blankMeasured: number;
  blankTarget: number;
  /** Pixels (f > 0) with a negative template value. */
  negativeMeasured: number;
  negativeTarget: number;
}

/** What {@link factorRow} needs besides the sums. */
export interface RowContext {
  template: string;
  plane: number;
  energyGeV: number | null;
  measured: string;
  target: string;
  nside: number;
  frame: string;
  solidAngleMeasuredSr: number;
  solidAngleTargetSr: number;
}

function where(c: RowContext): string {
  const e = c.energyGeV === null ? '' : ` (${c.energyGeV} GeV)`;
  return `template '${c.template}' plane ${c.plane}${e} at Nside ${c.nside} (${c.frame})`;
}

/** Mean of a region's sums, or a ComputeError saying why there is none. */
export function regionMean(sums: Float64Array, region: string, c: RowContext): number {
  if (sums[S.VALID_COUNT] === 0) {
    throw new ComputeError(`${where(c)} is blank over all of region '${region}' (${sums[S.BLANK_COUNT]} blank pixels); no factor can be formed`);
  }
  if (!(sums[S.WF] > 0)) {
    throw new ComputeError(`region '${region}' has zero exposure over every valid pixel of ${where(c)}; check the exposure weighting`);
  }
  const mean = sums[S.WFT] / sums[S.WF];
  if (!(mean > 0) || !Number.isFinite(mean)) {
    throw new ComputeError(`${where(c)} has mean ${mean} over region '${region}'; factors need a template that is positive there`);
  }
  return mean;
}

/**
 * Forms a {@link FactorRow} from the sums of the measured region, the target
 * region (CROSS slot holding sum f_B f_A T) and the whole sky.
 * Throws ComputeError instead of returning a non-finite number.
 */
export function factorRow(a: Float64Array, b: Float64Array, sky: Float64Array, c: RowContext): FactorRow {
  const meanA = regionMean(a, c.measured, c);
  const meanB = regionMean(b, c.target, c);
  const meanSky = regionMean(sky, 'whole sky', c);
  const row: FactorRow = {
    template: c.template, plane: c.plane, energyGeV: c.energyGeV, target: c.target, nside: c.nside, frame: c.frame,
    meanMeasured: meanA,
    meanTarget: meanB,
    kI: meanB / meanA,
    kFSr: (meanB * c.solidAngleTargetSr) / meanA,
    fourPiFactor: meanSky / meanA,
    solidAngleMeasuredSr: c.solidAngleMeasuredSr,
    solidAngleTargetSr: c.solidAngleTargetSr,
    coveredFluxFraction: b[S.CROSS] / b[S.FT],
    blankMeasured: a[S.BLANK_COUNT],
    blankTarget: b[S.BLANK_COUNT],
    negativeMeasured: a[S.NEG_COUNT],
    negativeTarget: b[S.NEG_COUNT],
  };
  for (const [k, v] of Object.entries(row)) {
    if (typeof v === 'number' && !Number.isFinite(v)) {
      throw new ComputeError(`${where(c)}: ${k} for target '${c.target}' is ${v}; refusing to report it`);
    }
  }
  return row;
}
