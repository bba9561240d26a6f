/**
 * Source populations: Monte Carlo realisations, which sources a survey
 * resolves, calibration to a catalogue count, source counts, unresolved-source
 * intensities and the correction of a comparison.
 */
export type { PopulationModel, SpatialModel, LuminosityFunction, SourceSpectrumModel, SourceSizeModel } from './model.js';
export { withCount } from './model.js';
export { meanLuminosity, drawLuminosities, checkLuminosity, scaleLuminosity } from './luminosity.js';
export { radialTable, radiusAt, type RadialTable } from './radialSampler.js';
export { populationSampler, drawRealisation, referenceDensityPerKpc3, type SourceRealisation, type PopulationSampler } from './realise.js';
export { sourceLonLat, sourcePixels, regionWeightsOfSources } from './sourcePixels.js';
export { thresholdsOf, resolvedFlags, type DetectionThreshold } from './threshold.js';
export { fluxGrid, countsAbove, logSlope, summedFlux } from './counts.js';
export { runPopulation, column as realisationColumn, type PopulationRun, type PopulationRunInput, type CountRegion } from './run.js';
export { calibrateCount, resolvedInTarget, type CalibrationResult, type CalibrationTarget } from './calibrate.js';
export { calibrateLuminosityScale, type LuminosityCalibration } from './calibrateLuminosity.js';
export { correctScaledInput, type UnresolvedTerm, type ScaledGammaInput, type CorrectedGammaInput } from './correction.js';
export { populationSectionSchema, type PopulationSection, type PopulationVariant } from './sectionSchema.js';
export { parsePopulationSection, populationModels, sectionThreshold, type SectionSource } from './section.js';
export { runPopulationSection, type PopulationContext, type PopulationSectionResult, type RegionCounts } from './runSection.js';
export { renderSourceCountsSvg, type CountCurve, type CountPoint, type CountPlot } from './countsSvg.js';
export { countsCsv, intensitiesCsv } from './tables.js';
