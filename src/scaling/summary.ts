/**
 * Ensemble summary: for each target and energy plane, the median, 16th and
 * 84th percentiles, minimum and maximum of each factor over the templates
 * (weighted when template weights are given; quantile definitions in
 * quantiles.ts: type 7 of Hyndman & Fan 1996 unweighted, its weighted
 * generalisation otherwise). The 16th-84th range is the central 68 per cent,
 * a one-sigma-like spread of the model uncertainty, not a confidence interval.
 */
import type { FactorRow } from './factorRow.js';
import { quantiles } from './quantiles.js';

/** The factors that are summarised. */
export const SUMMARY_QUANTITIES = ['kI', 'kFSr', 'fourPiFactor', 'coveredFluxFraction'] as const;
export type SummaryQuantity = (typeof SUMMARY_QUANTITIES)[number];

/** One summary line: one factor, one target, one plane, over the templates. */
export interface SummaryRow {
  target: string;
  plane: number;
  energyGeV: number | null;
  quantity: SummaryQuantity;
  /** Templates contributing. */
  count: number;
  weighted: boolean;
  median: number;
  p16: number;
  p84: number;
  min: number;
  max: number;
}

/**
 * Summarises factor rows over templates, grouped by target and plane (planes
 * are matched by index and energy). `weights` maps template name to weight,
 * or null for an unweighted summary.
 */
export function summarise(rows: FactorRow[], weights: Map<string, number> | null): SummaryRow[] {
  const groups = new Map<string, FactorRow[]>();
  for (const r of rows) {
    const key = `${r.target}\u0000${r.plane}\u0000${r.energyGeV ?? ''}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = []));
    g.push(r);
  }
  const out: SummaryRow[] = [];
  for (const g of groups.values()) {
    const w = weights ? g.map((r) => weights.get(r.template) ?? 0) : null;
    if (w && !w.some((x) => x > 0)) continue;
    for (const q of SUMMARY_QUANTITIES) {
      const v = g.map((r) => r[q]);
      const [p16, median, p84] = quantiles(v, w, [0.16, 0.5, 0.84]);
      const used = w ? v.filter((_, i) => w[i] > 0) : v;
      out.push({ target: g[0].target, plane: g[0].plane, energyGeV: g[0].energyGeV, quantity: q, count: used.length,
        weighted: w !== null, median, p16, p84, min: Math.min(...used), max: Math.max(...used) });
    }
  }
  return out;
}
