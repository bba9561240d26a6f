/**
 * The physics layer's public API: units, spectral models, points and fits,
 * hadronic gamma-ray/neutrino conversion, and pair absorption.
 */
export * from './constants.js';
export { energyToGeV, energyFromGeV, energyUnitFactor, intensityToInternal, intensityFromInternal, intensityUnit } from './units.js';
export type { IntensityForm } from './units.js';
export * from './spectrum.js';
export * from './points.js';
export { fitSpectrum, modelFromInternal } from './fit.js';
export type { SpectrumFit } from './fit.js';
export type { UpperLimitMode } from './logResiduals.js';
export * from './hadronic/kab2006.js';
export * from './hadronic/emissivity.js';
export * from './hadronic/flavour.js';
export * from './hadronic/kpiRule.js';
export * from './hadronic/protonFit.js';
export * from './hadronic/convert.js';
export { breitWheelerRatio, breitWheelerPhi } from './absorption/breitWheeler.js';
export * from './absorption/radiationField.js';
export * from './absorption/attenuationLength.js';
export * from './absorption/deabsorb.js';
export { parseFluxPointsEcsv, readFluxPointsEcsv, formatFluxPointsEcsv } from './fluxPoints/ecsv.js';
export { readFluxPointsFits, formatFluxPointsFits } from './fluxPoints/fits.js';
export { readGammaPoints, pointsFileKind } from './fluxPoints/read.js';
export type { SedType, FluxTableOptions } from './fluxPoints/table.js';
