/**
 * Writes factor tables in the chosen formats into a folder, each file through
 * writeFileAtomic (temporary file and rename). Every destination is checked
 * before the first is written, so a refused overwrite leaves nothing half done.
 */
import { join } from 'node:path';
import { checkWritable, writeFileAtomic } from '../io/atomicWrite.js';
import type { FactorResult } from './ensembleFactors.js';
import type { FactorProvenance } from './provenance.js';
import { renderFactorTables, type TableFormat } from './tableText.js';

/** Writes the tables; returns the paths written, in order. */
export function writeFactorTables(result: FactorResult, prov: FactorProvenance, opts: {
  dir: string; formats: TableFormat[]; force?: boolean; inputs?: string[]; base?: string;
}): string[] {
  const files = opts.formats.flatMap((f) => renderFactorTables(result, prov, f, opts.base))
    .map((f) => ({ path: join(opts.dir, f.name), text: f.text }));
  const wopts = { force: opts.force, inputs: opts.inputs };
  for (const f of files) checkWritable(f.path, wopts);
  for (const f of files) writeFileAtomic(f.path, f.text, wopts);
  return files.map((f) => f.path);
}
