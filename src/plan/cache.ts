/**
 * A content-addressed cache of expensive intermediates of a run (built
 * templates, their survival maps, region weights at an Nside). An entry's
 * key is the SHA-256 (FIPS 180-4) of everything it depends on — the skyspan
 * version, the entry format, the kind, the parameters and the hashes of the
 * input files — so a changed input simply misses and a stale entry is never
 * used. Entries are files `<kind>-<key>.bin` in the cache folder (layout and
 * checks in cacheEntry.ts): every read verifies the entry's length,
 * checksum, kind and key; an entry that fails is deleted, noted in
 * `stats.discarded`, and the caller recomputes and stores it again. Written
 * through writeFileAtomic (temporary file and rename), so a killed run
 * leaves at most a `.tmp` file that is never read as an entry, and
 * concurrent runs sharing the folder each see whole entries.
 */
import { createHash } from 'node:crypto';
import { closeSync, fstatSync, openSync, readSync, unlinkSync, utimesSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ensureOutputFolder, writeFileAtomic } from '../io/atomicWrite.js';
import { VERSION } from '../version.js';
import { decodeEntry, encodeEntry, ENTRY_FORMAT, type CacheEntry } from './cacheEntry.js';

export type { CacheEntry } from './cacheEntry.js';

/** What the cache did during a run: entry labels hit, missed and stored; entry files discarded as damaged; other notes. */
export interface CacheStats { dir: string | null; hits: string[]; misses: string[]; stored: string[]; discarded: string[]; notes: string[] }

/** The one-line note for a discarded entry. */
export function discardNote(file: string): string {
  return `cache: discarded damaged entry ${file}, recomputed`;
}

/** Stable JSON (object keys sorted) for hashing. */
export function stableJson(v: unknown): string {
  if (v === null || typeof v !== 'object') return JSON.stringify(v) ?? 'null';
  if (ArrayBuffer.isView(v)) return stableJson(Array.from(v as unknown as ArrayLike<number>));
  if (Array.isArray(v)) return `[${v.map(stableJson).join(',')}]`;
  const o = v as Record<string, unknown>;
  return `{${Object.keys(o).sort().map((k) => `${JSON.stringify(k)}:${stableJson(o[k])}`).join(',')}}`;
}

/** Reads a whole file into a fresh ArrayBuffer (offset 0, so typed views of it are aligned). */
function readWhole(path: string): Uint8Array {
  const fd = openSync(path, 'r');
  try {
    const size = fstatSync(fd).size;
    const bytes = new Uint8Array(size);
    let off = 0;
    while (off < size) {
      const n = readSync(fd, bytes, off, size - off, off);
      if (n === 0) break;
      off += n;
    }
    return off === size ? bytes : bytes.subarray(0, off);
  } finally {
    closeSync(fd);
  }
}

/** Content of the cache-folder tag (Cache Directory Tagging Specification, B. Ford; the signature line from memory) that backup tools skip. */
const CACHE_TAG = 'Signature: 8a477f597d28d172789f06886806bc55\n# This file marks a skyspan cache folder (skyspan cache --help).\n';

/** The cache (a folder, or null for none: every lookup misses and nothing is stored). */
export class ArtefactCache {
  readonly stats: CacheStats;
  constructor(readonly dir: string | null) {
    this.stats = { dir, hits: [], misses: [], stored: [], discarded: [], notes: [] };
  }

  /** The key of an entry: SHA-256 of the version, the entry format, the kind and the stable JSON of `parts`. */
  key(kind: string, parts: unknown): string {
    return createHash('sha256').update(`skyspan ${VERSION} cache ${ENTRY_FORMAT}\n${kind}\n${stableJson(parts)}`).digest('hex');
  }

  /** Path of the entry file of `kind` and `key`. */
  path(kind: string, key: string): string {
    return join(this.dir!, `${kind}-${key}.bin`);
  }

  /**
   * The entry, or null when absent or the cache is off. An entry that
   * cannot be read or fails a check is deleted and listed in
   * `stats.discarded`; the caller recomputes it and calls {@link put}.
   */
  get(kind: string, key: string, label: string): CacheEntry | null {
    if (!this.dir) { this.stats.misses.push(label); return null; }
    const p = this.path(kind, key);
    let bytes: Uint8Array;
    try {
      bytes = readWhole(p);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'ENOENT') this.discard(p);
      this.stats.misses.push(label);
      return null;
    }
    const entry = decodeEntry(bytes, kind, key);
    if ('damaged' in entry) {
      this.discard(p);
      this.stats.misses.push(label);
      return null;
    }
    try { const now = new Date(); utimesSync(p, now, now); } catch { /* age of use is a convenience */ }
    this.stats.hits.push(label);
    return entry;
  }

  private discard(p: string): void {
    try { unlinkSync(p); } catch { /* gone, or a folder: the rewrite replaces or reports it */ }
    if (!this.stats.discarded.includes(p)) this.stats.discarded.push(p);
  }

  /** Stores an entry (no-op when the cache is off). A failed store is a note, not a failure of the run. */
  put(kind: string, key: string, label: string, entry: CacheEntry): void {
    if (!this.dir) return;
    try {
      ensureOutputFolder(this.dir);
      try { writeFileSync(join(this.dir, 'CACHEDIR.TAG'), CACHE_TAG, { flag: 'wx' }); } catch { /* present already */ }
      writeFileAtomic(this.path(kind, key), encodeEntry(kind, key, entry), { force: true });
      this.stats.stored.push(label);
    } catch (e) {
      const note = `cache: could not store ${label}: ${(e as Error).message}`;
      if (!this.stats.notes.includes(note)) this.stats.notes.push(note);
    }
  }
}
