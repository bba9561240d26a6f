/** Public API of the scaling layer: extrapolation factors, ensemble summaries, factor tables. */
export { computeFactors } from './factors.js';
export {
  computeFactorsWith, EXTRAPOLATION_ASSUMPTION,
  type FactorInput, type FactorResult, type FactorTemplate, type EvaluatedRegion, type RegionEvaluator,
} from './ensembleFactors.js';
export { factorRow, regionMean, type FactorRow, type RowContext } from './factorRow.js';
export { summarise, SUMMARY_QUANTITIES, type SummaryRow, type SummaryQuantity } from './summary.js';
export { quantile, quantiles } from './quantiles.js';
export { regionSums, wholeSkySums, S as REGION_SUM_SLOTS, SUMS_LENGTH } from './regionSums.js';
export { toRegionPixels, wholeSkyPixels, type RegionPixels, type RegionWeightsLike } from './regionPixels.js';
export { buildProvenance, hashInputs, provenanceLines, type FactorProvenance, type ProvenanceInput } from './provenance.js';
export { renderFactorTables, TABLE_FORMATS, type TableFormat } from './tableText.js';
export { writeFactorTables } from './writeTables.js';
export { listTemplateFiles, readTemplateFiles, type TemplateFromFile } from './templateFiles.js';
export { projectNormalisation, projectionSums, type ProjectionSums } from './templateProjection.js';
export { projectionFactors, type ProjectionFactor, type ProjectionTemplate } from './projectionFactors.js';
