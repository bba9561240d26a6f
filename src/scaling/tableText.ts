/**
 * Factor tables as text: CSV (RFC 4180 quoting, '#' comment header), Markdown,
 * JSON and LaTeX (booktabs). Each carries the provenance and the
 * extrapolation assumption. CSV and JSON keep full double precision; Markdown
 * and LaTeX show 5 significant digits.
 */
import type { FactorResult } from './ensembleFactors.js';
import type { FactorRow } from './factorRow.js';
import type { SummaryRow } from './summary.js';
import { provenanceLines, type FactorProvenance } from './provenance.js';
import { formatCsv } from '../io/csvWrite.js';

/** Output formats of a factor table. */
export type TableFormat = 'csv' | 'md' | 'json' | 'tex';
/** All factor-table formats, in the default order. */
export const TABLE_FORMATS: readonly TableFormat[] = ['csv', 'md', 'json', 'tex'];

type Col<R> = { key: string; label: string; tex: string; get: (r: R) => string | number | null };
// key: CSV header, the same camelCase names as the JSON fields; label: the Markdown heading (symbols, units
// in parentheses); tex: the LaTeX heading. Planes are numbered from 1 wherever a user sees them.
const ROW_COLS: Col<FactorRow>[] = [
  { key: 'template', label: 'template', tex: 'template', get: (r) => r.template },
  { key: 'plane', label: 'plane', tex: 'plane', get: (r) => r.plane + 1 },
  { key: 'energyGeV', label: 'E (GeV)', tex: '$E$ (GeV)', get: (r) => r.energyGeV },
  { key: 'target', label: 'target', tex: 'target', get: (r) => r.target },
  { key: 'meanMeasured', label: '<T>_A', tex: '$\\langle T\\rangle_A$', get: (r) => r.meanMeasured },
  { key: 'meanTarget', label: '<T>_B', tex: '$\\langle T\\rangle_B$', get: (r) => r.meanTarget },
  { key: 'kI', label: 'k_I', tex: '$k_I$', get: (r) => r.kI },
  { key: 'kFSr', label: 'k_F (sr)', tex: '$k_F$ (sr)', get: (r) => r.kFSr },
  { key: 'fourPiFactor', label: 'k_4pi', tex: '$k_{4\\pi}$', get: (r) => r.fourPiFactor },
  { key: 'solidAngleMeasuredSr', label: 'Omega_A (sr)', tex: '$\\Omega_A$ (sr)', get: (r) => r.solidAngleMeasuredSr },
  { key: 'solidAngleTargetSr', label: 'Omega_B (sr)', tex: '$\\Omega_B$ (sr)', get: (r) => r.solidAngleTargetSr },
  { key: 'coveredFluxFraction', label: 'c_AB', tex: '$c_{AB}$', get: (r) => r.coveredFluxFraction },
  { key: 'blankMeasured', label: 'blank in A', tex: 'blank $A$', get: (r) => r.blankMeasured },
  { key: 'blankTarget', label: 'blank in B', tex: 'blank $B$', get: (r) => r.blankTarget },
  { key: 'nside', label: 'Nside', tex: '$N_\\mathrm{side}$', get: (r) => r.nside },
];
const SUM_COLS: Col<SummaryRow>[] = [
  { key: 'target', label: 'target', tex: 'target', get: (r) => r.target },
  { key: 'plane', label: 'plane', tex: 'plane', get: (r) => r.plane + 1 },
  { key: 'energyGeV', label: 'E (GeV)', tex: '$E$ (GeV)', get: (r) => r.energyGeV },
  { key: 'quantity', label: 'factor', tex: 'factor', get: (r) => r.quantity },
  { key: 'count', label: 'templates', tex: '$n$', get: (r) => r.count },
  { key: 'median', label: 'median', tex: 'median', get: (r) => r.median },
  { key: 'p16', label: '16 %', tex: '16\\%', get: (r) => r.p16 },
  { key: 'p84', label: '84 %', tex: '84\\%', get: (r) => r.p84 },
  { key: 'min', label: 'min', tex: 'min', get: (r) => r.min },
  { key: 'max', label: 'max', tex: 'max', get: (r) => r.max },
  { key: 'weighted', label: 'weighted', tex: 'weighted', get: (r) => (r.weighted ? 'yes' : 'no') },
];

