/**
 * The computing part of a run: templates, factors, survival, prediction,
 * comparison, forecast and the optional population section. Returns plain
 * results; plan/outputs.ts turns them into files.
 */
import { ComputeError, InputError } from '../core/errors.js';
import type { SpectrumPoints } from '../physics/points.js';
import { computeFactors } from '../scaling/factors.js';
import type { FactorResult } from '../scaling/ensembleFactors.js';
import type { TemplateFactor } from '../compare/ensemble.js';
import { predictNeutrinos, type Prediction } from '../compare/predict.js';
import { expectedGamma, type ReverseResult } from '../compare/reverse.js';
import { chiSquareOverPoints, compareAtReference, type PointsComparison, type ReferenceComparison } from '../compare/tension.js';
import { runPopulationSection, type PopulationSectionResult } from '../populations/index.js';
import type { ArtefactCache } from './cache.js';
import type { ResolvedPlan } from './loadPlan.js';
import { cachedRegions, isWholeSky, regionSurvival } from './regionWeights.js';
import { loadRunTemplates, type RunTemplate } from './templateStage.js';
import { factorTables, factorsAtEnergy, type SurvivalTable } from './predictStage.js';
import { streamRegionSurvival } from './survivalStream.js';
import { factorTableSelection, planEnergies, uniqueSorted } from './planEnergies.js';
import { projectOnNeutrinoTemplate, type TemplateProjectionResult } from './projectionStage.js';

export type { SurvivalTable };

/** Everything a run computed. */
export interface RunComputation {
  templates: RunTemplate[];
  points: SpectrumPoints | null;
  e0GeV: number;
  energiesNuGeV: number[];
  factors: FactorResult | null;
  prediction: Prediction | null;
  perEnergy: boolean;
  reference: ReferenceComparison | null;
  pointsComparison: PointsComparison | null;
  survival: SurvivalTable | null;
  /** Factors used at E0, per template. */
  factorsAtE0: TemplateFactor[];
  forecastFactors: FactorResult | null;
  forecastSurvival: SurvivalTable | null;
  forecast: ReverseResult | null;
  forecastPerEnergy: boolean;
  populations: PopulationSectionResult | null;
  /** The comparison on the neutrino template's own terms (plan neutrino.template), or null. */
  projection: TemplateProjectionResult | null;
  absorptionStatement: string;
  notes: string[];
}

const nearestPlane = (energies: Float64Array | null, eGeV: number): number => {
  if (!energies || energies.length <= 1) return 0;
  let best = 0;
  for (let i = 1; i < energies.length; i++) if (Math.abs(Math.log(energies[i] / eGeV)) < Math.abs(Math.log(energies[best] / eGeV))) best = i;
  return best;
};

