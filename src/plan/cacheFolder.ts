/**
 * Looking after a cache folder (cache.ts): what it holds (entries by kind,
 * their total size, when they were last used) and removing all entries or
 * those not used for a given time. Only files named like entries
 * (`<kind>-<64 hex digits>.bin`, of any format version) and the temporary
 * files a killed run can leave (`.<entry name>.<pid>.<stamp>.tmp`) are
 * counted or removed; anything else in the folder is left alone. An
 * entry's age is the time since it was written or last read (a read
 * touches it).
 */
import { lstatSync, readdirSync, readFileSync, statSync, unlinkSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { InputError } from '../core/errors.js';

const ENTRY = /^([a-z]+)-[0-9a-f]{64}\.bin$/;
const TEMPORARY = /^\.[a-z]+-[0-9a-f]{64}\.bin\..+\.tmp$/;

/** What a cache folder holds. Times are ISO 8601 UTC, null when there is no entry. */
export interface CacheFolderSummary {
  dir: string;
  exists: boolean;
  entries: number;
  bytes: number;
  byKind: Record<string, number>;
  oldestUsedUtc: string | null;
  newestUsedUtc: string | null;
  /** Temporary files left by killed runs (never read as entries). */
  temporaries: { count: number; bytes: number };
}

interface Item { path: string; kind: string | null; bytes: number; mtimeMs: number }

function items(dir: string): Item[] | null {
  let names: string[];
  try {
    if (!statSync(dir).isDirectory()) throw new InputError('is not a folder', { file: dir }, 'name the cache folder, as given to skyspan run --cache-dir');
    names = readdirSync(dir);
  } catch (e) {
    if (e instanceof InputError) throw e;
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw new InputError(`cannot read the cache folder (${(e as NodeJS.ErrnoException).code ?? String(e)})`, { file: dir });
  }
  const out: Item[] = [];
  for (const name of names.sort()) {
    const m = ENTRY.exec(name);
    if (!m && !TEMPORARY.test(name)) continue;
    const path = join(dir, name);
    try {
      const st = lstatSync(path);
      if (st.isFile()) out.push({ path, kind: m ? m[1] : null, bytes: st.size, mtimeMs: st.mtimeMs });
    } catch { /* removed meanwhile by a concurrent run */ }
  }
  return out;
}

/**
 * The cache folder named by `folder`: an output folder of `skyspan run`
 * names its cache in provenance.json (key `cache`); any other path is taken
 * as the cache folder itself.
 */
export function resolveCacheFolder(folder: string): string {
  try {
    const prov = JSON.parse(readFileSync(join(folder, 'provenance.json'), 'utf8')) as { tool?: unknown; cache?: unknown };
    if (prov.tool === 'skyspan' && typeof prov.cache === 'string' && prov.cache !== 'off') return resolve(prov.cache);
  } catch { /* not an output folder */ }
  return resolve(folder);
}

/** Summarises the cache folder `dir` (see module comment); a missing folder is an empty cache. */
export function summariseCache(dir: string): CacheFolderSummary {
  const all = items(dir);
  const entries = (all ?? []).filter((i) => i.kind !== null), temps = (all ?? []).filter((i) => i.kind === null);
  const byKind: Record<string, number> = {};
  for (const e of entries) byKind[e.kind!] = (byKind[e.kind!] ?? 0) + 1;
  const times = entries.map((e) => e.mtimeMs);
  const iso = (t: number) => new Date(t).toISOString();
  return { dir, exists: all !== null, entries: entries.length, bytes: entries.reduce((s, e) => s + e.bytes, 0), byKind,
    oldestUsedUtc: times.length ? iso(Math.min(...times)) : null, newestUsedUtc: times.length ? iso(Math.max(...times)) : null,
    temporaries: { count: temps.length, bytes: temps.reduce((s, e) => s + e.bytes, 0) } };
}

/** What {@link removeCacheEntries} removed. */
export interface CacheRemoval { entries: number; bytes: number; temporaries: number }

/**
 * Removes the entries (and leftover temporary files) of the cache folder
 * `dir` that were last used more than `olderThanMs` milliseconds before
 * `nowMs`, or all of them when `olderThanMs` is null. Other files stay.
 */
export function removeCacheEntries(dir: string, olderThanMs: number | null, nowMs = Date.now()): CacheRemoval {
  const out: CacheRemoval = { entries: 0, bytes: 0, temporaries: 0 };
  for (const i of items(dir) ?? []) {
    if (olderThanMs !== null && !(nowMs - i.mtimeMs > olderThanMs)) continue;
    try { unlinkSync(i.path); } catch { continue; }
    if (i.kind === null) out.temporaries++;
    else { out.entries++; out.bytes += i.bytes; }
  }
  return out;
}

const UNIT_MS: Record<string, number> = { s: 1e3, m: 60e3, h: 3600e3, d: 86400e3, w: 7 * 86400e3 };

/** Parses an age such as `90s`, `45m`, `12h`, `30d` or `2w` to milliseconds; null when it is not one. */
export function parseAgeMs(text: string): number | null {
  const m = /^\s*(\d+(?:\.\d+)?)\s*([smhdw])\s*$/.exec(text);
  return m ? Number(m[1]) * UNIT_MS[m[2]] : null;
}