function short(v: string | number | null): string {
  if (v === null) return '';
  if (typeof v === 'string') return v;
  return Number.isInteger(v) && Math.abs(v) < 1e6 ? String(v) : v.toPrecision(5);
}
function texEscape(s: string): string {
  return s.replace(/[\\{}&%$#_^~]/g, (c) => (c === '\\' ? '\\textbackslash{}' : c === '^' ? '\\^{}' : c === '~' ? '\\~{}' : `\\${c}`));
}
function texNumber(v: string | number | null): string {
  if (typeof v !== 'number') return texEscape(short(v));
  const s = short(v);
  const m = /^(-?[\d.]+)e([+-]\d+)$/.exec(s);
  return m ? `$${m[1]}\\times10^{${Number(m[2])}}$` : s;
}

function csv<R>(cols: Col<R>[], rows: R[], header: string[]): string {
  return formatCsv(cols.map((c) => c.key), rows.map((r) => cols.map((c) => c.get(r))), { comments: header });
}
function md<R>(cols: Col<R>[], rows: R[]): string[] {
  const esc = (s: string) => s.replace(/\|/g, '\\|');
  return [`| ${cols.map((c) => esc(c.label)).join(' | ')} |`, `|${cols.map(() => ' --- ').join('|')}|`,
    ...rows.map((r) => `| ${cols.map((c) => esc(short(c.get(r)))).join(' | ')} |`)];
}
function tex<R>(cols: Col<R>[], rows: R[], caption: string): string[] {
  return ['\\begin{table}', '\\centering', `\\caption{${texEscape(caption)}}`, `\\begin{tabular}{${'l'.repeat(cols.length)}}`,
    '\\toprule', cols.map((c) => c.tex).join(' & ') + ' \\\\', '\\midrule',
    ...rows.map((r) => cols.map((c) => texNumber(c.get(r))).join(' & ') + ' \\\\'),
    '\\bottomrule', '\\end{tabular}', '\\end{table}'];
}

/**
 * The files of one format: name (relative to the output folder) and text.
 * CSV gives two files (`<base>.csv`, `<base>-summary.csv`); the others one.
 */
export function renderFactorTables(result: FactorResult, prov: FactorProvenance, format: TableFormat, base = 'factors'): { name: string; text: string }[] {
  const head = provenanceLines(prov);
  switch (format) {
    case 'csv':
      return [{ name: `${base}.csv`, text: csv(ROW_COLS, result.rows, head) },
        { name: `${base}-summary.csv`, text: csv(SUM_COLS, result.summary, head) }];
    case 'json':
      return [{ name: `${base}.json`, text: JSON.stringify({ provenance: prov, rows: result.rows.map((r) => ({ ...r, plane: r.plane + 1 })),
        summary: result.summary.map((r) => ({ ...r, plane: r.plane + 1 })),
        regions: result.regions }, null, 2) + '\n' }];
    case 'md':
      return [{ name: `${base}.md`, text: [`# Extrapolation factors: ${result.measured} to ${result.targets.join(', ')}`, '',
        `> ${result.assumption}`, '', ...md(ROW_COLS, result.rows), '', '## Ensemble summary', '', ...md(SUM_COLS, result.summary),
        '', '## Provenance', '', ...head.map((l) => `- ${l.replace(/\|/g, '\\|')}`), ''].join('\n') }];
    case 'tex':
      return [{ name: `${base}.tex`, text: [...head.map((l) => `% ${l}`), '% requires \\usepackage{booktabs}',
        ...tex(ROW_COLS, result.rows, `Extrapolation factors from ${result.measured}. ${result.assumption}`), '',
        ...tex(SUM_COLS, result.summary, 'Ensemble summary over templates (median, 16th and 84th percentiles, min, max).'),
        ''].join('\n') }];
  }
}
