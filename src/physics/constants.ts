/**
 * Physical constants in skyspan's internal units (GeV, cm, s, K). Values are
 * CODATA 2018 (Tiesinga et al. 2021, Rev. Mod. Phys. 93, 025010), written down
 * from memory and cross-checked against scipy.constants by
 * scripts/attenuation_reference.py, which uses its own copies.
 */

/** Electron rest energy m_e c^2 in GeV. */
export const ELECTRON_MASS_GEV = 0.51099895000e-3;
/** Thomson cross-section in cm^2. */
export const SIGMA_THOMSON_CM2 = 6.6524587321e-25;
/** Boltzmann constant in GeV per kelvin. */
export const BOLTZMANN_GEV_PER_K = 8.617333262e-14;
/** hbar c in GeV cm. */
export const HBAR_C_GEV_CM = 1.973269804e-14;
/** One kiloparsec in cm (IAU 2015 parsec, 648000/pi au). */
export const KPC_CM = 3.085677581491367e21;
/** Speed of light in cm/s. */
export const SPEED_OF_LIGHT_CM_S = 2.99792458e10;
/** One erg in GeV (1 eV = 1.602176634e-19 J exactly). */
export const ERG_GEV = 1 / 1.602176634e-3;
/** One millibarn in cm^2. */
export const MILLIBARN_CM2 = 1e-27;
/** CMB temperature in K (Fixsen 2009, ApJ 707, 916). */
export const CMB_TEMPERATURE_K = 2.7255;
/** Charged and neutral pion and muon masses in GeV (Particle Data Group; from memory). */
export const PION_CHARGED_MASS_GEV = 0.13957039;
/** Muon mass in GeV (Particle Data Group; from memory). */
export const MUON_MASS_GEV = 0.1056583755;
