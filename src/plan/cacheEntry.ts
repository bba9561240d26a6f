/**
 * The bytes of one cache entry, and the checks a read makes before using
 * them. Layout (all integers little-endian):
 *
 *   0   8 bytes  magic `skyspanC`
 *   8   u32      format version (2)
 *   12  u32      header length H in bytes
 *   16  u64      length of the whole entry in bytes
 *   24  32 bytes SHA-256 (FIPS 180-4) of every byte from offset 56 to the end
 *   56  H bytes  header: JSON { kind, key, meta, arrays: [{ type, length }] }
 *   then the arrays' bytes, each starting on an 8-byte boundary.
 *
 * A read checks the length first (a truncated or extended entry), then the
 * checksum (a flipped byte anywhere after the preamble), then that the
 * header names the kind and key asked for (an entry copied or renamed from
 * another key) and that its arrays end exactly at the end of the entry.
 * SHA-256 rather than a faster 64-bit hash: Node ships it (no dependency),
 * it already keys the entries, and it costs 1 to 3 ms per MB, well
 * under what the entries take to compute (`npm run bench -- cache`).
 */
import { createHash } from 'node:crypto';

/** Typed arrays an entry can hold. */
export type EntryArray = Float32Array | Float64Array;

/** A decoded entry: metadata and typed arrays. */
export interface CacheEntry { meta: unknown; arrays: EntryArray[] }

const MAGIC = Buffer.from('skyspanC', 'latin1');
/** Format version written in each entry (and part of every key, so entries of older formats simply miss). */
export const ENTRY_FORMAT = 2;
const PREAMBLE = 56;
const align8 = (n: number) => Math.ceil(n / 8) * 8;

interface Header { kind: string; key: string; meta: unknown; arrays: { type: 'f32' | 'f64'; length: number }[] }

/** Encodes an entry as a list of byte chunks (the preamble first), ready for an atomic write. */
export function encodeEntry(kind: string, key: string, entry: CacheEntry): Uint8Array[] {
  const header: Header = { kind, key, meta: entry.meta,
    arrays: entry.arrays.map((a) => ({ type: a instanceof Float32Array ? 'f32' : 'f64', length: a.length })) };
  const head = Buffer.from(JSON.stringify(header), 'utf8');
  const body: Uint8Array[] = [head];
  let off = PREAMBLE + head.length;
  const pad = () => { const n = align8(off) - off; if (n) { body.push(new Uint8Array(n)); off += n; } };
  pad();
  for (const a of entry.arrays) {
    body.push(new Uint8Array(a.buffer, a.byteOffset, a.byteLength));
    off += a.byteLength;
    pad();
  }
  const hash = createHash('sha256');
  for (const c of body) hash.update(c);
  const pre = Buffer.alloc(PREAMBLE);
  MAGIC.copy(pre, 0);
  pre.writeUInt32LE(ENTRY_FORMAT, 8);
  pre.writeUInt32LE(head.length, 12);
  pre.writeBigUInt64LE(BigInt(off), 16);
  hash.digest().copy(pre, 24);
  return [pre, ...body];
}

/** Why an entry was refused, or the entry. `bytes` must start on an 8-byte boundary of its ArrayBuffer. */
export function decodeEntry(bytes: Uint8Array, kind: string, key: string): CacheEntry | { damaged: string } {
  if (bytes.length < PREAMBLE) return { damaged: `${bytes.length} bytes, shorter than the ${PREAMBLE}-byte preamble` };
  const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.length);
  if (!buf.subarray(0, 8).equals(MAGIC)) return { damaged: 'no skyspan cache entry marker' };
  if (buf.readUInt32LE(8) !== ENTRY_FORMAT) return { damaged: `format ${buf.readUInt32LE(8)}, expected ${ENTRY_FORMAT}` };
  const total = buf.readBigUInt64LE(16);
  if (total !== BigInt(buf.length)) return { damaged: `${buf.length} bytes, its preamble says ${total}` };
  const sum = createHash('sha256').update(buf.subarray(PREAMBLE)).digest();
  if (!sum.equals(buf.subarray(24, PREAMBLE))) return { damaged: 'checksum does not match its bytes' };
  const hl = buf.readUInt32LE(12);
  let head: Header;
  try {
    head = JSON.parse(buf.subarray(PREAMBLE, PREAMBLE + hl).toString('utf8')) as Header;
  } catch {
    return { damaged: 'header is not JSON' };
  }
  if (head.kind !== kind || head.key !== key) return { damaged: `holds ${head.kind} ${head.key}, not ${kind} ${key}` };
  let off = align8(PREAMBLE + hl);
  const arrays: EntryArray[] = [];
  for (const a of head.arrays) {
    const size = a.type === 'f32' ? 4 : 8;
    if (!Number.isSafeInteger(a.length) || a.length < 0 || off + a.length * size > buf.length) return { damaged: 'arrays run past the end' };
    const at = bytes.byteOffset + off;
    arrays.push(a.type === 'f32' ? new Float32Array(bytes.buffer, at, a.length) : new Float64Array(bytes.buffer, at, a.length));
    off = align8(off + a.length * size);
  }
  if (off !== buf.length) return { damaged: `arrays end at byte ${off} of ${buf.length}` };
  return { meta: head.meta, arrays };
}
