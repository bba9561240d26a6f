/**
 * The comparison as files: tables in CSV, Markdown and JSON, and the data of
 * the spectrum plot (a plain JSON structure, {@link ComparisonPlotData}).
 * Intensities are written in GeV^-1 cm^-2 s^-1 sr^-1, energies in GeV; the
 * prediction is given in the measurement's flavour (all-flavour by default).
 */
import type { SpectrumPoints } from '../physics/points.js';
import type { NeutrinoMeasurement } from './measurement.js';
import { formatCsv } from '../io/csvWrite.js';
import { splitNormalQuantile } from './splitNormal.js';
import type { Prediction } from './predict.js';
import { describePValue, flavourFactor, type PointsComparison, type ReferenceComparison } from './tension.js';

/** What the columns of the summary table mean, written beside it. */
export const SUMMARY_DEFINITIONS = [
  'median, p16, p84: the 50th, 15.87th and 84.13th percentiles (Phi(-1), Phi(+1)) of the Monte Carlo draws, type 7 of Hyndman & Fan 1996 (scaling/quantiles.ts)',
  'relativeHalfWidth = (p84 - p16) / (2 median)',
  'predicted (name): the prediction with only that source of uncertainty varied, the others at their centre (weighted medians of the templates at each energy, the primary method)',
  'method (central): the method\'s value with every input at its centre',
  'Gaussian (tension row): |mean d| / std d over the paired draws d = measured - predicted (counted tension); for a likelihood measurement |median prediction - best fit| / sqrt(sigma_measured^2 + sigma_predicted^2), sigma_measured the profile\'s one-sigma distance on the prediction\'s side',
];

/** Data of the spectrum plot. Arrays of one block have equal length. */
export interface ComparisonPlotData {
  energyUnit: 'GeV';
  intensityUnit: 'GeV^-1 cm^-2 s^-1 sr^-1';
  flavour: string;
  /** Neutrino energies of the predicted bands. */
  energiesGeV: number[];
  gamma: { label: string; energyGeV: number[]; value: number[]; errLow: number[]; errHigh: number[]; upperLimit: boolean[] } | null;
  predicted: Record<string, { p16: number[]; p50: number[]; p84: number[] }>;
  methods: Record<string, number[]>;
  measured: { kind: string; label: string; energyGeV: number[]; p16: number[]; p50: number[]; p84: number[]; upperLimit?: boolean[] } | null;
  assumptions: string[];
}

/** Everything a report shows. */
export interface ComparisonReport {
  prediction: Prediction;
  measurement?: NeutrinoMeasurement;
  reference?: ReferenceComparison;
  points?: PointsComparison;
  gammaPoints?: SpectrumPoints;
  provenance: Record<string, unknown>;
}

const P16 = 0.15865525393145707, P84 = 0.8413447460685429;
const fmt = (x: number) => (Number.isFinite(x) ? x.toPrecision(5) : String(x));

function measuredBand(m: NeutrinoMeasurement, energies: number[]): ComparisonPlotData['measured'] {
  if (m.kind === 'points') {
    return { kind: 'points', label: m.label, energyGeV: m.points.map((p) => p.energyGeV), p50: m.points.map((p) => p.value),
      p16: m.points.map((p) => p.value - p.errLow), p84: m.points.map((p) => p.value + p.errHigh), upperLimit: m.points.map((p) => p.upperLimit) };
  }
  const [lo, hi] = m.energyRangeGeV ?? [Math.min(...energies, m.e0GeV), Math.max(...energies, m.e0GeV)];
  const es = Array.from({ length: 16 }, (_, i) => lo * Math.pow(hi / lo, i / 15));
  const q = (p: number) => splitNormalQuantile(p, m.norm.value, m.norm.errLow, m.norm.errHigh);
  const idx = m.kind === 'normalisation' ? [m.index] : m.indexRange;
  const mid = m.kind === 'normalisation' ? m.index : 0.5 * (m.indexRange[0] + m.indexRange[1]);
  const at = (norm: number, e: number, g: number) => norm * Math.pow(e / m.e0GeV, -g);
  return { kind: m.kind, label: m.label, energyGeV: es,
    p50: es.map((e) => at(m.norm.value, e, mid)),
    p16: es.map((e) => Math.min(...idx.map((g) => at(q(P16), e, g)))),
    p84: es.map((e) => Math.max(...idx.map((g) => at(q(P84), e, g)))) };
}

