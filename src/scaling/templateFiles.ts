/**
 * Templates for a factor job from files and folders: each HEALPix FITS file
 * (.fits, .fit, .fits.gz) named directly or found in a named folder (sorted
 * by name, not recursive), one template per map column. Names are the file
 * name without its extension, plus `:COLUMN` when a file holds several maps.
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { basename, join } from 'node:path';
import { InputError } from '../core/errors.js';
import { readMapBytes } from '../io/mapFile.js';
import type { SkyMap } from '../maps/skyMap.js';
import { assertMemoryFits } from './memory.js';

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
 * Reads every template of `files`. Before reading an uncompressed file the
 * memory it needs (about 3 times its size: the bytes and the decoded planes
 * with headroom) is checked against the available memory; compressed files
 * are not pre-checked (their size does not bound the decoded size). Each
 * file is read once: its hash comes from the same bytes.
 */
export function readTemplateFiles(files: string[], opts: { frame?: 'galactic' | 'equatorial'; memoryLimitBytes?: number } = {}): TemplateFromFile[] {
  const out: TemplateFromFile[] = [];
  for (const file of files) {
    if (!/\.gz$/i.test(file)) {
      assertMemoryFits(3 * statSync(file).size, `reading template ${file}`, NaN, opts.memoryLimitBytes);
    }
    let raw: Buffer;
    try {
      if (statSync(file).isDirectory()) throw Object.assign(new Error('is a directory'), { code: 'EISDIR' });
      raw = readFileSync(file);
    } catch (e) {
      throw new InputError(`cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`, { file }, 'check the path and permissions');
    }
    const sha256 = createHash('sha256').update(raw).digest('hex');
    const { maps } = readMapBytes(raw, file, opts.frame ? { frame: opts.frame } : {});
    const stem = templateStem(file);
    for (const map of maps) out.push({ name: maps.length > 1 ? `${stem}:${map.column}` : stem, map, file, sha256 });
  }
  return out;
}
