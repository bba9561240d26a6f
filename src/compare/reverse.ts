/**
 * The reverse direction, for planning a survey: from a neutrino measurement in
 * the neutrino analysis's region, the gamma-ray intensity a survey footprint
 * should see if the neutrinos come from hadronic gamma-ray sources that follow
 * a template. Per Monte Carlo sample:
 *
 *   I_gamma,footprint(E) = (P_t / k_I,t) * I_nu,all(E/2) / r_m(E/2)
 *
 * with k_I,t the factor from the footprint to the neutrino region (computed
 * with the footprint as the measured region), P_t the template's mean survival
 * in the footprint (re-absorption), both read at the gamma-ray energy E
 * (ensemble.ts: log-log between tabulated energies, never beyond them), r_m the method's ratio
 * I_nu,all(E) / I_gamma,intrinsic(2E) (conversion.ts; the KAB ratio from a
 * proton fit to the neutrino spectrum's central values), I_nu,all drawn from
 * the measurement: a normalisation's norm as a split normal, a band's index
 * uniform in its range, points as split normals read by log-log interpolation.
 * A one-flavour measurement becomes all-flavour by dividing by that flavour's
 * fraction (1/3 at 1:1:1). Components as in predict.ts.
 */
import { ComputeError, InputError } from '../core/errors.js';
import { FLAVOUR_RATIO_EARTH, splitFlavours, type FlavourRatio } from '../physics/hadronic/flavour.js';
import { channelWords, checkMethodChannel, defaultMethods } from '../physics/hadronic/channels.js';
import type { PionChannel } from '../physics/hadronic/kpiRule.js';
import type { SpectrumPoints } from '../physics/points.js';
import { METHOD_SPREAD_NOTE, kabRatios, kpiRatios, type MethodId, type MethodRatios } from './conversion.js';
import { buildEnsemble, drawTemplate, ensembleAt, type TemplateFactor } from './ensemble.js';
import { gammaSampler } from './gammaSampler.js';
import type { NeutrinoMeasurement } from './measurement.js';
import { resolveMonteCarloOptions } from './propagate.js';
import { Random } from './random.js';
import { summariseSamples, type SampleSummary } from './summary.js';

/** Input of {@link expectedGamma}. */
export interface ReverseInput {
  measurement: NeutrinoMeasurement;
  /** k_I from the survey footprint to the neutrino region, per template; survivalMean in the footprint. */
  factors: readonly TemplateFactor[];
  /** Gamma-ray energies (GeV); default 8 values over twice the neutrino energy range. */
  energiesGammaGeV?: ArrayLike<number>;
  methods?: MethodId[];
  channel?: PionChannel;
  flavourRatio?: FlavourRatio;
  samples?: number;
  seed?: number;
}

/** Output of {@link expectedGamma}: per component, summaries per gamma-ray energy (GeV^-1 cm^-2 s^-1 sr^-1). */
export interface ReverseResult {
  energiesGammaGeV: Float64Array;
  components: { name: string; description: string; atEnergies: SampleSummary[] }[];
  methods: { id: MethodId; label: string; atEnergies: Float64Array }[];
  samples: number;
  seed: number;
  assumptions: string[];
  notes: string[];
  warnings: string[];
}

