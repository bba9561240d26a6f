/**
 * Templates for a factor job from files and folders: each HEALPix FITS file
 * (.fits, .fit, .fits.gz) named directly or found in a named folder (sorted
 * by name, not recursive), one template per map column. Names are the file
 * name without its extension, plus `:COLUMN` when a file holds several maps.
 */
import { createHash } from 'node:crypto';
import { readdirSync, statSync } from 'node:fs';
import { basename, join } from 'node:path';
import { InputError } from '../core/errors.js';
import { assertFits } from '../core/memory.js';
import { readInputBytes } from '../io/inputFile.js';
import { readMapBytes } from '../io/mapFile.js';
import type { SkyMap } from '../maps/skyMap.js';

const MAP_FILE = /\.(fits|fit|fts)(\.gz)?$/i;

/** A template file's name without its folder and extension (the template's name, or its prefix for a file of several maps). */
export function templateStem(file: string): string {
  return basename(file).replace(MAP_FILE, '');
}

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

/** A loaded template, the file it came from and that file's SHA-256 (FIPS 180-4), computed from the bytes that were decoded. */
export interface TemplateFromFile { name: string; map: SkyMap; file: string; sha256: string }

/**
 * Reads every template of `files`, each opened through io/inputFile.ts (a
 * regular file within the cap) and checked against the memory limit
 * (core/memory.ts: the file's bytes, the gzip output while inflating, the
 * decoded planes). Each file is read once: its hash comes from the same bytes.
 */
export function readTemplateFiles(files: string[], opts: { frame?: 'galactic' | 'equatorial'; memoryLimitBytes?: number } = {}): TemplateFromFile[] {
  const out: TemplateFromFile[] = [];
  for (const file of files) {
    // A plain file's bytes are held while its planes are decoded (checked before reading); gzip output is checked while inflating.
    if (!/\.gz$/i.test(file)) assertFits(fileSize(file), `reading template ${file}`,
      'lower its Nside where memory allows (skyspan remap IN OUT --nside N), or give fewer templates per run', opts.memoryLimitBytes);
    const raw = readInputBytes(file, 'map');
    const sha256 = createHash('sha256').update(raw).digest('hex');
    const { maps } = readMapBytes(raw, file, { ...(opts.frame ? { frame: opts.frame } : {}), memoryLimitBytes: opts.memoryLimitBytes });
    const stem = templateStem(file);
    for (const map of maps) out.push({ name: maps.length > 1 ? `${stem}:${map.column}` : stem, map, file, sha256 });
  }
  return out;
}

/** The size of `file` in bytes; 0 when it cannot be stat'ed (readInputBytes then says why). */
function fileSize(file: string): number {
  try { return statSync(file).size; } catch { return 0; }
}
