/**
 * Templates for a factor job from files and folders: each HEALPix FITS file
 * (.fits, .fit, .fits.gz) named directly or found in a named folder (sorted
 * by name, not recursive), one template per map column. Names are the file
 * name without its extension, plus `:COLUMN` when a file holds several maps.
 */
import { readdirSync, statSync } from 'node:fs';
import { basename, join } from 'node:path';
import { InputError } from '../core/errors.js';
import { readMapFile } from '../io/mapFile.js';
import type { SkyMap } from '../maps/skyMap.js';

const MAP_FILE = /\.(fits|fit|fts)(\.gz)?$/i;

/** The map files named by `paths`: files as given, folders expanded. */
export function listTemplateFiles(paths: string[]): string[] {
  const out: string[] = [];
  for (const p of paths) {
    let st;
    try { st = statSync(p); } catch { throw new InputError('does not exist', { file: p }, 'name a FITS file or a folder of them'); }
    if (st.isDirectory()) {
      const found = readdirSync(p).filter((n) => MAP_FILE.test(n)).sort().map((n) => join(p, n));
      if (found.length === 0) throw new InputError('holds no .fits, .fit or .fits.gz file', { file: p });
      out.push(...found);
    } else out.push(p);
  }
  return out;
}

/** A loaded template and the file it came from. */
export interface TemplateFromFile { name: string; map: SkyMap; file: string }

/**
 * Reads every template of `files`, each checked against the memory limit by
 * readMapFile (the file's bytes, the gzip output while inflating, the decoded
 * planes; core/memory.ts).
 */
export function readTemplateFiles(files: string[], opts: { frame?: 'galactic' | 'equatorial'; memoryLimitBytes?: number } = {}): TemplateFromFile[] {
  const out: TemplateFromFile[] = [];
  for (const file of files) {
    const { maps } = readMapFile(file, { ...(opts.frame ? { frame: opts.frame } : {}), memoryLimitBytes: opts.memoryLimitBytes });
    const stem = basename(file).replace(MAP_FILE, '');
    for (const map of maps) out.push({ name: maps.length > 1 ? `${stem}:${map.column}` : stem, map, file });
  }
  return out;
}
