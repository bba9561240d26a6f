/**
 * Small CSV reader for catalogues and spectrum points (RFC 4180 quoting:
 * fields in double quotes may hold commas, newlines and "" for a quote), with
 * '#' comment lines and blank lines skipped, and the 1-based file line of
 * every row kept for error messages.
 */
import { InputError } from '../core/errors.js';
import { readInputText } from './inputFile.js';

/** A parsed CSV: header fields, data rows and the file line where each row starts. */
export interface CsvTable {
  readonly header: string[];
  /** 1-based file line of the header. */
  readonly headerLine: number;
  readonly rows: string[][];
  readonly rowNumbers: number[];
}

/** Reads a CSV file (UTF-8; a byte-order mark is dropped). */
export function readCsv(path: string): CsvTable {
  return parseCsv(readInputText(path), path);
}

/**
 * Parses CSV text. The first non-comment line is the header; every row must
 * have as many fields as the header (else InputError naming the row's line).
 * Fields are trimmed unless quoted.
 */
export function parseCsv(text: string, file: string): CsvTable {
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  const records: { fields: string[]; line: number }[] = [];
  let line = 1;
  let i = 0;
  const n = text.length;
  while (i < n) {
    const startLine = line;
    // Skip comment and blank lines.
    if (text[i] === '#' || text[i] === '\n' || (text[i] === '\r' && text[i + 1] === '\n')) {
      while (i < n && text[i] !== '\n') i++;
      i++; line++;
      continue;
    }
    const fields: string[] = [];
    let field = '';
    let quoted = false;
    for (;;) {
      if (i >= n) { fields.push(quoted ? field : field.trim()); break; }
      const c = text[i];
      if (c === '"' && field.trim() === '' && !quoted) {
        quoted = true; field = ''; i++;
        for (;;) {
          if (i >= n) throw new InputError('a quoted field has no closing quote', { file, line: startLine });
          if (text[i] === '"') {
            if (text[i + 1] === '"') { field += '"'; i += 2; continue; }
            i++; break;
          }
          if (text[i] === '\n') line++;
          field += text[i++];
        }
        while (i < n && (text[i] === ' ' || text[i] === '\t')) i++;
        if (i < n && text[i] !== ',' && text[i] !== '\n' && text[i] !== '\r') {
          throw new InputError('unexpected text after a quoted field', { file, line: startLine });
        }
        continue;
      }
      if (c === ',') { fields.push(quoted ? field : field.trim()); field = ''; quoted = false; i++; continue; }
      if (c === '\r' && text[i + 1] === '\n') { i++; continue; }
      if (c === '\n') { fields.push(quoted ? field : field.trim()); i++; line++; break; }
      field += c; i++;
    }
    records.push({ fields, line: startLine });
  }
  if (records.length === 0) throw new InputError('has no header line', { file });
  const header = records[0].fields;
  const rows: string[][] = [];
  const rowNumbers: number[] = [];
  for (const r of records.slice(1)) {
    if (r.fields.length !== header.length) {
      throw new InputError(`has ${r.fields.length} fields, the header has ${header.length}`, { file, line: r.line });
    }
    rows.push(r.fields);
    rowNumbers.push(r.line);
  }
  return { header, headerLine: records[0].line, rows, rowNumbers };
}
