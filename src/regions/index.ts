/**
 * The regions layer's public API: the region language (document.ts), pixel
 * weights (evaluate.ts), ground exposure (exposure.ts) and masks (mask.ts).
 */
export { parseRegionDocument, regionNames } from './document.js';
export { evaluateRegion, defaultDepth, type EvaluateOptions } from './evaluate.js';
export { relativeExposure, exposureNormalisation, hourAngleHalfWidth, declinationBand, type ExposureWeighting } from './exposure.js';
export { regionMaps, writeRegionMask } from './mask.js';
export type { RegionDocument, RegionNode, RegionWeights, ShapeFrame, SiteWeight, CatalogueColumns } from './types.js';
