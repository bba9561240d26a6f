/**
 * A source population: where the sources are (a Galactocentric density, or a
 * uniform ball around the observer), how bright they are (a luminosity
 * function), what spectrum each has, and how big they are. Plain data; drawn
 * by realise.ts. Luminosities and fluxes are "E0^2 dN/dE at the pivot energy
 * E0": luminosity in erg s^-1, flux in erg cm^-2 s^-1 (a common way to quote
 * both; common practice, no source).
 */
import type { RadialLawParams } from '../templates/radialLaws.js';

/**
 * Spatial density. 'disc': n(R, z) = n0 f(R) exp(-|z| / h) in Galactocentric
 * cylindrical coordinates for R <= rMaxKpc, with f one of the templates'
 * source radial laws (null: constant), the observer at (R_sun, 0, z_sun), the
 * same geometry as the template builder (templates/modelGrid.ts). 'ball': a
 * uniform density inside radiusKpc around the observer (the Euclidean case).
 */
export type SpatialModel =
  | { kind: 'disc'; law: RadialLawParams | null; lawName: string; scaleHeightKpc: number; rSunKpc: number; zSunKpc: number; rMaxKpc: number }
  | { kind: 'ball'; radiusKpc: number };

/**
 * Luminosity function (erg s^-1, E0^2 dN/dE at the pivot). 'powerLaw':
 * dN/dL proportional to L^-alpha for minErgPerS <= L <= maxErgPerS (any real
 * alpha). 'logNormal': log10 L normal with median medianErgPerS and width sigmaDex.
 */
export type LuminosityFunction =
  | { kind: 'powerLaw'; alpha: number; minErgPerS: number; maxErgPerS: number }
  | { kind: 'logNormal'; medianErgPerS: number; sigmaDex: number };

/**
 * Spectrum of each source, normalised at the pivot: phi(E) = phi(E0)
 * (E/E0)^-Gamma exp(-(E - E0)/Ec), Gamma drawn per source from a normal of
 * mean `index` and width `indexSpread`; cutoffGeV null means no cutoff.
 * (Power law with exponential cutoff, common practice, no source.)
 */
export interface SourceSpectrumModel {
  pivotGeV: number;
  index: number;
  indexSpread: number;
  cutoffGeV: number | null;
}

/** Physical size: point-like, one radius for all, or log-uniform between two radii (pc). */
export type SourceSizeModel =
  | { kind: 'point' }
  | { kind: 'fixed'; radiusPc: number }
  | { kind: 'logUniform'; minPc: number; maxPc: number };

/** A whole population. `count` is the number of sources in the volume (all of them, seen or not). */
export interface PopulationModel {
  name: string;
  count: number;
  spatial: SpatialModel;
  luminosity: LuminosityFunction;
  spectrum: SourceSpectrumModel;
  size: SourceSizeModel;
  /** Working energies (GeV) at which each source's differential flux is kept. */
  energiesGeV: number[];
}

/** The same model with another source count (calibration scales the count). */
export function withCount(model: PopulationModel, count: number): PopulationModel {
  return { ...model, count };
}
