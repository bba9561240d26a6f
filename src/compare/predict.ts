/**
 * The neutrino intensity predicted in the neutrino analysis's region from
 * gamma rays measured in region A. For each Monte Carlo sample s:
 *
 *   I_nu,all(E) = r_m(E) * (k_I,t(2E) / P_t(2E)) * I_gamma,A(2E)
 *
 * with I_gamma,A drawn from its errors (gammaSampler.ts), template t drawn from
 * the ensemble (its extrapolation factor k_I,t and mean survival P_t in A go
 * together, both read at the gamma-ray energy 2E; ensemble.ts), intrinsic =
 * measured / P (de-absorption), and the
 * conversion method m drawn with equal probability from the methods in use
 * (conversion.ts). Per flavour: all-flavour times the flavour fraction at
 * Earth (1:1:1 by default).
 *
 * Each source of uncertainty is also propagated alone, the others held at
 * their centre (gamma-ray points at their values, k_I and P at the ensemble's
 * weighted medians at each energy, the primary method): components 'gamma', 'template'
 * (k_I only), 'absorption' (P only), 'method'; 'combined' varies all. The
 * components share the draws of the combined run (common random numbers).
 * A first-order propagation of the gamma-ray errors at E0 cross-checks the
 * 'gamma' component. The KAB proton fit sees every gamma-ray point, upper
 * limits included, de-absorbed by the central survival at its own energy.
 * Methods by channel: physics/hadronic/channels.ts (p-gamma: K_pi rule only).
 */
import { ComputeError, InputError } from '../core/errors.js';
import { FLAVOUR_RATIO_EARTH, splitFlavours, type FlavourRatio, type FlavourSplit } from '../physics/hadronic/flavour.js';
import { channelWords, checkMethodChannel, defaultMethods } from '../physics/hadronic/channels.js';
import type { PionChannel } from '../physics/hadronic/kpiRule.js';
import type { SpectrumPoints } from '../physics/points.js';
import { METHOD_SPREAD_NOTE, kabRatios, kpiRatios, type MethodId, type MethodRatios } from './conversion.js';
import { buildEnsemble, centralSurvivalAt, drawTemplate, ensembleAt, type TemplateFactor } from './ensemble.js';
import { gammaSampler, type GammaInput } from './gammaSampler.js';
import { checkLinear, linearPropagate, resolveMonteCarloOptions, type LinearCheck } from './propagate.js';
import { Random } from './random.js';
import { summariseSamples, type SampleSummary } from './summary.js';

/** Input of {@link predictNeutrinos}. Energies in GeV (neutrino energies unless said otherwise). */
export interface PredictInput {
  gamma: GammaInput;
  factors: readonly TemplateFactor[];
  factorsFile?: string;
  /** Reference neutrino energy E0. 2 E0 must lie inside the gamma-ray range. */
  e0GeV: number;
  /** Neutrino energies for the spectrum; default: half the gamma-ray point energies (or a grid for a model). */
  energiesNuGeV?: ArrayLike<number>;
  /** Methods, the first is the primary one; default by channel: pp ['kab', 'kpi'], p-gamma ['kpi']. */
  methods?: MethodId[];
  channel?: PionChannel;
  flavourRatio?: FlavourRatio;
  /** Name of the neutrino region, for the assumptions. */
  region?: string;
  samples?: number;
  seed?: number;
}

/** Names of the uncertainty components. */
export type ComponentName = 'gamma' | 'template' | 'absorption' | 'method' | 'combined';

/** One component: what it varies, and its summary at E0 and at each energy (all-flavour). */
export interface PredictionComponent {
  name: ComponentName;
  description: string;
  atE0: SampleSummary;
  atEnergies: SampleSummary[];
}

/** Output of {@link predictNeutrinos}. Intensities in GeV^-1 cm^-2 s^-1 sr^-1, all-flavour unless per-flavour. */
export interface Prediction {
  e0GeV: number;
  /** Energies kept (2E inside the gamma-ray range). */
  energiesNuGeV: Float64Array;
  primaryMethod: MethodId;
  /** Central value of each method at E0 and at the energies (central inputs). */
  methods: { id: MethodId; label: string; atE0: number; atEnergies: Float64Array; notes: string[] }[];
  components: PredictionComponent[];
  /** Flavour ratio at Earth and the fraction of the all-flavour intensity in each flavour. */
  flavourRatio: FlavourRatio;
  flavourFraction: FlavourSplit;
  /** Combined samples at E0 and at the energies (row-major samples x energies), for comparisons. */
  combinedAtE0: Float64Array;
  combinedAtEnergies: Float64Array;
  linearCheck: LinearCheck;
  samples: number;
  seed: number;
  templates: string[];
  assumptions: string[];
  notes: string[];
  warnings: string[];
}

/** Random streams of one run (see Random's stream argument). */
const STREAM = { gamma: 1, template: 2, method: 3 } as const;

