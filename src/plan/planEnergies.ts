/**
 * The energies a run works at, from the plan alone: the reference energy
 * E0, the neutrino energies of the prediction, the gamma-ray energies where
 * survival is needed (prediction and forecast), and the measured-region
 * selection of the run's factor tables. Shared by the whole run
 * (compute.ts) and by a shard of its factor stage (factorShard.ts), so both
 * build the same templates.
 */
import { InputError } from '../core/errors.js';
import type { SpectrumPoints } from '../physics/points.js';
import { readGammaPoints } from '../physics/fluxPoints/read.js';
import type { ResolvedPlan } from './loadPlan.js';

/** Sorted copy of `xs` without values within 1e-9 (relative) of their predecessor. */
export function uniqueSorted(xs: number[]): number[] {
  const s = [...xs].sort((a, b) => a - b);
  return s.filter((x, i) => i === 0 || Math.abs(x - s[i - 1]) > 1e-9 * x);
}

/** Energies of a run (GeV), see module comment. */
export interface PlanEnergies {
  points: SpectrumPoints | null;
  e0GeV: number;
  energiesNuGeV: number[];
  forecastEnergiesGeV: number[];
  predictionGammaEnergiesGeV: number[];
  /** Every gamma-ray energy where survival is needed (prediction and forecast). */
  gammaEnergiesGeV: number[];
}

/** Reads the gamma-ray points and works out the run's energies (InputError when E0 lies outside the points). */
export function planEnergies(rp: ResolvedPlan): PlanEnergies {
  const { plan } = rp;
  const m = rp.measurement;
  const points = rp.gammaPointsFile ? readGammaPoints(rp.gammaPointsFile) : null;
  const e0GeV = plan.methods.referenceEnergyTeV !== undefined ? plan.methods.referenceEnergyTeV * 1e3
    : m.kind !== 'points' ? m.e0GeV : Math.sqrt(Math.min(...m.points.map((p) => p.energyGeV)) * Math.max(...m.points.map((p) => p.energyGeV)));
  let energiesNuGeV: number[] = [];
  if (points) {
    const meas = Array.from(points.energyGeV).filter((_, i) => !points.upperLimit[i]);
    const lo = Math.min(...meas), hi = Math.max(...meas);
    const wanted = [...meas.map((e) => e / 2), ...(m.kind === 'points' ? m.points.map((p) => p.energyGeV) : [])];
    energiesNuGeV = uniqueSorted(wanted.filter((e) => 2 * e >= lo * (1 - 1e-9) && 2 * e <= hi * (1 + 1e-9)));
    if (!(2 * e0GeV >= lo * (1 - 1e-9) && 2 * e0GeV <= hi * (1 + 1e-9))) {
      throw new InputError(`reference energy ${e0GeV / 1e3} TeV: twice it lies outside the gamma-ray points (${lo / 1e3} to ${hi / 1e3} TeV)`,
        { file: rp.file, keyPath: 'methods.referenceEnergyTeV' }, 'choose a reference energy between half the lowest and half the highest measured gamma-ray energy');
    }
  }
  let forecastEnergies: number[] = [];
  if (plan.forecast) {
    if (plan.forecast.energiesTeV) forecastEnergies = plan.forecast.energiesTeV.map((e) => e * 1e3);
    else {
      const r = m.kind === 'points' ? [Math.min(...m.points.map((p) => p.energyGeV)), Math.max(...m.points.map((p) => p.energyGeV))]
        : (m.energyRangeGeV ?? [m.e0GeV / 10, m.e0GeV * 10]);
      forecastEnergies = Array.from({ length: 8 }, (_, i) => 2 * r[0] * Math.pow(r[1] / r[0], i / 7));
    }
  }
  // the proton fit de-absorbs upper limits too: survival is needed at their energies
  const ulEnergies = points ? Array.from(points.energyGeV).filter((_, i) => points.upperLimit[i]) : [];
  const predictionGammaEnergies = points ? uniqueSorted([2 * e0GeV, ...energiesNuGeV.map((e) => 2 * e), ...ulEnergies]) : [];
  const gammaEnergies = uniqueSorted([...predictionGammaEnergies, ...forecastEnergies]);
  return { points, e0GeV, energiesNuGeV, forecastEnergiesGeV: forecastEnergies, predictionGammaEnergiesGeV: predictionGammaEnergies, gammaEnergiesGeV: gammaEnergies };
}

/**
 * The measured region, targets and exposure weighting of the run's factor
 * tables (factors.*): the gamma-ray region when the plan has gamma-ray
 * points, else the forecast footprint.
 */
export function factorTableSelection(rp: ResolvedPlan, hasPoints: boolean): { measured: string; targets: string[]; exposureWeighted: boolean } {
  const { plan } = rp;
  if (hasPoints && plan.gamma) {
    return { measured: plan.gamma.region, targets: [...new Set([plan.neutrino.region, ...plan.targets])], exposureWeighted: plan.gamma.exposureWeighted };
  }
  return { measured: plan.forecast!.footprint, targets: [plan.neutrino.region], exposureWeighted: plan.forecast!.exposureWeighted };
}
