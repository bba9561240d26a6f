/**
 * ECSV tables (Enhanced Character Separated Values, astropy's text table
 * format: astropy APE 6, "ECSV 1.0"): a header of lines starting with `# `
 * that holds YAML (`datatype`: name, datatype, unit, description per
 * column; `meta`; `delimiter`, space by default), then one line of column
 * names and one line per row. Fields are separated by the delimiter (runs of
 * spaces count as one); a field in double quotes may hold the delimiter, and
 * `""` inside quotes is one quote. Numbers may be `nan`, `inf`, `-inf`; an
 * empty field is a missing value (NaN). Booleans are `True` / `False`.
 *
 * This reader handles the flat tables skyspan exchanges (numeric, bool and
 * string columns); multidimensional (`subtype`) and object columns are an
 * InputError. The writer emits what the reader reads and astropy reads back
 * (test/physics/fluxPoints.test.ts checks both against astropy).
 */
import { Document, parse as parseYaml, type YAMLMap, type YAMLSeq } from 'yaml';
import { InputError } from '../core/errors.js';

/** One column: numeric and bool columns as Float64Array (bool 1/0, missing NaN), string columns as text. */
export interface EcsvColumn {
  name: string;
  datatype: string;
  unit?: string;
  description?: string;
  values: Float64Array | string[];
}

/** A table: its columns in order and its `meta` mapping. */
export interface EcsvTable {
  columns: EcsvColumn[];
  meta: Record<string, unknown>;
  /** 1-based line number of each data row in the file (set by the reader). */
  rowLines?: number[];
}

const NUMERIC = new Set(['float16', 'float32', 'float64', 'float128', 'int8', 'int16', 'int32', 'int64',
  'uint8', 'uint16', 'uint32', 'uint64']);

/** Splits one data line into fields (see module comment); null when a quote is not closed. */
function splitFields(line: string, delimiter: string): string[] | null {
  const out: string[] = [];
  let i = 0;
  const n = line.length;
  const space = delimiter === ' ';
  while (i <= n) {
    if (space) while (i < n && line[i] === ' ') i++;
    if (i >= n) { if (!space) out.push(''); break; }
    let field = '';
    if (line[i] === '"') {
      i++;
      for (;;) {
        if (i >= n) return null;
        if (line[i] === '"') {
          if (line[i + 1] === '"') { field += '"'; i += 2; continue; }
          i++;
          break;
        }
        field += line[i++];
      }
      while (i < n && line[i] !== delimiter) i++;
    } else {
      while (i < n && line[i] !== delimiter) field += line[i++];
    }
    out.push(field);
    if (i >= n) break;
    i++; // the delimiter
  }
  return out;
}

/** The number a field holds (NaN when empty), or undefined when it is not one. */
function toNumber(text: string, datatype: string): number | undefined {
  const t = text.trim();
  if (t === '') return NaN;
  if (datatype === 'bool') {
    if (t === 'True' || t === 'true' || t === '1') return 1;
    if (t === 'False' || t === 'false' || t === '0') return 0;
    return undefined;
  }
  const l = t.toLowerCase();
  if (l === 'nan') return NaN;
  if (l === 'inf' || l === '+inf') return Infinity;
  if (l === '-inf') return -Infinity;
  const v = Number(t);
  return Number.isNaN(v) ? undefined : v;
}