/** Runs the computations of a resolved plan. */
export async function computePlan(rp: ResolvedPlan, cache: ArtefactCache): Promise<RunComputation> {
  const { plan } = rp;
  const m = rp.measurement;
  const absorption = plan.methods.absorption === 'cmb';
  const notes: string[] = [];
  const { points, e0GeV, energiesNuGeV, forecastEnergiesGeV: forecastEnergies, predictionGammaEnergiesGeV: predictionGammaEnergies,
    gammaEnergiesGeV: gammaEnergies } = planEnergies(rp);
  const { templates, notes: tNotes } = await loadRunTemplates({
    files: rp.templateFiles, specs: rp.buildSpecs, shipped: rp.shipped, buildNside: plan.templates.buildNside,
    absorptionNside: plan.methods.absorptionNside, absorption, gammaEnergiesGeV: gammaEnergies, frame: plan.templates.frame, planFile: rp.file,
  }, cache);
  notes.push(...tNotes);
  const weights = plan.templates.weights;
  if (weights) {
    for (const k of Object.keys(weights)) if (!templates.some((t) => t.name === k)) {
      throw new InputError(`found template '${k}', expected one of: ${templates.map((t) => t.name).join(', ')}`, { file: rp.file, keyPath: `templates.weights.${k}` });
    }
    const missing = templates.find((t) => weights[t.name] === undefined);
    if (missing) throw new InputError(`found no weight for template '${missing.name}', expected a weight for every template or none`, { file: rp.file, keyPath: 'templates.weights' });
  }
  const evaluate = cachedRegions(rp.regions, cache);
  const regionsBase = { regions: rp.regions, mode: plan.coverage, assumeFrame: plan.templates.frame, evaluate,
    isWholeSky: (n: string) => isWholeSky(rp.regions, n) };
  const factorTemplates = templates.map((t) => ({ name: t.name, map: t.map, weight: weights?.[t.name] }));

  const survivalIn = async (region: string, exposureWeighted: boolean, energies: number[]): Promise<SurvivalTable | null> => {
    if (!absorption || energies.length === 0) return null;
    const byTemplate: Record<string, number[]> = {};
    for (const t of templates) {
      const inRegion = (nside: number, frame: 'galactic' | 'equatorial') => evaluate(region, { nside, frame, mode: plan.coverage });
      const perPlane = t.survivalFile ? await streamRegionSurvival(t.survivalFile, t.map, inRegion, exposureWeighted, plan.templates.frame) : null;
      byTemplate[t.name] = energies.map((e) => {
        let p: number;
        if (perPlane) p = perPlane.survival[nearestPlane(perPlane.energiesGeV, e)];
        else {
          const a = t.absorbed!;
          const frame = a.tAbs.frame === 'equatorial' ? 'equatorial' : 'galactic';
          const k = nearestPlane(a.tAbs.energiesGeV, e);
          p = regionSurvival(a.tAbs.planes[k], a.survival.planes[k], inRegion(a.tAbs.nside, frame), exposureWeighted);
        }
        if (!(p > 0 && p <= 1 + 1e-12)) throw new ComputeError(`template '${t.name}': mean survival in region '${region}' at ${e} GeV is ${p}; expected a probability`);
        return Math.min(1, p);
      });
    }
    return { region, exposureWeighted, energiesGeV: energies, byTemplate };
  };
  let factors: FactorResult | null = null, prediction: Prediction | null = null, perEnergy = false;
  let reference: ReferenceComparison | null = null, pointsComparison: PointsComparison | null = null, survival: SurvivalTable | null = null;
  let factorsAtE0: TemplateFactor[] = [];
  let projection: TemplateProjectionResult | null = null;
  const mc = { samples: plan.monteCarlo.samples, seed: plan.monteCarlo.seed };
  const conv = { methods: plan.methods.conversion, channel: plan.methods.channel, flavourRatio: plan.methods.flavourRatio as [number, number, number] };
  if (points && plan.gamma) {
    factors = computeFactors({ ...regionsBase, templates: factorTemplates, ...factorTableSelection(rp, true) });
    survival = await survivalIn(plan.gamma.region, plan.gamma.exposureWeighted, predictionGammaEnergies);
    const ft = factorTables(templates, factors, plan.neutrino.region, survival, weights);
    notes.push(...ft.notes);
    factorsAtE0 = factorsAtEnergy(ft.factors, 2 * e0GeV);
    prediction = predictNeutrinos({ gamma: { kind: 'points', points }, factors: ft.factors, factorsFile: rp.file, ...conv, region: plan.neutrino.region, ...mc,
      e0GeV, energiesNuGeV });
    perEnergy = ft.factors.some((f) => f.kIByEnergy !== undefined || f.survivalByEnergy !== undefined);
    if (m.kind !== 'points') reference = compareAtReference(prediction, m);
    else pointsComparison = chiSquareOverPoints(prediction, m);
    projection = projectOnNeutrinoTemplate({ rp, templates, factors, factorsAtE0, factorTables: ft.factors, points, e0GeV,
      base: { factorsFile: rp.file, ...conv, ...mc } });
  }
  if (rp.neutrinoTemplateFile && !(points && plan.gamma)) notes.push('neutrino.template is used by the comparison of gamma-ray points only; this run has none, so it was not used');
  let forecastFactors: FactorResult | null = null, forecastSurvival: SurvivalTable | null = null, forecast: ReverseResult | null = null, fPer = false;
  if (plan.forecast) {
    forecastFactors = computeFactors({ ...regionsBase, templates: factorTemplates, ...factorTableSelection(rp, false) });
    forecastSurvival = await survivalIn(plan.forecast.footprint, plan.forecast.exposureWeighted, uniqueSorted(forecastEnergies));
    const ft = factorTables(templates, forecastFactors, plan.neutrino.region, forecastSurvival, weights);
    forecast = expectedGamma({ measurement: m, ...conv, ...mc, factors: ft.factors, energiesGammaGeV: uniqueSorted(forecastEnergies) });
    fPer = ft.factors.some((f) => f.kIByEnergy !== undefined || f.survivalByEnergy !== undefined);
  }
  let populations: PopulationSectionResult | null = null;
  if (plan.populations) {
    populations = runPopulationSection(plan.populations, { regions: rp.regions, baseDir: rp.dir, file: rp.file, keyPath: 'populations',
      regionWeights: (name, nside) => evaluate(name, { nside, frame: 'galactic', mode: plan.coverage }) });
    notes.push('the population section is reported beside the comparison; its unresolved-source correction is not applied to the headline numbers');
  }
  const absorptionStatement = !absorption
    ? 'No absorption correction: gamma rays were taken as emitted (survival 1).'
    : `Pair absorption on the CMB: each template's emission-weighted mean survival probability in the measured region was computed from the template model at every gamma-ray energy used (${rp.shipped ? `shipped templates rebuilt from their specs at Nside ${plan.methods.absorptionNside}` : 'from the templates\' survival maps'}); ` +
      ((perEnergy || fPer) ? 'the prediction and the proton fit use, at each gamma-ray energy, the survival at that energy.' : 'the survival did not change between the energies used.');
  return { templates, points, e0GeV, energiesNuGeV, factors, prediction, perEnergy, reference, pointsComparison, survival, factorsAtE0,
    forecastFactors, forecastSurvival, forecast, forecastPerEnergy: fPer, populations, projection, absorptionStatement, notes };
}
