/**
 * The one CSV writer of skyspan: RFC 4180 (Shafranovich 2005) quoting, so a
 * field holding a comma, a double quote, CR or LF is put in double quotes with
 * every quote doubled; '#' comment lines above the header (read back by
 * io/csv.ts, which skips them); '\n' line ends and a final newline. Every
 * table skyspan writes as CSV goes through {@link formatCsv}.
 */

/** A cell: text, a number (written by the table's number format), or empty (null/undefined). */
export type CsvValue = string | number | null | undefined;

/** Text of a number in a CSV cell: full double precision by default (shortest round-trip form). */
export type CsvNumberFormat = (x: number) => string;

/**
 * One CSV field with RFC 4180 quoting. Numbers go through `number` (default
 * `String`, which round-trips doubles); null and undefined give an empty field.
 *
 * @example
 * csvField('a, b') === '"a, b"'; csvField('say "hi"') === '"say ""hi"""'; csvField(0.5) === '0.5'
 */
export function csvField(v: CsvValue, number: CsvNumberFormat = String): string {
  const s = v === null || v === undefined ? '' : typeof v === 'number' ? number(v) : v;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Options of {@link formatCsv}. */
export interface CsvOptions {
  /** Lines written as '# line' above the header (newlines inside a line become spaces). */
  comments?: readonly string[];
  /** How numbers are written (default `String`). */
  number?: CsvNumberFormat;
}

/**
 * A whole CSV document: comment lines, the header, one line per row.
 *
 * @example
 * formatCsv(['name', 'value'], [['a,b', 1]], { comments: ['made up'] }) === '# made up\nname,value\n"a,b",1\n'
 */
export function formatCsv(columns: readonly string[], rows: readonly (readonly CsvValue[])[], options: CsvOptions = {}): string {
  const num = options.number ?? String;
  const lines = (options.comments ?? []).map((c) => `# ${c.replace(/\r?\n/g, ' ')}`);
  lines.push(columns.map((c) => csvField(c)).join(','));
  for (const r of rows) lines.push(r.map((v) => csvField(v, num)).join(','));
  return lines.join('\n') + '\n';
}
