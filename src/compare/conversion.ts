/**
 * The two ways from hadronic gamma rays to neutrinos, as the comparison uses
 * them: each method gives, at each neutrino energy E, the ratio
 *
 *   r(E) = I_nu,all(E) / I_gamma,intrinsic(2E)
 *
 * (all-flavour neutrinos at Earth over intrinsic gamma rays at twice the
 * energy), which the Monte Carlo multiplies with each drawn gamma-ray
 * intensity at 2E. 2E is where both methods put most of the weight (a pion's
 * photon carries about twice a daughter neutrino's energy).
 * - K_pi rule (Ahlers & Halzen 2018, Prog. Part. Nucl. Phys. 102, 73; the
 *   relation in physics/hadronic/kpiRule.ts, the one implementation):
 *   r = 3 K_pi, the same for every spectrum; for a power law I_gamma ~ E^-Gamma
 *   it gives I_nu,all(E) = 6 2^-Gamma I_gamma(E) for pp. pp and p-gamma.
 * - KAB fit (Kelner, Aharonian & Bugayov 2006, Phys. Rev. D 74, 034018; the
 *   proton fit of physics/hadronic/protonFit.ts): a proton spectrum is fitted to
 *   the central intrinsic gamma-ray points; r = q_nu,all(E) / q_gamma(2E) from
 *   the fitted protons. r depends only on the spectral shape; it is computed
 *   once from the central values and held fixed over the Monte Carlo (the
 *   shape's own uncertainty changes r only at second order — skyspan's
 *   approximation, stated in the output). Upper limits enter the fit as
 *   one-sided constraints at their confidence level (physics/logResiduals.ts).
 *   pp only (physics/hadronic/channels.ts).
 * The two differ as models: KAB's neutrino-to-gamma ratio is 16 to 22 % below
 * other published parametrisations of the pp yields over 1 TeV to 1 PeV, and
 * the K_pi rule sits close to those ({@link METHOD_SPREAD_NOTE}).
 */
import { type MethodId } from '../physics/hadronic/channels.js';
import { fitProtonSpectrum, predictFromProtons } from '../physics/hadronic/protonFit.js';
import { KPI, kpiAllFlavourRatio, type PionChannel } from '../physics/hadronic/kpiRule.js';
import { DEFAULT_UL_CONFIDENCE } from '../physics/logResiduals.js';
import type { SpectrumPoints } from '../physics/points.js';
import { normalQuantile } from './normal.js';

export type { MethodId };

/** The method spread is a model difference, said wherever the method component appears. */
export const METHOD_SPREAD_NOTE = 'KAB 2006\'s nu/gamma ratio is 16-22 % below other published pp parametrisations over 1 TeV-1 PeV (a difference between the models, not a coding error); the K_pi rule sits close to those';

/** Ratios of one method at the neutrino energies, with what it assumed. */
export interface MethodRatios {
  id: MethodId;
  label: string;
  ratio: Float64Array;
  notes: string[];
}

/** K_pi rule: r = 3 K_pi at every energy (pp: 6). */
export function kpiRatios(energiesNuGeV: ArrayLike<number>, channel: PionChannel = 'pp'): MethodRatios {
  return {
    id: 'kpi', label: `K_pi rule (Ahlers & Halzen 2018), K_pi = ${KPI[channel]}`,
    ratio: new Float64Array(energiesNuGeV.length).fill(kpiAllFlavourRatio(channel)),
    notes: [`K_pi rule: I_nu,all(E) = 3 K_pi I_gamma(2E), K_pi = ${KPI[channel]} (${channel})`],
  };
}

/**
 * KAB 2006 ratios from a proton fit to `intrinsicGamma` (central values; only
 * the shape matters), or, with fitTarget 'neutrinoAllFlavour', to all-flavour
 * neutrino points (the reverse direction). Throws what the fit throws (e.g.
 * points below 100 GeV).
 */
export function kabRatios(energiesNuGeV: ArrayLike<number>, intrinsicGamma: SpectrumPoints,
  options: { cutoff?: boolean; fitTarget?: 'gamma' | 'neutrinoAllFlavour' } = {}): MethodRatios {
  const cl = intrinsicGamma.ulConfidence ?? DEFAULT_UL_CONFIDENCE;
  const fit = fitProtonSpectrum(intrinsicGamma, { target: options.fitTarget ?? 'gamma', cutoff: options.cutoff, upperLimits: 'oneSided',
    upperLimitZ: normalQuantile(cl) });
  const nUl = intrinsicGamma.upperLimit.reduce((a, b) => a + b, 0);
  const m = energiesNuGeV.length;
  const twice = Float64Array.from({ length: m }, (_, j) => 2 * energiesNuGeV[j]);
  const nu = predictFromProtons(fit, 'neutrinoAllFlavour', energiesNuGeV);
  const g = predictFromProtons(fit, 'gamma', twice);
  const ratio = Float64Array.from({ length: m }, (_, j) => nu[j] / g[j]);
  const p = fit.protons;
  const shape = p.kind === 'cutoffPowerLaw' ? `index ${p.index.toFixed(3)}, cutoff ${p.cutoffGeV.toPrecision(3)} GeV` : `index ${(p as { index: number }).index.toFixed(3)}`;
  return {
    id: 'kab', label: 'KAB 2006 proton fit (Kelner, Aharonian & Bugayov 2006)', ratio,
    notes: [`KAB fit: proton spectrum ${p.kind} (${shape}), chi2 ${fit.chi2.toPrecision(3)} for ${fit.dof} dof${fit.converged ? '' : ', NOT converged'}`,
      'KAB ratio I_nu,all(E) / I_gamma(2E) from the fit to the central spectrum, held fixed over the Monte Carlo',
      ...(nUl > 0 ? [`KAB fit: ${nUl} upper limit(s) as one-sided constraints at ${(100 * cl).toPrecision(3)} % confidence${intrinsicGamma.ulConfidence === undefined ? ' (default; the points do not state it)' : ''}: Gaussian at zero flux with the limit as its quantile`] : []),
      ...fit.assumptions],
  };
}
