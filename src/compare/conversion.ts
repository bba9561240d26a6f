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
 *   relation in physics/hadronic/kpiRule.ts): r = 3 K_pi, the same for every
 *   spectrum; for a power law I_gamma ~ E^-Gamma it gives I_nu,all(E) =
 *   6 2^-Gamma I_gamma(E) for pp.
 * - KAB fit (Kelner, Aharonian & Bugayov 2006, Phys. Rev. D 74, 034018; the
 *   proton fit of physics/hadronic/protonFit.ts): a proton spectrum is fitted to
 *   the central intrinsic gamma-ray points; r = q_nu,all(E) / q_gamma(2E) from
 *   the fitted protons. r depends only on the spectral shape; it is computed
 *   once from the central values and held fixed over the Monte Carlo (the
 *   shape's own uncertainty changes r only at second order — skyspan's
 *   approximation, stated in the output).
 */
import { fitProtonSpectrum, predictFromProtons } from '../physics/hadronic/protonFit.js';
import { KPI, type PionChannel } from '../physics/hadronic/kpiRule.js';
import type { SpectrumPoints } from '../physics/points.js';

/** Identifier of a conversion method. */
export type MethodId = 'kpi' | 'kab';

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
    ratio: new Float64Array(energiesNuGeV.length).fill(3 * KPI[channel]),
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
  const fit = fitProtonSpectrum(intrinsicGamma, { target: options.fitTarget ?? 'gamma', cutoff: options.cutoff, upperLimits: 'ignore' });
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
      ...fit.assumptions],
  };
}