/** Runs the prediction (see the module comment). Throws InputError for bad input, ComputeError for an untrustworthy result. */
export function predictNeutrinos(input: PredictInput): Prediction {
  const { samples: n, seed } = resolveMonteCarloOptions({ samples: input.samples, seed: input.seed });
  const e0 = input.e0GeV;
  if (!(e0 > 0 && Number.isFinite(e0))) throw new InputError(`reference energy E0 is ${e0} GeV, expected > 0`, { keyword: 'e0' });
  const sampler = gammaSampler(input.gamma);
  const ens = buildEnsemble(input.factors, input.factorsFile);
  const notes = [...sampler.notes], warnings: string[] = [];
  const [gLo, gHi] = sampler.rangeGeV;
  if (!(2 * e0 >= gLo * (1 - 1e-9) && 2 * e0 <= gHi * (1 + 1e-9))) {
    throw new ComputeError(`2 E0 = ${2 * e0} GeV lies outside the gamma-ray range ${gLo} to ${gHi} GeV; ` +
      'choose E0 between half the lowest and half the highest gamma-ray energy');
  }
  let wanted: number[];
  if (input.energiesNuGeV) wanted = Array.from(input.energiesNuGeV);
  else if (input.gamma.kind === 'points') wanted = Array.from(sampler.centralPoints().energyGeV, (e) => e / 2);
  else wanted = Array.from({ length: 8 }, (_, i) => 0.5 * gLo * Math.pow(gHi / gLo, i / 7));
  const kept = wanted.filter((e) => e > 0 && 2 * e >= gLo * (1 - 1e-9) && 2 * e <= gHi * (1 + 1e-9));
  if (kept.length < wanted.length) notes.push(`${wanted.length - kept.length} energies dropped: twice the energy lies outside the gamma-ray range`);
  const energies = Float64Array.from(kept);
  const allE = Float64Array.from([e0, ...kept]);
  const twice = allE.map((e) => 2 * e);
  const m = allE.length;

  // the ensemble at the gamma-ray energies 2E (an energy outside a table is an InputError)
  const at = ensembleAt(ens, twice);
  if (ens.energyResolved) notes.push('k_I and survival read per gamma-ray energy 2E from each template\'s tables (log-log between tabulated energies, no extrapolation)');

  // methods: ratio tables at all energies
  const channel = input.channel ?? 'pp';
  const wantedMethods = input.methods ?? defaultMethods(channel);
  if (wantedMethods.length === 0) throw new InputError('no conversion method chosen', { keyword: 'methods' }, 'use kab, kpi or both');
  for (const id of wantedMethods) checkMethodChannel(id, channel);
  const ratios: MethodRatios[] = [];
  for (const id of wantedMethods) {
    if (id === 'kpi') ratios.push(kpiRatios(allE, channel));
    else {
      const intrinsicCentral = intrinsicForFit(input.gamma.kind === 'points' ? input.gamma.points : sampler.centralPoints(), (e) => centralSurvivalAt(ens, e));
      try { ratios.push(kabRatios(allE, intrinsicCentral)); } catch (e) {
        if (!(e instanceof InputError || e instanceof ComputeError)) throw e;
        warnings.push(`KAB method dropped: ${e.message}; the method spread is not included`);
      }
    }
  }
  if (ratios.length === 0) throw new ComputeError('no conversion method could be applied');
  const M = ratios.length;

  // draws
  const gC = sampler.central(twice);
  const gD = sampler.sample(twice, n, new Random(seed, STREAM.gamma));
  const tRng = new Random(seed, STREAM.template), mRng = new Random(seed, STREAM.method);
  const tIdx = Int32Array.from({ length: n }, () => drawTemplate(ens, tRng));
  const mIdx = Int32Array.from({ length: n }, () => (M > 1 ? mRng.integer(M) : 0));

  const run = (vary: { gamma: boolean; template: boolean; absorption: boolean; method: boolean }): Float64Array => {
    const out = new Float64Array(n * m);
    for (let s = 0; s < n; s++) {
      const t = tIdx[s];
      const r = ratios[vary.method ? mIdx[s] : 0].ratio;
      for (let j = 0; j < m; j++) {
        const k = vary.template ? at.kI[t * m + j] : at.kICentral[j];
        const p = vary.absorption ? at.survival[t * m + j] : at.survivalCentral[j];
        out[s * m + j] = r[j] * (k / p) * (vary.gamma ? gD[s * m + j] : gC[j]);
      }
    }
    return out;
  };
  const summarise = (name: ComponentName, a: Float64Array) => {
    const col = new Float64Array(n);
    return Array.from({ length: m }, (_, j) => {
      for (let s = 0; s < n; s++) col[s] = a[s * m + j];
      // no draw is dropped: a non-finite value is a ComputeError (maxNonFiniteFraction 0)
      const sm = summariseSamples(col, { label: `predicted intensity at ${allE[j].toPrecision(4)} GeV (${name})`, maxNonFiniteFraction: 0 });
      warnings.push(...sm.warnings);
      return sm;
    });
  };
  const specs: { name: ComponentName; description: string; vary: Parameters<typeof run>[0]; on: boolean }[] = [
    { name: 'gamma', description: 'gamma-ray measurement errors', vary: { gamma: true, template: false, absorption: false, method: false }, on: true },
    { name: 'template', description: `template spread of k_I (${ens.names.length} templates)`, vary: { gamma: false, template: true, absorption: false, method: false }, on: true },
    { name: 'absorption', description: 'template spread of the survival probability', vary: { gamma: false, template: false, absorption: true, method: false }, on: ens.hasSurvival },
    { name: 'method', description: `conversion method (${ratios.map((r) => r.id).join(', ')}, equal weight)${ratios.some((r) => r.id === 'kab') ? `; ${METHOD_SPREAD_NOTE}` : ''}`, vary: { gamma: false, template: false, absorption: false, method: true }, on: M > 1 },
    { name: 'combined', description: 'all of the above together', vary: { gamma: true, template: true, absorption: true, method: true }, on: true },
  ];
  const components: PredictionComponent[] = [];
  let combined: Float64Array = new Float64Array(0);
  for (const c of specs) {
    if (!c.on) continue;
    const a = run(c.vary);
    const sums = summarise(c.name, a);
    components.push({ name: c.name, description: c.description, atE0: sums[0], atEnergies: sums.slice(1) });
    if (c.name === 'combined') combined = a;
  }
  const combinedAtE0 = new Float64Array(n), combinedAtEnergies = new Float64Array(n * (m - 1));
  for (let s = 0; s < n; s++) {
    combinedAtE0[s] = combined[s * m];
    for (let j = 1; j < m; j++) combinedAtEnergies[s * (m - 1) + j - 1] = combined[s * m + j];
  }

  // linear cross-check of the gamma component at E0
  const lin = sampler.linear(2 * e0);
  const scale = ratios[0].ratio[0] * at.kICentral[0] / at.survivalCentral[0];
  const lp = linearPropagate((x) => scale * lin.fn(x), lin.centre, lin.sigma, lin.covariance);
  const linearCheck = checkLinear(lp, components[0].atE0);

  const ratio = input.flavourRatio ?? FLAVOUR_RATIO_EARTH;
  const methods = ratios.map((r) => ({
    id: r.id, label: r.label, notes: r.notes,
    atE0: r.ratio[0] * at.kICentral[0] / at.survivalCentral[0] * gC[0],
    atEnergies: Float64Array.from({ length: m - 1 }, (_, j) => r.ratio[j + 1] * at.kICentral[j + 1] / at.survivalCentral[j + 1] * gC[j + 1]),
  }));
  for (const r of ratios) notes.push(...r.notes);
  const assumptions = [
    `the sky outside the measured region looks like each template (the template shape holds in the unseen sky)${input.region ? `; target region: ${input.region}` : ''}`,
    `all of the measured gamma-ray emission is hadronic (${channelWords(channel)}); no leptonic or unresolved-source part`,
    `neutrino flavour ratio at Earth ${ratio.join(':')} (e:mu:tau), neutrinos plus antineutrinos`,
    ens.hasSurvival ? 'gamma rays de-absorbed with each template\'s mean survival probability in the measured region at the gamma-ray energy: intrinsic = measured / survival'
      : 'no absorption correction (survival probability 1 for every template)',
    ens.energyResolved ? 'k_I and survival taken at each gamma-ray energy 2E (log-log interpolation between tabulated energies)'
      : 'the extrapolation factors k_I and the survival are the same at every energy used',
    `conversion methods: ${ratios.map((r) => r.label).join('; ')}; primary: ${ratios[0].id}`,
  ];
  return {
    e0GeV: e0, energiesNuGeV: energies, primaryMethod: ratios[0].id, methods, components,
    flavourRatio: ratio, flavourFraction: splitFlavours(1, ratio), combinedAtE0, combinedAtEnergies, linearCheck,
    samples: n, seed, templates: ens.names, assumptions, notes, warnings: [...new Set(warnings)],
  };
}

/** Points de-absorbed for the proton fit: every point (upper limits too) divided by the central survival at its own energy. */
function intrinsicForFit(p: SpectrumPoints, survivalAt: (energiesGeV: Float64Array) => Float64Array): SpectrumPoints {
  const s = survivalAt(p.energyGeV);
  return { ...p, value: p.value.map((v, i) => v / s[i]), errLow: p.errLow.map((v, i) => v / s[i]), errHigh: p.errHigh.map((v, i) => v / s[i]) };
}

/** The component of a prediction by name (undefined when it was not run). */
export function component(p: Prediction, name: ComponentName): PredictionComponent | undefined {
  return p.components.find((c) => c.name === name);
}
