/** The plan layer's public API: the plan file and the whole run. */
export { planSchema, type PlanDocument } from './schema.js';
export { loadPlan, checkPlan, parsePlanText, resolvePlan, type ResolvedPlan } from './loadPlan.js';
export { runPlan, type RunOptions, type RunSummary } from './runPlan.js';
export { ArtefactCache, stableJson, type CacheEntry, type CacheStats } from './cache.js';
export { regionSurvival, isWholeSky } from './regionWeights.js';
export type { RunComputation, SurvivalTable } from './compute.js';
export type { Headline } from './reportContent.js';