/** Draws of the all-flavour neutrino intensity at energies (row-major samples x energies) and its central values. */
function neutrinoDraws(m: NeutrinoMeasurement, energies: Float64Array, n: number, rng: Random, toAll: number):
  { central: Float64Array; draws: Float64Array; points: SpectrumPoints; rangeGeV: [number, number] } {
  const k = energies.length;
  if (m.kind === 'points') {
    const pts: SpectrumPoints = { energyGeV: Float64Array.from(m.points, (p) => p.energyGeV), value: Float64Array.from(m.points, (p) => toAll * p.value),
      errLow: Float64Array.from(m.points, (p) => toAll * p.errLow), errHigh: Float64Array.from(m.points, (p) => toAll * p.errHigh),
      upperLimit: Uint8Array.from(m.points, (p) => (p.upperLimit ? 1 : 0)), source: m.file };
    const s = gammaSampler({ kind: 'points', points: pts });
    return { central: s.central(energies), draws: s.sample(energies, n, rng), points: s.centralPoints(), rangeGeV: s.rangeGeV };
  }
  const range: [number, number] = m.energyRangeGeV ?? [m.e0GeV / 10, m.e0GeV * 10];
  const mid = m.kind === 'normalisation' ? m.index : 0.5 * (m.indexRange[0] + m.indexRange[1]);
  const pl = (norm: number, g: number, e: number) => (e >= range[0] * (1 - 1e-9) && e <= range[1] * (1 + 1e-9) ? toAll * norm * Math.pow(e / m.e0GeV, -g) : NaN);
  const central = Float64Array.from(energies, (e) => pl(m.norm.value, mid, e));
  const draws = new Float64Array(n * k);
  for (let s = 0; s < n; s++) {
    const norm = rng.splitNormal(m.norm.value, m.norm.errLow, m.norm.errHigh);
    const g = m.kind === 'band' ? m.indexRange[0] + (m.indexRange[1] - m.indexRange[0]) * rng.uniform() : m.index;
    for (let j = 0; j < k; j++) draws[s * k + j] = norm > 0 ? pl(norm, g, energies[j]) : NaN;
  }
  const pe = Float64Array.from({ length: 8 }, (_, i) => range[0] * Math.pow(range[1] / range[0], i / 7));
  const pv = Float64Array.from(pe, (e) => pl(m.norm.value, mid, e));
  return { central, draws, rangeGeV: range,
    points: { energyGeV: pe, value: pv, errLow: pv.map((v) => 0.1 * v), errHigh: pv.map((v) => 0.1 * v), upperLimit: new Uint8Array(8) } };
}

