/**
 * The tables of a run, each defined once and used by both the report and the
 * CSV files: the result scaled to each target (ensemble summary of k_I and of
 * k_I times the measured intensity), the survival tables, the forecast table
 * (E^2 I in both places), and the run's warnings grouped by cause.
 *
 * Column style: human tables (report, Markdown, LaTeX) use the trade's
 * symbols with the unit in the heading (`E (TeV)`, `k_I`, `E^2 I (GeV cm^-2 s^-1 sr^-1)`);
 * CSV and JSON use camelCase keys with a unit suffix (`energyTeV`, `kI`, `e2IMedianGeVPerCm2SSr`).
 */
import { formatCsv } from '../io/csvWrite.js';
import type { ReportTable } from '../render/report.js';
import type { FactorResult } from '../scaling/ensembleFactors.js';
import type { SpectrumPoints } from '../physics/points.js';
import type { RunComputation, SurvivalTable } from './compute.js';

/** A table with its human headings and its machine keys, one per column. */
export interface TableData { headings: string[]; keys: string[]; rows: (string | number | null)[][] }

const teV = (eGeV: number) => Number((eGeV / 1e3).toPrecision(4));

/**
 * The measured gamma-ray intensity scaled to each target: per target and per measured point (upper limits
 * left out), I_A, the ensemble's median and 16-84 % of k_I at the template plane nearest the point's energy,
 * and of I_B = k_I I_A. Quantiles commute with a positive factor, so I_B's are I_A times k_I's (the spread is
 * the templates' only; I_A's own error is in the points file). Without points, k_I alone per plane.
 */
export function scaledTable(factors: FactorResult, points: SpectrumPoints | null): TableData {
  const headings = ['target', 'E (TeV)', 'I_A (GeV^-1 cm^-2 s^-1 sr^-1)', 'k_I median', 'k_I 16 %', 'k_I 84 %', 'I_B median', 'I_B 16 %', 'I_B 84 %'];
  const keys = ['target', 'energyTeV', 'intensityMeasured', 'kIMedian', 'kIP16', 'kIP84', 'intensityTargetMedian', 'intensityTargetP16', 'intensityTargetP84'];
  const rows: (string | number | null)[][] = [];
  for (const target of factors.targets) {
    const sums = factors.summary.filter((s) => s.target === target && s.quantity === 'kI');
    if (!sums.length) continue;
    const nearest = (eGeV: number | null) => (eGeV === null ? sums[0]
      : sums.reduce((b, s) => (s.energyGeV !== null && b.energyGeV !== null && Math.abs(Math.log(s.energyGeV / eGeV)) < Math.abs(Math.log(b.energyGeV / eGeV)) ? s : b)));
    if (!points) {
      for (const s of sums) rows.push([target, s.energyGeV === null ? null : teV(s.energyGeV), s.median, s.p16, s.p84]);
      continue;
    }
    for (let i = 0; i < points.energyGeV.length; i++) {
      if (points.upperLimit[i]) continue;
      const e = points.energyGeV[i], v = points.value[i], s = nearest(e);
      rows.push([target, teV(e), v, s.median, s.p16, s.p84, v * s.median, v * s.p16, v * s.p84]);
    }
  }
  // Without measured points (a forecast alone) the table holds k_I only.
  return points ? { headings, keys, rows } : { headings: headings.filter((_, k) => k !== 2 && k < 6), keys: keys.filter((_, k) => k !== 2 && k < 6), rows };
}

/** Survival table: template and the mean survival probability at each gamma-ray energy. */
export function survivalData(s: SurvivalTable): TableData {
  return { headings: ['template', ...s.energiesGeV.map((e) => `P at ${teV(e)} TeV`)],
    keys: ['template', ...s.energiesGeV.map((e) => `survivalAt${teV(e)}TeV`)],
    rows: Object.entries(s.byTemplate).map(([t, v]) => [t, ...v]) };
}

/** Forecast table: E^2 I expected in the footprint (median, 16 %, 84 %) at each gamma-ray energy. */
export function forecastData(c: RunComputation): TableData | null {
  if (!c.forecast) return null;
  const comb = c.forecast.components.find((k) => k.name === 'combined')!;
  return { headings: ['E (TeV)', 'E^2 I median', 'E^2 I 16 %', 'E^2 I 84 %'],
    keys: ['energyTeV', 'e2IMedian', 'e2IP16', 'e2IP84'],
    rows: Array.from(c.forecast.energiesGammaGeV, (e, j) => [e / 1e3, comb.atEnergies[j].median * e * e, comb.atEnergies[j].p16 * e * e, comb.atEnergies[j].p84 * e * e]) };
}

/** The unit line of the forecast table and its CSV. */
export const FORECAST_UNIT = 'E^2 I in GeV cm^-2 s^-1 sr^-1';

/** A table as CSV (machine keys as the header). */
export function tableCsv(t: TableData, comments: string[]): string {
  return formatCsv(t.keys, t.rows, { comments });
}

/** A table for the report (human headings). */
export function reportTable(t: TableData, id: string, caption: string, note?: string): ReportTable {
  return { id, caption, columns: t.headings, rows: t.rows, ...(note ? { note } : {}) };
}

/**
 * Warnings and notes grouped by cause: texts that differ only in numbers, quoted names or a one-word
 * qualifier in parentheses are one cause. Each cause is shown once, by its first text, with its count.
 */
export function groupMessages(items: [string, string][]): { kind: string; text: string; count: number }[] {
  const out = new Map<string, { kind: string; text: string; count: number }>();
  for (const [kind, text] of items) {
    const key = kind + '\u0000' + text.replace(/'[^']*'/g, "'*'").replace(/\(\w+\)/g, '(*)').replace(/[-+]?\d+(\.\d+)?(e[-+]?\d+)?/gi, '#');
    const g = out.get(key);
    if (g) g.count++;
    else out.set(key, { kind, text, count: 1 });
  }
  return [...out.values()];
}
