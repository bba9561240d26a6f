/**
 * The run's own CSV files (besides the factor and comparison tables): the
 * survival tables and the forecast, written from the same table definitions
 * as the report (reportTables.ts), so a CSV and its report table hold the
 * same quantity.
 */
import type { RunComputation } from './compute.js';
import type { ResolvedPlan } from './loadPlan.js';
import { FORECAST_UNIT, forecastData, survivalData, tableCsv } from './reportTables.js';

/** survival.csv, forecast-survival.csv and forecast.csv, as far as the run made them. */
export function runTableFiles(rp: ResolvedPlan, c: RunComputation): { name: string; data: string }[] {
  const out: { name: string; data: string }[] = [];
  const surv = (s: NonNullable<RunComputation['survival']>) => tableCsv(survivalData(s),
    [`mean survival probability (emission weighted${s.exposureWeighted ? ', exposure weighted' : ''}) of gamma rays from region ${s.region}`]);
  if (c.survival) out.push({ name: 'survival.csv', data: surv(c.survival) });
  if (c.forecastSurvival) out.push({ name: 'forecast-survival.csv', data: surv(c.forecastSurvival) });
  const f = forecastData(c);
  if (f && c.forecast) {
    out.push({ name: 'forecast.csv', data: tableCsv(f, [`expected gamma-ray intensity in the footprint ${rp.plan.forecast!.footprint}: ${FORECAST_UNIT}, energies in TeV; median, 16 % and 84 % of the Monte Carlo`,
      ...c.forecast.assumptions.map((a) => `assumption: ${a}`)]) });
  }
  return out;
}
