/**
 * The unresolved-source correction of a comparison. A ground array masks the
 * sources it resolves, so its "diffuse" intensity in region A still holds the
 * unresolved ones, U_A; a neutrino analysis resolves nothing, so region B
 * holds all sources, T_B. A gamma-ray intensity carried from A to B by the
 * extrapolation factor k (I_B = k I_A) therefore misses
 *   Delta = T_B - k U_A
 * (the unresolved sources of A are carried along with the template's shape,
 * which is replaced by the population's own sky distribution). The corrected
 * input is k I_A + Delta. Delta is taken realisation by realisation (U_A and
 * T_B of one realisation belong together); its spread is the spread of the
 * realisations, of the calibrated count and of the population variants pooled
 * in the samples. (Additive correction, common practice, no source.)
 */
import { InputError } from '../core/errors.js';
import { summariseSamples, type SampleSummary } from '../compare/summary.js';

/** Samples of the two intensities (GeV^-1 cm^-2 s^-1 sr^-1), samples x energies, row-major. */
export interface UnresolvedTerm {
  energiesGeV: Float64Array;
  samples: number;
  /** U_A: unresolved sources in the measured region. */
  measured: Float64Array;
  /** T_B: all sources in the neutrino region. */
  neutrino: Float64Array;
}

/** The factor-scaled gamma-ray input of a prediction. */
export interface ScaledGammaInput {
  energiesGeV: ArrayLike<number>;
  /** k I_A at each energy (GeV^-1 cm^-2 s^-1 sr^-1). */
  intensity: ArrayLike<number>;
  /** The extrapolation factor k from the measured to the neutrino region. */
  factor: number;
  /** One-sigma of the scaled intensity, if known (combined in quadrature with the term's). */
  sigma?: ArrayLike<number>;
}

/** Result of {@link correctScaledInput}. */
export interface CorrectedGammaInput {
  energiesGeV: Float64Array;
  /** k I_A + mean(Delta). */
  intensity: Float64Array;
  /** Summary of Delta per energy (realisation, count and variant spread). */
  term: SampleSummary[];
  /** Standard deviation of Delta, and combined with the input's sigma when given. */
  sigmaTerm: Float64Array;
  sigmaTotal: Float64Array | null;
  /** Delta samples, samples x energies, for a Monte Carlo that wants them. */
  termSamples: Float64Array;
  assumptions: string[];
}

/** Applies the correction (see the module comment). Energies must match the term's to 1e-6 relative. */
export function correctScaledInput(input: ScaledGammaInput, term: UnresolvedTerm): CorrectedGammaInput {
  const nE = term.energiesGeV.length, S = term.samples;
  if (input.energiesGeV.length !== nE || input.intensity.length !== nE) {
    throw new InputError(`has ${input.energiesGeV.length} energies and ${input.intensity.length} intensities, the population has ${nE} working energies`,
      { keyPath: 'energiesGeV' }, 'give the population the energies of the prediction');
  }
  for (let e = 0; e < nE; e++) {
    if (!(Math.abs(input.energiesGeV[e] / term.energiesGeV[e] - 1) <= 1e-6)) {
      throw new InputError(`energy ${input.energiesGeV[e]} GeV differs from the population's ${term.energiesGeV[e]} GeV`, { keyPath: `energiesGeV[${e}]` });
    }
  }
  if (!(input.factor >= 0 && Number.isFinite(input.factor))) throw new InputError(`factor is ${input.factor}, expected >= 0`, { keyPath: 'factor' });
  const delta = new Float64Array(S * nE);
  for (let i = 0; i < S * nE; i++) delta[i] = term.neutrino[i] - input.factor * term.measured[i];
  const summaries: SampleSummary[] = [], intensity = new Float64Array(nE), sig = new Float64Array(nE);
  const col = new Float64Array(S);
  for (let e = 0; e < nE; e++) {
    for (let s = 0; s < S; s++) col[s] = delta[s * nE + e];
    const sm = summariseSamples(col, { label: `unresolved-source term at ${term.energiesGeV[e]} GeV` });
    summaries.push(sm);
    intensity[e] = input.intensity[e] + sm.mean;
    sig[e] = sm.std;
  }
  const total = input.sigma ? Float64Array.from(sig, (s, e) => Math.hypot(s, input.sigma![e])) : null;
  return {
    energiesGeV: Float64Array.from(term.energiesGeV), intensity, term: summaries, sigmaTerm: sig, sigmaTotal: total, termSamples: delta,
    assumptions: [
      'the sources below the survey threshold in the measured region are part of its diffuse intensity and follow the population model, not the template',
      'the neutrino region resolves no source: all sources of the population add to its intensity',
      'source spectra are hadronic so that their gamma rays convert to neutrinos like the diffuse emission',
    ],
  };
}
