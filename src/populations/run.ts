/**
 * Many realisations of one population seen by one survey: per realisation the
 * source counts N(>S) (all sources and resolved ones) in each count region,
 * the unresolved-source intensity in the measured region (the sources the
 * survey does not resolve and so does not mask stay in its "diffuse"
 * intensity), the all-source intensity in the neutrino region (nothing is
 * resolved there) and the total flux. Intensity = sum_i w_i phi_i / Omega_w
 * (GeV^-1 cm^-2 s^-1 sr^-1), w the region weight at the source's pixel.
 */
import { InputError } from '../core/errors.js';
import { Random } from '../compare/random.js';
import type { RegionWeights } from '../regions/types.js';
import { countsAbove, summedFlux } from './counts.js';
import type { PopulationModel } from './model.js';
import { scaleLuminosity } from './luminosity.js';
import { assertRealisationFits, drawRealisation, populationSampler } from './realise.js';
import { regionWeightsOfSources } from './sourcePixels.js';
import { resolvedFlags, type DetectionThreshold } from './threshold.js';

/** A region in which N(>S) is counted (weights null: the whole sky). */
export interface CountRegion { name: string; weights: RegionWeights | null }

/** Input of {@link runPopulation}. */
export interface PopulationRunInput {
  model: PopulationModel;
  threshold: DetectionThreshold;
  /** Region of the measured diffuse intensity, after its source mask (null: skip). */
  measured: RegionWeights | null;
  /** Weight the measured region by its relative exposure (as the measured mean is). */
  exposureWeighted?: boolean;
  /** Neutrino analysis region (null: skip). */
  neutrino: RegionWeights | null;
  countRegions: CountRegion[];
  /** Flux grid of N(>S) (erg cm^-2 s^-1), log-spaced (counts.ts fluxGrid). */
  grid: Float64Array;
  realisations: number;
  seed: number;
  /** Random stream (different variants of one run use different streams). */
  stream?: number;
  /** Relative one-sigma of the source count drawn per realisation (calibration error); 0: fixed count. */
  countRelSigma?: number;
  /** Relative one-sigma of a luminosity scale drawn per realisation (calibration by luminosity); 0: none. */
  luminosityRelSigma?: number;
}

/** Output of {@link runPopulation}; per-realisation arrays are row-major [r * width + k]. */
export interface PopulationRun {
  realisations: number;
  energiesGeV: Float64Array;
  grid: Float64Array;
  /** Per count region: N(>S) of all sources and of resolved ones, realisations x grid. */
  counts: { name: string; all: Float64Array; resolved: Float64Array }[];
  /** Unresolved intensity in the measured region, realisations x energies (null without region). */
  unresolvedMeasured: Float64Array | null;
  /** All-source intensity in the neutrino region, realisations x energies. */
  allNeutrino: Float64Array | null;
  /** Total flux of all sources (GeV^-1 cm^-2 s^-1), realisations x energies. */
  totalFlux: Float64Array;
  /** Number of sources drawn and resolved per realisation. */
  drawn: Float64Array;
  resolved: Float64Array;
}

/** Runs the realisations (see the module comment). */
export function runPopulation(input: PopulationRunInput): PopulationRun {
  const M = input.realisations;
  if (!(Number.isInteger(M) && M >= 2)) throw new InputError(`realisations is ${M}, expected an integer >= 2`, { keyPath: 'realisations' });
  const base = populationSampler(input.model);
  const nE = input.model.energiesGeV.length, K = input.grid.length;
  // Per-realisation tables (below) and the largest realisation expected (count up 5 sigma) must fit together.
  const tableBytes = 8 * M * (2 * K * input.countRegions.length + 3 * nE + 2);
  assertRealisationFits(Math.round(input.model.count * (1 + 5 * (input.countRelSigma ?? 0))), nE, tableBytes);
  const rng = new Random(input.seed, 2 * (input.stream ?? 0) + 1), rngCount = new Random(input.seed, 2 * (input.stream ?? 0) + 2);
  const counts = input.countRegions.map((c) => ({ name: c.name, all: new Float64Array(M * K), resolved: new Float64Array(M * K) }));
  const unres = input.measured ? new Float64Array(M * nE) : null, allNu = input.neutrino ? new Float64Array(M * nE) : null;
  const total = new Float64Array(M * nE), drawn = new Float64Array(M), nRes = new Float64Array(M);
  const sigma = input.countRelSigma ?? 0, sigmaL = input.luminosityRelSigma ?? 0;
  for (let r = 0; r < M; r++) {
    const scale = sigma > 0 ? Math.max(0, 1 + sigma * rngCount.normal()) : 1;
    const scaleL = sigmaL > 0 ? Math.exp(sigmaL * rngCount.normal()) : 1;
    const sampler = scale === 1 && scaleL === 1 ? base
      : { ...base, model: { ...base.model, count: base.model.count * scale, luminosity: scaleLuminosity(base.model.luminosity, scaleL) } };
    const real = drawRealisation(sampler, rng);
    const res = resolvedFlags(real, input.threshold);
    drawn[r] = real.count;
    let k = 0;
    for (let i = 0; i < real.count; i++) k += res[i];
    nRes[r] = k;
    total.set(summedFlux(real, null, null), r * nE);
    input.countRegions.forEach((c, j) => {
      const w = c.weights ? regionWeightsOfSources(real, c.weights).weight : null;
      counts[j].all.set(countsAbove(real.fluxErgCm2S, input.grid, w), r * K);
      counts[j].resolved.set(countsAbove(real.fluxErgCm2S, input.grid, w, res, 1), r * K);
    });
    if (unres && input.measured) {
      const { weight, solidAngleSr } = regionWeightsOfSources(real, input.measured, input.exposureWeighted);
      const s = summedFlux(real, weight, res);
      for (let e = 0; e < nE; e++) unres[r * nE + e] = s[e] / solidAngleSr;
    }
    if (allNu && input.neutrino) {
      const { weight, solidAngleSr } = regionWeightsOfSources(real, input.neutrino, false);
      const s = summedFlux(real, weight, null);
      for (let e = 0; e < nE; e++) allNu[r * nE + e] = s[e] / solidAngleSr;
    }
  }
  return {
    realisations: M, energiesGeV: Float64Array.from(input.model.energiesGeV), grid: input.grid, counts,
    unresolvedMeasured: unres, allNeutrino: allNu, totalFlux: total, drawn, resolved: nRes,
  };
}

/** Column k of a row-major realisations x width array. */
export function column(a: Float64Array, width: number, k: number): Float64Array {
  const M = a.length / width, out = new Float64Array(M);
  for (let r = 0; r < M; r++) out[r] = a[r * width + k];
  return out;
}
