/**
 * How the template-projection comparison (projectionStage.ts) appears in a
 * run's outputs: a sentence for the headline, a report table (q_t beside k_I
 * per template, then predicted and measured N, their ratio and the tension)
 * and the results.json section.
 */
import type { ReportTable } from '../render/report.js';
import type { TemplateProjectionResult } from './projectionStage.js';

const p3 = (x: number) => x.toPrecision(3);

/** The headline sentence of the projection comparison ('' without a measured normalisation). */
export function projectionSentence(p: TemplateProjectionResult): string {
  const r = p.reference;
  if (!r) return '';
  return `On the neutrino template's own terms (acceptance-weighted projection), the measured normalisation is ${p3(r.ratio.median)} times the predicted one` +
    ` (68 % interval ${p3(r.ratio.p16)} to ${p3(r.ratio.p84)}), a tension of ${r.tension.lowerBound ? 'at least ' : ''}${r.tension.sigma.toFixed(2)} sigma.`;
}

/** The report table of the projection comparison. */
export function projectionTable(p: TemplateProjectionResult): ReportTable {
  const rows: (string | number | null)[][] = p.factors.map((f) => [f.template, f.plane, f.kI, f.q, f.q / f.kI, f.pixels]);
  const comb = p.prediction.components.find((c) => c.name === 'combined')!.atE0;
  rows.push(['predicted N (median, 16 %, 84 %)', null, comb.median, comb.p16, comb.p84, null]);
  if (p.reference) {
    const r = p.reference;
    rows.push(['measured N (median, 16 %, 84 %)', null, r.measured.median, r.measured.p16, r.measured.p84, null]);
    rows.push(['measured / predicted N', null, r.ratio.median, r.ratio.p16, r.ratio.p84, null]);
    rows.push(['tension (sigma)', null, r.tension.sigma, null, null, null]);
  }
  return {
    id: 'template-projection',
    caption: `Comparison on the neutrino template's own terms at ${Number((p.prediction.e0GeV / 1e3).toPrecision(4))} TeV (all-flavour N per unit of the neutrino template)`,
    columns: ['template / quantity', 'plane', 'k_I (region average)', 'q (projection)', 'q / k_I', 'pixels'],
    rows,
    note: `${p.statement} q_t = sum(a T_t T_nu) / (<T_t>_A sum(a T_nu^2)) takes the place of k_I in the same Monte Carlo.`,
  };
}

/** The results.json section of the projection comparison. */
export function projectionResults(p: TemplateProjectionResult): Record<string, unknown> {
  return {
    neutrinoTemplate: p.templateFile, acceptance: p.acceptanceFile, statement: p.statement, factors: p.factors,
    predicted: p.prediction.components.map((c) => ({ name: c.name, description: c.description, atE0: c.atE0 })),
    comparison: p.reference, notes: [...p.notes, ...p.prediction.notes], warnings: p.prediction.warnings,
  };
}
