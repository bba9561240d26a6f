/**
 * Neutrino flavours. Pion-decay sources give nu_e : nu_mu : nu_tau = 1 : 2 : 0 at
 * the source and about 1 : 1 : 1 at Earth after oscillation over astronomical
 * distances (common practice, no source). The ratio at Earth is configurable.
 */
import { InputError } from '../../core/errors.js';

/** Relative flavour weights (e, mu, tau); only the ratios matter. */
export type FlavourRatio = readonly [number, number, number];

/** The default ratio at Earth for pion-decay sources. */
export const FLAVOUR_RATIO_EARTH: FlavourRatio = [1, 1, 1];

/** Per-flavour parts of an all-flavour quantity. */
export interface FlavourSplit { e: number; mu: number; tau: number }

/** Checks a ratio: three finite numbers >= 0 with a positive sum. */
export function validateFlavourRatio(r: readonly number[], keyPath = 'flavourRatio'): FlavourRatio {
  if (r.length !== 3 || !r.every((v) => v >= 0 && Number.isFinite(v)) || !(r[0] + r[1] + r[2] > 0)) {
    throw new InputError(`flavour ratio ${JSON.stringify(r)} must be three numbers >= 0 with a positive sum`, { keyPath },
      'e.g. 1:1:1');
  }
  return [r[0], r[1], r[2]];
}

/** Parses "1:1:1" (or "1,2,0") into a ratio. */
export function parseFlavourRatio(text: string): FlavourRatio {
  return validateFlavourRatio(text.split(/[:,]/).map((t) => Number(t.trim())));
}

/** Splits an all-flavour value by the ratio. */
export function splitFlavours(allFlavour: number, ratio: FlavourRatio = FLAVOUR_RATIO_EARTH): FlavourSplit {
  const s = ratio[0] + ratio[1] + ratio[2];
  return { e: (allFlavour * ratio[0]) / s, mu: (allFlavour * ratio[1]) / s, tau: (allFlavour * ratio[2]) / s };
}