/** Runs the reverse prediction (see the module comment). */
export function expectedGamma(input: ReverseInput): ReverseResult {
  const { samples: n, seed } = resolveMonteCarloOptions({ samples: input.samples, seed: input.seed });
  const m = input.measurement;
  const ens = buildEnsemble(input.factors);
  const ratio = input.flavourRatio ?? FLAVOUR_RATIO_EARTH;
  const frac = m.flavour === 'all' ? 1 : splitFlavours(1, ratio)[m.flavour];
  if (!(frac > 0)) throw new InputError(`the flavour ratio ${ratio.join(':')} gives no ${m.flavour} neutrinos`, { keyPath: 'flavour' });
  const toAll = 1 / frac;
  const nuRange = m.kind === 'points' ? [Math.min(...m.points.map((p) => p.energyGeV)), Math.max(...m.points.map((p) => p.energyGeV))]
    : (m.energyRangeGeV ?? [m.e0GeV / 10, m.e0GeV * 10]);
  const eg = input.energiesGammaGeV ? Float64Array.from(input.energiesGammaGeV)
    : Float64Array.from({ length: 8 }, (_, i) => 2 * nuRange[0] * Math.pow(nuRange[1] / nuRange[0], i / 7));
  const half = eg.map((e) => e / 2);
  const k = eg.length;
  const nu = neutrinoDraws(m, half, n, new Random(seed, 1), toAll);
  if (!nu.central.some(Number.isFinite)) throw new ComputeError('no gamma-ray energy has half its value inside the neutrino measurement\'s energy range');
  const notes: string[] = [], warnings: string[] = [];
  if (!m.energyRangeGeV && m.kind !== 'points') notes.push('no energyRange in the measurement: its power law is used from E0/10 to 10 E0');
  if (m.kind !== 'points' && m.likelihood?.kind === 'upperLimit') notes.push('the measurement is an upper limit: the forecast is the gamma-ray counterpart of the limit itself (an upper forecast, without spread from the measurement)');
  const at = ensembleAt(ens, eg);
  const channel = input.channel ?? 'pp';
  const wantedMethods = input.methods ?? defaultMethods(channel);
  for (const id of wantedMethods) checkMethodChannel(id, channel);
  const ratios: MethodRatios[] = [];
  for (const id of wantedMethods) {
    if (id === 'kpi') ratios.push(kpiRatios(half, channel));
    else {
      try { ratios.push(kabRatios(half, nu.points, { fitTarget: 'neutrinoAllFlavour' })); } catch (e) {
        if (!(e instanceof InputError || e instanceof ComputeError)) throw e;
        warnings.push(`KAB method dropped: ${e.message}`);
      }
    }
  }
  if (ratios.length === 0) throw new ComputeError('no conversion method could be applied');
  const M = ratios.length;
  const tRng = new Random(seed, 2), mRng = new Random(seed, 3);
  const tIdx = Int32Array.from({ length: n }, () => drawTemplate(ens, tRng));
  const mIdx = Int32Array.from({ length: n }, () => (M > 1 ? mRng.integer(M) : 0));
  const specs = [
    { name: 'neutrino', description: 'neutrino measurement errors', v: [1, 0, 0, 0], on: true },
    { name: 'template', description: `template spread of k_I (${ens.names.length} templates)`, v: [0, 1, 0, 0], on: true },
    { name: 'absorption', description: 'template spread of the survival probability', v: [0, 0, 1, 0], on: ens.hasSurvival },
    { name: 'method', description: `conversion method (equal weight)${ratios.some((r) => r.id === 'kab') ? `; ${METHOD_SPREAD_NOTE}` : ''}`, v: [0, 0, 0, 1], on: M > 1 },
    { name: 'combined', description: 'all of the above together', v: [1, 1, 1, 1], on: true },
  ];
  const components: ReverseResult['components'] = [];
  const col = new Float64Array(n);
  for (const c of specs) {
    if (!c.on) continue;
    const atEnergies: SampleSummary[] = [];
    for (let j = 0; j < k; j++) {
      if (!Number.isFinite(nu.central[j])) continue;
      for (let s = 0; s < n; s++) {
        const t = tIdx[s];
        const kI = c.v[1] ? at.kI[t * k + j] : at.kICentral[j], p = c.v[2] ? at.survival[t * k + j] : at.survivalCentral[j];
        const r = ratios[c.v[3] ? mIdx[s] : 0].ratio[j];
        col[s] = (p / kI) * (c.v[0] ? nu.draws[s * k + j] : nu.central[j]) / r;
      }
      const sm = summariseSamples(col, { label: `expected gamma-ray intensity at ${eg[j].toPrecision(4)} GeV (${c.name})` });
      warnings.push(...sm.warnings);
      atEnergies.push(sm);
    }
    components.push({ name: c.name, description: c.description, atEnergies });
  }
  const kept = Array.from({ length: k }, (_, j) => j).filter((j) => Number.isFinite(nu.central[j]));
  if (kept.length < k) notes.push(`${k - kept.length} gamma-ray energies dropped: half the energy lies outside the neutrino measurement's range`);
  return {
    energiesGammaGeV: Float64Array.from(kept, (j) => eg[j]), components, samples: n, seed, notes: [...notes, ...ratios.flatMap((r) => r.notes)], warnings: [...new Set(warnings)],
    methods: ratios.map((r) => ({ id: r.id, label: r.label, atEnergies: Float64Array.from(kept, (j) => (at.survivalCentral[j] / at.kICentral[j]) * nu.central[j] / r.ratio[j]) })),
    assumptions: [
      'the neutrino-region sky and the survey footprint both follow each template (the template shape holds in the unseen sky)',
      `all of the neutrino emission comes from hadronic (${channelWords(channel)}) gamma-ray sources; the expected gamma rays are the hadronic counterpart only`,
      `neutrino flavour ratio at Earth ${ratio.join(':')}${m.flavour === 'all' ? '' : `; the ${m.flavour}-flavour measurement scaled by ${toAll.toPrecision(4)} to all flavours`}`,
      ens.hasSurvival ? 'gamma rays re-absorbed with each template\'s mean survival probability in the footprint at each gamma-ray energy' : 'no absorption (survival 1)',
      `conversion methods: ${ratios.map((r) => r.label).join('; ')}`,
    ],
  };
}
