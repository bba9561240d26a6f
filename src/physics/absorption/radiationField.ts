/**
 * Isotropic target photon fields for pair absorption: diluted blackbodies,
 * n(eps) = W (1/pi^2) (eps^2 / (hbar c)^3) / (exp(eps/kT) - 1) (Planck's law;
 * common practice). W = 1 is a true blackbody (the CMB, T = 2.7255 K, Fixsen
 * 2009, ApJ 707, 916).
 *
 * {@link ISRF_LOCAL} is a rough local interstellar radiation field of two
 * components, from memory: dust re-emission at about 35 K with energy density
 * about 0.3 eV cm^-3, and starlight at about 4000 K with about 0.5 eV cm^-3,
 * the order of the solar-neighbourhood values of ISRF models such as Porter,
 * Moskalenko & Strong 2006 (ApJ 648, L29) and Vernetto & Lipari 2016 (Phys. Rev.
 * D 94, 063009). Not a fit to either; the field is not uniform over the Galaxy
 * (several times denser near the centre), so it is not in the default set.
 */
import { InputError } from '../../core/errors.js';
import { BOLTZMANN_GEV_PER_K, CMB_TEMPERATURE_K, HBAR_C_GEV_CM } from '../constants.js';

/** A diluted blackbody: temperature in K and dilution factor W (energy density W a T^4). */
export interface RadiationField {
  name: string;
  temperatureK: number;
  dilution: number;
}

/** The CMB as a blackbody at 2.7255 K. */
export const CMB: RadiationField = { name: 'CMB', temperatureK: CMB_TEMPERATURE_K, dilution: 1 };

/** Radiation constant a = pi^2 k^4 / (15 (hbar c)^3) in GeV cm^-3 K^-4. */
export const RADIATION_CONSTANT_GEV_CM3_K4 = (Math.PI ** 2 * BOLTZMANN_GEV_PER_K ** 4) / (15 * HBAR_C_GEV_CM ** 3);

/** Energy density of a field in eV cm^-3. */
export function energyDensityEvCm3(f: RadiationField): number {
  return f.dilution * RADIATION_CONSTANT_GEV_CM3_K4 * f.temperatureK ** 4 * 1e9;
}

/** Builds a diluted blackbody from its temperature and energy density (eV cm^-3). */
export function dilutedBlackbody(name: string, temperatureK: number, energyDensityEv: number): RadiationField {
  const f: RadiationField = { name, temperatureK, dilution: 1 };
  return validateRadiationField({ ...f, dilution: energyDensityEv / energyDensityEvCm3(f) });
}

/** Checks a user field; throws InputError naming the key path. */
export function validateRadiationField(f: RadiationField, keyPath = 'fields'): RadiationField {
  if (!(f.temperatureK > 0 && Number.isFinite(f.temperatureK))) {
    throw new InputError(`temperature ${f.temperatureK} K must be > 0`, { keyPath: `${keyPath}.temperatureK` });
  }
  if (!(f.dilution >= 0 && Number.isFinite(f.dilution))) {
    throw new InputError(`dilution ${f.dilution} must be >= 0`, { keyPath: `${keyPath}.dilution` });
  }
  return f;
}

/** Local ISRF components (from memory; see the module comment). */
export const ISRF_LOCAL: readonly RadiationField[] = [
  dilutedBlackbody('dust (from memory)', 35, 0.3),
  dilutedBlackbody('starlight (from memory)', 4000, 0.5),
];
