/**
 * A content-addressed cache of expensive intermediates of a run (built
 * templates, survival maps, region weights at an Nside). An entry's key is
 * the SHA-256 (FIPS 180-4) of everything it depends on — the skyspan
 * version, the kind, the parameters and the hashes of the input files —
 * so a changed input simply misses and a stale entry is never used.
 * Entries are files `<kind>-<key>.bin` in the cache folder: a 4-byte
 * little-endian header length, a JSON header (metadata and array types and
 * lengths), then the arrays' bytes, each 8-byte aligned. Written through
 * writeFileAtomic, so an interrupted write leaves no partial entry.
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ensureOutputFolder, writeFileAtomic } from '../io/atomicWrite.js';
import { VERSION } from '../version.js';

/** A cached entry: metadata and typed arrays. */
export interface CacheEntry { meta: unknown; arrays: (Float32Array | Float64Array)[] }

/** Counts of what the cache did during a run, by entry name. */
export interface CacheStats { dir: string | null; hits: string[]; misses: string[]; stored: string[] }

/** Stable JSON (object keys sorted) for hashing. */
export function stableJson(v: unknown): string {
  if (v === null || typeof v !== 'object') return JSON.stringify(v) ?? 'null';
  if (ArrayBuffer.isView(v)) return stableJson(Array.from(v as unknown as ArrayLike<number>));
  if (Array.isArray(v)) return `[${v.map(stableJson).join(',')}]`;
  const o = v as Record<string, unknown>;
  return `{${Object.keys(o).sort().map((k) => `${JSON.stringify(k)}:${stableJson(o[k])}`).join(',')}}`;
}

/** The cache (a folder, or null for none: every lookup misses and nothing is stored). */
export class ArtefactCache {
  readonly stats: CacheStats;
  constructor(readonly dir: string | null) {
    this.stats = { dir, hits: [], misses: [], stored: [] };
  }

  /** The key of an entry: SHA-256 of the version, the kind and the stable JSON of `parts`. */
  key(kind: string, parts: unknown): string {
    return createHash('sha256').update(`skyspan ${VERSION}\n${kind}\n${stableJson(parts)}`).digest('hex');
  }

  private path(kind: string, key: string): string {
    return join(this.dir!, `${kind}-${key}.bin`);
  }

  /** The entry, or null when absent (or the cache is off, or the entry is unreadable). */
  get(kind: string, key: string, label: string): CacheEntry | null {
    if (!this.dir) { this.stats.misses.push(label); return null; }
    const p = this.path(kind, key);
    if (!existsSync(p)) { this.stats.misses.push(label); return null; }
    try {
      const buf = readFileSync(p);
      const hl = buf.readUInt32LE(0);
      const head = JSON.parse(buf.subarray(4, 4 + hl).toString('utf8')) as { meta: unknown; arrays: { type: 'f32' | 'f64'; length: number }[] };
      let off = 4 + hl;
      off = Math.ceil(off / 8) * 8;
      const arrays = head.arrays.map((a) => {
        const bytes = a.type === 'f32' ? 4 : 8;
        const copy = new Uint8Array(a.length * bytes);
        copy.set(buf.subarray(off, off + a.length * bytes));
        off = Math.ceil((off + a.length * bytes) / 8) * 8;
        return a.type === 'f32' ? new Float32Array(copy.buffer) : new Float64Array(copy.buffer);
      });
      this.stats.hits.push(label);
      return { meta: head.meta, arrays };
    } catch {
      this.stats.misses.push(label);
      return null;
    }
  }

  /** Stores an entry (no-op when the cache is off). */
  put(kind: string, key: string, label: string, entry: CacheEntry): void {
    if (!this.dir) return;
    ensureOutputFolder(this.dir);
    const head = Buffer.from(JSON.stringify({ meta: entry.meta,
      arrays: entry.arrays.map((a) => ({ type: a instanceof Float32Array ? 'f32' : 'f64', length: a.length })) }), 'utf8');
    const chunks: Uint8Array[] = [];
    const len = Buffer.alloc(4); len.writeUInt32LE(head.length, 0);
    chunks.push(len, head);
    let off = 4 + head.length;
    const pad = () => { const n = Math.ceil(off / 8) * 8 - off; if (n) { chunks.push(new Uint8Array(n)); off += n; } };
    pad();
    for (const a of entry.arrays) {
      chunks.push(new Uint8Array(a.buffer, a.byteOffset, a.byteLength));
      off += a.byteLength;
      pad();
    }
    writeFileAtomic(this.path(kind, key), chunks, { force: true });
    this.stats.stored.push(label);
  }
}
