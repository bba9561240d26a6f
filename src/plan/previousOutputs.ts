/**
 * The files a previous `skyspan run` wrote into a folder, as its
 * provenance.json lists them (plus provenance.json itself): the entries a
 * `--force` rerun may replace as a whole folder. An unreadable or foreign
 * provenance.json lists nothing.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

/** Names listed under `outputs[].file` in `<dir>/provenance.json`, plus 'provenance.json'; empty when there is none. */
export function previousOutputs(dir: string): Set<string> {
  try {
    const prov = JSON.parse(readFileSync(join(dir, 'provenance.json'), 'utf8')) as { tool?: unknown; outputs?: { file?: unknown }[] };
    if (prov.tool !== 'skyspan' || !Array.isArray(prov.outputs)) return new Set();
    const names = prov.outputs.map((o) => o?.file).filter((f): f is string => typeof f === 'string' && !f.includes('/') && f !== '..');
    return new Set([...names, 'provenance.json']);
  } catch {
    return new Set();
  }
}
