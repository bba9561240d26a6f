/**
 * The skyspan library API. Each layer appends its exports here.
 */
export * from './sphere/nside.js';
export * from './sphere/angles.js';
export * from './sphere/frames.js';
export * from './sphere/ringTable.js';
export * from './sphere/pixelIndex.js';
export * from './sphere/bulk.js';
export * from './sphere/frameRotation.js';
export * from './sphere/reference.js';
export * from './maps/skyMap.js';
export * from './maps/blank.js';
export * from './maps/stats.js';
export * from './maps/create.js';
export * from './maps/reorder.js';
export * from './maps/resample.js';
export * from './maps/interpolate.js';
export * from './maps/reframe.js';
export * from './io/mapFile.js';
export * from './io/csv.js';
export { parseEcsv, formatEcsv, type EcsvTable, type EcsvColumn } from './io/ecsv.js';
export * from './io/hash.js';
export { estimateMapBytes, availableMemoryBytes, assertFits, formatBytes, MEMORY_LIMIT_ENV, type MemoryLimit } from './core/memory.js';
export * as fits from './io/fits/index.js';
export * from './regions/index.js';
export * from './physics/index.js';
export * from './templates/index.js';
export * from './scaling/index.js';
export * from './compare/index.js';
export * from './render/index.js';
export * from './populations/index.js';
export * from './plan/index.js';
