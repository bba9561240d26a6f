/**
 * Option parsing and file handling shared by several commands: integers,
 * conversion-method and table-format lists, reading a region file, and writing
 * a set of output files so that a refused set writes nothing. Bad values are `UsageError`s (exit 2).
 */
import { readInputText } from '../io/inputFile.js';
import { UsageError } from '../core/errors.js';
import { checkWritable, writeFileAtomic } from '../io/atomicWrite.js';
import { parseRegionDocument } from '../regions/document.js';
import type { RegionDocument } from '../regions/types.js';
import type { MethodId } from '../compare/conversion.js';

/** Parses an integer option (any safe integer); `name` is the option as typed, e.g. '--samples'. */
export function parseInteger(text: string, name: string): number {
  const v = Number(text);
  if (!Number.isSafeInteger(v)) throw new UsageError(`${name} is '${text}', expected an integer`);
  return v;
}

/** Parses a --methods list: kab and/or kpi (the earlier spelling 'rule' is taken as kpi), in order, without repeats. */
export function parseMethods(text: string): MethodId[] {
  const ms = text.split(',').map((s) => s.trim()).filter(Boolean).map((m) => (m === 'rule' ? 'kpi' : m));
  for (const m of ms) if (m !== 'kab' && m !== 'kpi') throw new UsageError(`--methods has '${m}', expected kab and/or kpi`);
  if (ms.length === 0) throw new UsageError('--methods needs kab, kpi or both');
  return [...new Set(ms)] as MethodId[];
}

/** A table format of the prediction commands. */
export type TextFormat = 'csv' | 'md' | 'json';

/** Parses a --format list of csv, md and json, in order, without repeats. */
export function parseFormats(text: string): TextFormat[] {
  const fs = text.split(',').map((s) => s.trim()).filter(Boolean);
  for (const f of fs) if (f !== 'csv' && f !== 'md' && f !== 'json') throw new UsageError(`--format has '${f}', expected csv, md or json`);
  if (fs.length === 0) throw new UsageError('--format needs at least one of csv, md, json');
  return [...new Set(fs)] as TextFormat[];
}

/**
 * Writes every file through `writeFileAtomic` after checking all of them
 * first, so that one refused output (it exists without force, or it is an
 * input) leaves none written. Returns the paths written, in order.
 */
export function writeOutputs(files: readonly { path: string; text: string | Uint8Array }[], opts: { force?: boolean; inputs: readonly string[] }): string[] {
  const o = { force: opts.force, inputs: [...opts.inputs] };
  for (const f of files) checkWritable(f.path, o);
  for (const f of files) writeFileAtomic(f.path, f.text, o);
  return files.map((f) => f.path);
}

/** Reads and parses a region file (YAML or JSON); an unreadable file is an InputError naming it. */
export function readRegionFile(file: string): RegionDocument {
  return parseRegionDocument(readInputText(file), file);
}