/** Parses ECSV text; `file` names the source in error messages (rows are 1-based line numbers). */
export function parseEcsv(text: string, file = '<text>'): EcsvTable {
  const lines = text.split(/\r?\n/);
  if (!/^#\s*%ECSV\s+\d/.test(lines[0] ?? '')) {
    throw new InputError('does not start with "# %ECSV <version>"', { file, row: 1 }, 'an ECSV table as written by astropy begins with this line');
  }
  let k = 1;
  if ((lines[k] ?? '').trim() !== '# ---') throw new InputError('the second line is not "# ---"', { file, row: 2 });
  k++;
  const yamlLines: string[] = [];
  for (; k < lines.length && lines[k].startsWith('#'); k++) yamlLines.push(lines[k].replace(/^# ?/, ''));
  let header: Record<string, unknown>;
  try {
    header = (parseYaml(yamlLines.join('\n')) ?? {}) as Record<string, unknown>;
  } catch (e) {
    throw new InputError(`the YAML header cannot be read: ${(e as Error).message.split('\n')[0]}`, { file, row: 3 });
  }
  const delimiter = typeof header.delimiter === 'string' ? header.delimiter : ' ';
  if (delimiter !== ' ' && delimiter !== ',') throw new InputError(`delimiter is ${JSON.stringify(delimiter)}, expected a space or a comma`, { file, keyPath: 'delimiter' });
  const dt = header.datatype;
  if (!Array.isArray(dt) || dt.length === 0) throw new InputError('the header has no datatype list', { file, keyPath: 'datatype' });
  const specs = dt.map((d, i) => {
    const o = d as Record<string, unknown>;
    const keyPath = `datatype[${i}]`;
    if (typeof o?.name !== 'string' || typeof o.datatype !== 'string') throw new InputError('each column needs a name and a datatype', { file, keyPath });
    if (o.subtype !== undefined) throw new InputError(`column ${o.name} has subtype ${String(o.subtype)}; skyspan reads flat columns only`, { file, keyPath });
    if (!NUMERIC.has(o.datatype) && o.datatype !== 'bool' && o.datatype !== 'string') {
      throw new InputError(`column ${o.name} has datatype ${o.datatype}`, { file, keyPath }, 'expected a number type, bool or string');
    }
    return { name: o.name, datatype: o.datatype, unit: typeof o.unit === 'string' ? o.unit : undefined,
      description: typeof o.description === 'string' ? o.description : undefined };
  });
  while (k < lines.length && lines[k].trim() === '') k++;
  const names = splitFields(lines[k] ?? '', delimiter);
  if (!names || names.length !== specs.length || names.some((nm, i) => nm !== specs[i].name)) {
    throw new InputError(`the column-name line does not match the header's datatype list (${specs.map((s) => s.name).join(' ')})`, { file, row: k + 1 });
  }
  const rows: { fields: string[]; line: number }[] = [];
  for (k++; k < lines.length; k++) {
    const line = lines[k];
    if (line.trim() === '' || line.startsWith('#')) continue;
    const fields = splitFields(line, delimiter);
    if (!fields) throw new InputError('a quoted field is not closed', { file, row: k + 1 });
    if (fields.length !== specs.length) throw new InputError(`found ${fields.length} fields, expected ${specs.length}`, { file, row: k + 1 });
    rows.push({ fields, line: k + 1 });
  }
  const columns: EcsvColumn[] = specs.map((s, j) => {
    if (s.datatype === 'string') return { ...s, values: rows.map((r) => r.fields[j]) };
    const v = new Float64Array(rows.length);
    rows.forEach((r, i) => {
      const x = toNumber(r.fields[j], s.datatype);
      if (x === undefined) {
        throw new InputError(`${s.name} is "${r.fields[j]}", expected ${s.datatype === 'bool' ? 'True or False' : 'a number'}`, { file, row: r.line, keyword: s.name });
      }
      v[i] = x;
    });
    return { ...s, values: v };
  });
  const metaRaw = header.meta;
  const meta: Record<string, unknown> = metaRaw instanceof Map ? Object.fromEntries(metaRaw) : (metaRaw && typeof metaRaw === 'object' ? { ...(metaRaw as object) } : {});
  return { columns, meta, rowLines: rows.map((r) => r.line) };
}

function formatField(v: number | string, datatype: string): string {
  if (typeof v === 'string') return v === '' || /[\s",]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
  if (datatype === 'bool') return v === 1 ? 'True' : v === 0 ? 'False' : '""';
  if (Number.isNaN(v)) return 'nan';
  if (v === Infinity) return 'inf';
  if (v === -Infinity) return '-inf';
  return String(v); // shortest text that reads back to the same double (ECMA-262 Number::toString)
}

/**
 * Formats a table as ECSV 1.0 with a space delimiter. Numbers are written
 * with the shortest text that reads back to the same float64, so a round
 * trip is exact.
 */
export function formatEcsv(table: EcsvTable): string {
  const datatype = table.columns.map((c) => ({ name: c.name, ...(c.unit ? { unit: c.unit } : {}), datatype: c.datatype,
    ...(c.description ? { description: c.description } : {}) }));
  const doc: Record<string, unknown> = { datatype };
  if (Object.keys(table.meta).length > 0) doc.meta = table.meta;
  doc.schema = 'astropy-2.0';
  const yamlDoc = new Document(doc);
  for (const item of (yamlDoc.get('datatype') as YAMLSeq).items) (item as YAMLMap).flow = true; // one line per column, as astropy writes
  const yamlText = yamlDoc.toString({ lineWidth: 0 }).trimEnd();
  const out = ['# %ECSV 1.0', '# ---', ...yamlText.split('\n').map((l) => `# ${l}`)];
  out.push(table.columns.map((c) => formatField(c.name, 'string')).join(' '));
  const n = table.columns.length ? table.columns[0].values.length : 0;
  for (const c of table.columns) if (c.values.length !== n) throw new RangeError(`column ${c.name} has ${c.values.length} values, expected ${n}`);
  for (let i = 0; i < n; i++) out.push(table.columns.map((c) => formatField(c.values[i], c.datatype)).join(' '));
  return out.join('\n') + '\n';
}
