/**
 * The SkyMap: one HEALPix map, or an energy cube of them, with everything a
 * computation needs to interpret the numbers.
 */
import type { Ordering } from '../sphere/nside.js';
import type { FrameName } from '../sphere/frames.js';

/** The element arrays a map may hold. */
export type MapArray = Float32Array | Float64Array;

/**
 * A HEALPix sky map. `planes` holds one array of 12 Nside^2 values per energy
 * plane (a plain map has one plane and `energiesGeV` null). Values are in
 * `unit` (free text as read from the file, e.g. 'cm^-2 s^-1 sr^-1 GeV^-1').
 * Blank pixels hold {@link BLANK} or NaN (see blank.ts).
 */
export interface SkyMap {
  readonly nside: number;
  readonly ordering: Ordering;
  readonly frame: FrameName;
  /** Column name in the file (or a name given by the builder). */
  readonly column: string;
  readonly unit: string;
  readonly planes: MapArray[];
  /** Energy of each plane in GeV, or null for a map without an energy axis. */
  readonly energiesGeV: Float64Array | null;
  /** Free-form metadata carried into output headers (e.g. a model spec). */
  readonly meta?: Record<string, string | number | boolean>;
}

/** The HEALPix blank sentinel, -1.6375e30 (healpy's UNSEEN; Gorski et al. 2005 convention). */
export const BLANK = -1.6375e30;