/** Builds the plot data. */
export function spectrumPlotData(r: ComparisonReport): ComparisonPlotData {
  const p = r.prediction, f = r.measurement ? flavourFactor(p, r.measurement.flavour) : 1;
  const energies = Array.from(p.energiesNuGeV);
  const predicted: ComparisonPlotData['predicted'] = {};
  for (const c of p.components) {
    predicted[c.name] = { p16: c.atEnergies.map((s) => f * s.p16), p50: c.atEnergies.map((s) => f * s.median), p84: c.atEnergies.map((s) => f * s.p84) };
  }
  const g = r.gammaPoints;
  return {
    energyUnit: 'GeV', intensityUnit: 'GeV^-1 cm^-2 s^-1 sr^-1', flavour: r.measurement?.flavour ?? 'all', energiesGeV: energies,
    gamma: g ? { label: g.source ?? 'gamma-ray points (measured region)', energyGeV: Array.from(g.energyGeV), value: Array.from(g.value),
      errLow: Array.from(g.errLow), errHigh: Array.from(g.errHigh), upperLimit: Array.from(g.upperLimit, (u) => u === 1) } : null,
    predicted,
    methods: Object.fromEntries(p.methods.map((m) => [m.id, Array.from(m.atEnergies, (v) => f * v)])),
    measured: r.measurement ? measuredBand(r.measurement, energies) : null,
    assumptions: p.assumptions,
  };
}

/** Rows of the summary table at E0 (one per component and method, plus the comparison). */
export function summaryRows(r: ComparisonReport): Record<string, string | number>[] {
  const p = r.prediction, f = r.measurement ? flavourFactor(p, r.measurement.flavour) : 1;
  const rows: Record<string, string | number>[] = p.components.map((c) => ({
    quantity: `predicted (${c.name})`, description: c.description, energyGeV: p.e0GeV,
    median: f * c.atE0.median, p16: f * c.atE0.p16, p84: f * c.atE0.p84, relativeHalfWidth: 0.5 * (c.atE0.p84 - c.atE0.p16) / c.atE0.median,
  }));
  for (const m of p.methods) rows.push({ quantity: `method ${m.id} (central)`, description: m.label, energyGeV: p.e0GeV, median: f * m.atE0, p16: '', p84: '', relativeHalfWidth: '' });
  if (r.reference) {
    const x = r.reference;
    rows.push({ quantity: 'measured', description: `${r.measurement!.label}: ${x.measuredDefinition}`, energyGeV: x.energyGeV, median: x.measured.median, p16: x.measured.p16, p84: x.measured.p84, relativeHalfWidth: '' });
    rows.push({ quantity: 'ratio measured/predicted', description: 'paired Monte Carlo draws', energyGeV: x.energyGeV, median: x.ratio.median, p16: x.ratio.p16, p84: x.ratio.p84, relativeHalfWidth: '' });
    rows.push({ quantity: 'tension (sigma)', description: `${x.tension.lowerBound ? 'at least; ' : ''}measured ${x.tension.direction} prediction; ${describePValue(x.tension)}; Gaussian ${fmt(x.tension.gaussianSigma)} (defined below)`,
      energyGeV: x.energyGeV, median: x.tension.sigma, p16: '', p84: '', relativeHalfWidth: '' });
    rows.push({ quantity: 'p-value', description: `${x.tension.sided}-sided; Monte Carlo standard error ${fmt(x.tension.pValueStdError)}${x.tension.pValueUpper95 !== undefined ? `; 95 % upper bound ${fmt(x.tension.pValueUpper95)}` : ''}`,
      energyGeV: x.energyGeV, median: x.tension.pValue, p16: '', p84: '', relativeHalfWidth: '' });
  }
  if (r.points) rows.push({ quantity: 'chi2 over points', description: `dof ${r.points.dof}, p = ${fmt(r.points.pValue)} (${fmt(r.points.sigma)} sigma)`, energyGeV: '', median: r.points.chi2, p16: '', p84: '', relativeHalfWidth: '' });
  return rows;
}

function toCsv(rows: Record<string, string | number>[], head: string[]): string {
  const cols = Object.keys(rows[0] ?? {});
  return formatCsv(cols, rows.map((r) => cols.map((c) => r[c])), { comments: head, number: fmt });
}

