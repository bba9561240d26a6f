/**
 * The quick conversion between hadronic gamma rays and neutrinos of Ahlers &
 * Halzen 2018, Prog. Part. Nucl. Phys. 102, 73 (their relation in the section on
 * multi-messenger relations; from memory):
 *
 *   (1/3) sum_flavours E_nu^2 Q_nu(E_nu) = (K_pi / 4) [E_gamma^2 Q_gamma(E_gamma)] at E_gamma = 2 E_nu,
 *
 * K_pi = 2 for pp, 1 for p-gamma. Derivation of the power-law factor: with
 * E = E_nu, the all-flavour sum is Q_all(E) = (3 K_pi / 4) (2E)^2 Q_gamma(2E) / E^2
 * = 3 K_pi Q_gamma(2E). For Q_gamma(E) = A E^-Gamma, Q_gamma(2E) = 2^-Gamma Q_gamma(E),
 * so Q_all(E) = 3 K_pi 2^-Gamma Q_gamma(E): for pp (K_pi = 2) the all-flavour
 * neutrino intensity at E is 6 * 2^-Gamma times the gamma-ray intensity at E.
 * The relation holds for intensities as for emissivities (same line of sight).
 * It neglects absorption of the gamma rays (de-absorb first) and assumes all
 * gamma rays are hadronic.
 */
import { InputError } from '../../core/errors.js';

/** K_pi for the two channels. */
export const KPI = { pp: 2, pgamma: 1 } as const;

/** Channel of pion production. */
export type PionChannel = keyof typeof KPI;

function kpiOf(channel: PionChannel): number {
  const k = KPI[channel];
  if (k === undefined) throw new InputError(`unknown channel "${String(channel)}"`, {}, 'use pp or pgamma');
  return k;
}

/**
 * The rule's one number: I_nu,all(E) / I_gamma(2E) = 3 K_pi (6 for pp, 3 for
 * p-gamma), the same for every spectrum. Every K_pi conversion in skyspan goes
 * through this function (convert.ts, compare/conversion.ts).
 */
export function kpiAllFlavourRatio(channel: PionChannel = 'pp'): number {
  return 3 * kpiOf(channel);
}

/**
 * All-flavour neutrino intensity at energyNuGeV from the gamma-ray intensity
 * function (GeV^-1 ... in, same unit out): 3 K_pi I_gamma(2 E_nu).
 */
export function kpiNeutrinoFromGamma(gamma: (energyGeV: number) => number, energyNuGeV: number, channel: PionChannel = 'pp'): number {
  return kpiAllFlavourRatio(channel) * gamma(2 * energyNuGeV);
}

/** The inverse: gamma-ray intensity at energyGammaGeV from the all-flavour neutrino intensity, I_all(E/2) / (3 K_pi). */
export function kpiGammaFromNeutrino(neutrinoAll: (energyGeV: number) => number, energyGammaGeV: number, channel: PionChannel = 'pp'): number {
  return neutrinoAll(energyGammaGeV / 2) / kpiAllFlavourRatio(channel);
}

/** Factor 3 K_pi 2^-Gamma between the all-flavour neutrino and gamma-ray intensities at the same energy, for a power law of index Gamma. */
export function kpiPowerLawFactor(gammaIndex: number, channel: PionChannel = 'pp'): number {
  return kpiAllFlavourRatio(channel) * Math.pow(2, -gammaIndex);
}
