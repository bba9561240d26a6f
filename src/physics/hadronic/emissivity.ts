/**
 * Emissivities of gamma rays and neutrinos from a proton spectrum through the
 * KAB 2006 functions (Kelner, Aharonian & Bugayov 2006, Phys. Rev. D 74, 034018,
 * eq. 71 in form, from memory):
 *
 *   q(E) = c * integral over E_p of sigma_inel(E_p) J_p(E_p) F(E/E_p, E_p) dE_p / E_p,
 *
 * per unit target density (multiply by n_H). With J_p in GeV^-1 cm^-3 the result
 * is in GeV^-1 cm^-3 s^-1 per (cm^-3 of target); any linear normalisation of J_p
 * carries through. The integral runs over ln x from ln 1e-3 (the functions'
 * lower validity limit) to 0, i.e. E_p from E to 1000 E, by composite Gauss-
 * Legendre in ln x (24 segments x 8 nodes, split at x = 0.427 for the pion-decay
 * muon neutrinos). Accuracy: agrees with scipy's adaptive quad on the same
 * integrand to better than 1e-6 relative (test/physics/hadronic/emissivity.test.ts).
 * Valid for secondary energies E >= 100 GeV (so that E_p >= 0.1 TeV throughout);
 * above E_p = 1e5 TeV the parametrisation is extrapolated.
 *
 * Particles and antiparticles: the KAB functions are taken to count nu + anti-nu
 * together (as F_gamma counts both photons of a pi0). Whether a factor 2 is
 * needed has been asked in public code discussions; the kinematic check in
 * test/physics/hadronic/kab2006.test.ts decides it: with the factor, the
 * pion-decay nu_mu would carry 0.59 of the gamma-ray energy, above the 0.427
 * that two-body pion decay and isospin allow.
 */
import { InputError } from '../../core/errors.js';
import { SPEED_OF_LIGHT_CM_S } from '../constants.js';
import { integrateGL } from '../quadrature.js';
import { evaluateSpectrum, type SpectralModel } from '../spectrum.js';
import { FLAVOUR_RATIO_EARTH, splitFlavours, type FlavourRatio, type FlavourSplit } from './flavour.js';
import { NU_MU_PION_XMAX, kabElectronType, kabGamma, kabMuonNeutrinoFromPion, ppInelasticCrossSectionCm2 } from './kab2006.js';

/** Secondary species computed from the KAB functions. */
export type Secondary = 'gamma' | 'nuMuFromPion' | 'electronType' | 'neutrinoAllFlavour';

/** A proton spectrum: a spectral model or a function of E_p in GeV. */
export type ProtonSpectrum = SpectralModel | ((protonEnergyGeV: number) => number);

/** Lowest secondary energy for which the integral stays inside E_p >= 0.1 TeV. */
export const KAB_MIN_ENERGY_GEV = 100;
const X_MIN = 1e-3;

function protonFn(p: ProtonSpectrum): (e: number) => number {
  return typeof p === 'function' ? p : (e: number) => evaluateSpectrum(p, e);
}

function integrateF(F: (x: number, ep: number) => number, energyGeV: number, J: (e: number) => number,
  lnXLow: number, lnXHigh: number, segments: number): number {
  return integrateGL((lnx) => {
    const x = Math.exp(lnx), ep = energyGeV / x;
    return ppInelasticCrossSectionCm2(ep) * J(ep) * F(x, ep);
  }, lnXLow, lnXHigh, segments, 8);
}

/**
 * Emissivity of one secondary at energyGeV from the proton spectrum, per unit target
 * density (see the module comment). 'neutrinoAllFlavour' is nu_mu(pion) + 2 x electron-type
 * (the muon-decay nu_mu and the nu_e, each approximated by the electron function, KAB sect. IV),
 * neutrinos plus antineutrinos at the source.
 */
export function ppEmissivity(secondary: Secondary, energyGeV: number, protons: ProtonSpectrum): number {
  if (!(energyGeV >= KAB_MIN_ENERGY_GEV)) {
    throw new InputError(`energy ${energyGeV} GeV is below ${KAB_MIN_ENERGY_GEV} GeV, where the KAB 2006 functions stop being valid`,
      {}, 'use energies of 100 GeV and above, or the quick K_pi rule');
  }
  const J = protonFn(protons);
  const lo = Math.log(X_MIN), kink = Math.log(NU_MU_PION_XMAX);
  let s: number;
  switch (secondary) {
    case 'gamma': s = integrateF(kabGamma, energyGeV, J, lo, 0, 24); break;
    case 'electronType': s = integrateF(kabElectronType, energyGeV, J, lo, 0, 24); break;
    case 'nuMuFromPion': s = integrateF(kabMuonNeutrinoFromPion, energyGeV, J, lo, kink, 24); break;
    case 'neutrinoAllFlavour':
      s = integrateF(kabMuonNeutrinoFromPion, energyGeV, J, lo, kink, 24) + 2 * integrateF(kabElectronType, energyGeV, J, lo, 0, 24);
      break;
  }
  return SPEED_OF_LIGHT_CM_S * s;
}

/** Per-flavour neutrino emissivities at the source (e : mu : tau from KAB) and at Earth (by the ratio). */
export function ppNeutrinoFlavours(energyGeV: number, protons: ProtonSpectrum, ratioAtEarth: FlavourRatio = FLAVOUR_RATIO_EARTH):
  { allFlavour: number; source: FlavourSplit; earth: FlavourSplit } {
  const pion = ppEmissivity('nuMuFromPion', energyGeV, protons);
  const el = ppEmissivity('electronType', energyGeV, protons);
  const all = pion + 2 * el;
  return { allFlavour: all, source: { e: el, mu: pion + el, tau: 0 }, earth: splitFlavours(all, ratioAtEarth) };
}