function toMd(rows: Record<string, string | number>[]): string[] {
  const cols = Object.keys(rows[0] ?? {});
  const cell = (v: string | number) => (typeof v === 'number' ? fmt(v) : v).replace(/\|/g, '\\|');
  return [`| ${cols.join(' | ')} |`, `| ${cols.map(() => '---').join(' | ')} |`, ...rows.map((r) => `| ${cols.map((c) => cell(r[c])).join(' | ')} |`)];
}

/** Spectrum table: per energy, each component's 16 %, median and 84 % and each method's central value. */
export function spectrumRows(r: ComparisonReport): Record<string, string | number>[] {
  const d = spectrumPlotData(r);
  return d.energiesGeV.map((e, j) => {
    const row: Record<string, string | number> = { energyGeV: e };
    // camelCase keys, as in every CSV and JSON skyspan writes (README, "Names")
    for (const [k, v] of Object.entries(d.predicted)) { row[`${k}P16`] = v.p16[j]; row[`${k}Median`] = v.p50[j]; row[`${k}P84`] = v.p84[j]; }
    for (const [k, v] of Object.entries(d.methods)) row[`method${k[0].toUpperCase()}${k.slice(1)}`] = v[j];
    return row;
  });
}

/** Renders the report files for the chosen formats: [{ name, text }]. */
export function renderComparison(r: ComparisonReport, formats: ('csv' | 'md' | 'json')[], base = 'comparison'): { name: string; text: string }[] {
  const p = r.prediction;
  const head = [`skyspan comparison; intensities in GeV^-1 cm^-2 s^-1 sr^-1, flavour ${r.measurement?.flavour ?? 'all'}; ${p.samples} samples, seed ${p.seed}`,
    ...p.assumptions.map((a) => `assumption: ${a}`)];
  const sum = summaryRows(r), spec = spectrumRows(r);
  const out: { name: string; text: string }[] = [];
  for (const f of formats) {
    if (f === 'csv') {
      out.push({ name: `${base}.csv`, text: toCsv(sum, head) }, { name: `${base}-spectrum.csv`, text: toCsv(spec, head) });
      if (r.points) out.push({ name: `${base}-points.csv`, text: toCsv(r.points.rows.map((x) => ({ ...x, upperLimit: x.upperLimit ? 1 : 0 })), head) });
    } else if (f === 'md') {
      const lines = [`# Neutrino prediction and comparison`, '', ...head.map((h) => `- ${h}`), '', '## At the reference energy', '', ...toMd(sum), '',
        ...SUMMARY_DEFINITIONS.map((d) => `- ${d}`), '',
        '## Spectrum', '', ...toMd(spec), ''];
      if (r.points) lines.push('## Points', '', ...toMd(r.points.rows.map((x) => ({ ...x, upperLimit: x.upperLimit ? 'yes' : 'no' }))), '', `chi2 definition: ${r.points.definition}`, '');
      if (r.reference) lines.push(`Tension definition: ${r.reference.tension.definition}.`, '', ...r.reference.notes.map((n) => `- ${n}`), '');
      lines.push(`Linear cross-check (gamma-ray errors at E0): ${p.linearCheck.note}.`, '');
      if (p.warnings.length) lines.push('## Warnings', '', ...p.warnings.map((w) => `- ${w}`), '');
      lines.push('## Notes', '', ...p.notes.map((n) => `- ${n}`), '');
      out.push({ name: `${base}.md`, text: lines.join('\n') });
    } else {
      out.push({ name: `${base}.json`, text: JSON.stringify({
        provenance: r.provenance, assumptions: p.assumptions, warnings: p.warnings, notes: p.notes,
        samples: p.samples, seed: p.seed, e0GeV: p.e0GeV, primaryMethod: p.primaryMethod, flavourRatio: p.flavourRatio,
        components: p.components.map((c) => ({ name: c.name, description: c.description, atE0: c.atE0 })),
        methods: p.methods.map((m) => ({ id: m.id, label: m.label, atE0: m.atE0 })),
        linearCheck: p.linearCheck, reference: r.reference ?? null, points: r.points ?? null, spectrum: spec,
      }, null, 2) + '\n' });
    }
  }
  out.push({ name: `${base}-plot.json`, text: JSON.stringify(spectrumPlotData(r), null, 2) + '\n' });
  return out;
}
