/**
 * The comparison and forecast of a run, with energy-dependent absorption.
 * The compare layer takes one survival probability per template; the
 * survival of gamma rays depends on energy, so when the factors or survival
 * probabilities differ between energies the prediction is made once per
 * neutrino energy E (with each template's survival at 2E and its k_I from the
 * plane nearest 2E) and the results are assembled into one
 * {@link Prediction}; all calls share the seed, so the template and method
 * draws are the same at every energy (common random numbers). The KAB proton
 * fit then sees the gamma-ray spectrum de-absorbed by one factor per call, not
 * by the energy-dependent survival: stated in the notes.
 */
import type { TemplateFactor } from '../compare/ensemble.js';
import { predictNeutrinos, type PredictInput, type Prediction } from '../compare/predict.js';
import { expectedGamma, type ReverseInput, type ReverseResult } from '../compare/reverse.js';

function sameFactors(a: readonly TemplateFactor[], b: readonly TemplateFactor[]): boolean {
  return a.length === b.length && a.every((f, i) => f.template === b[i].template && f.kI === b[i].kI && f.survivalMean === b[i].survivalMean && f.weight === b[i].weight);
}

/** The prediction at E0 and at `energiesNuGeV` with per-energy factors (see module comment). */
export function predictPerEnergy(base: Omit<PredictInput, 'factors' | 'e0GeV' | 'energiesNuGeV'>, e0GeV: number, energiesNuGeV: number[],
  factorsAt: (energyNuGeV: number) => TemplateFactor[]): { prediction: Prediction; perEnergy: boolean } {
  const f0 = factorsAt(e0GeV);
  if (energiesNuGeV.every((e) => sameFactors(factorsAt(e), f0))) {
    return { prediction: predictNeutrinos({ ...base, factors: f0, e0GeV, energiesNuGeV }), perEnergy: false };
  }
  const at0 = predictNeutrinos({ ...base, factors: f0, e0GeV, energiesNuGeV: [] });
  const per = energiesNuGeV.map((e) => predictNeutrinos({ ...base, factors: factorsAt(e), e0GeV: e, energiesNuGeV: [] }));
  const n = at0.samples, m = per.length;
  const combinedAtEnergies = new Float64Array(n * m);
  per.forEach((p, j) => { for (let s = 0; s < n; s++) combinedAtEnergies[s * m + j] = p.combinedAtE0[s]; });
  const prediction: Prediction = {
    ...at0,
    energiesNuGeV: Float64Array.from(energiesNuGeV),
    components: at0.components.map((c) => ({ ...c, atEnergies: per.map((p) => p.components.find((x) => x.name === c.name)!.atE0) })),
    methods: at0.methods.map((mm) => ({ ...mm, atEnergies: Float64Array.from(per, (p) => p.methods.find((x) => x.id === mm.id)!.atE0) })),
    combinedAtEnergies,
    notes: [...new Set([...at0.notes, ...per.flatMap((p) => p.notes),
      'energy-dependent survival: the prediction was made once per neutrino energy E with each template\'s survival at 2E; the KAB fit de-absorbs the gamma-ray points by one factor per energy, not by the energy-dependent survival'])],
    warnings: [...new Set([...at0.warnings, ...per.flatMap((p) => p.warnings)])],
  };
  return { prediction, perEnergy: true };
}

/** The forecast at gamma-ray energies with per-energy factors (survival at each energy). */
export function forecastPerEnergy(base: Omit<ReverseInput, 'factors' | 'energiesGammaGeV'>, energiesGammaGeV: number[],
  factorsAt: (energyGammaGeV: number) => TemplateFactor[]): { forecast: ReverseResult; perEnergy: boolean } {
  const f0 = factorsAt(energiesGammaGeV[0]);
  if (energiesGammaGeV.every((e) => sameFactors(factorsAt(e), f0))) {
    return { forecast: expectedGamma({ ...base, factors: f0, energiesGammaGeV }), perEnergy: false };
  }
  const per = energiesGammaGeV.map((e) => expectedGamma({ ...base, factors: factorsAt(e), energiesGammaGeV: [e] }));
  const kept = per.filter((p) => p.energiesGammaGeV.length === 1);
  const first = kept[0] ?? per[0];
  return {
    perEnergy: true,
    forecast: {
      ...first,
      energiesGammaGeV: Float64Array.from(kept, (p) => p.energiesGammaGeV[0]),
      components: first.components.map((c) => ({ ...c, atEnergies: kept.map((p) => p.components.find((x) => x.name === c.name)!.atEnergies[0]) })),
      methods: first.methods.map((mm) => ({ ...mm, atEnergies: Float64Array.from(kept, (p) => p.methods.find((x) => x.id === mm.id)!.atEnergies[0]) })),
      notes: [...new Set([...per.flatMap((p) => p.notes), 'energy-dependent survival: the forecast was made once per gamma-ray energy with each template\'s survival at that energy'])],
      warnings: [...new Set(per.flatMap((p) => p.warnings))],
    },
  };
}
