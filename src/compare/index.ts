/** The compare layer's public API: predictions, measurements, comparisons and the Monte Carlo tools. */
export * from './random.js';
export * from './normal.js';
export * from './splitNormal.js';
export * from './chiSquare.js';
export * from './cholesky.js';
export * from './summary.js';
export * from './propagate.js';
export * from './ensemble.js';
export * from './gammaSampler.js';
export * from './conversion.js';
export * from './predict.js';
export * from './measurement.js';
export * from './tension.js';
export * from './reverse.js';
export * from './factorsFile.js';
export * from './report.js';
export * from './spectrumFluxPoints.js';
