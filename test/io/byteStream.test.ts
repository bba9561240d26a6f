/**
 * The forward-only reader of io/fits/byteStream.ts: chunks are read into a ring
 * of two reused buffers, so a bug in the reuse would hand out bytes of a later
 * chunk. Checked with small chunks against the file's own bytes and against
 * Node's SHA-256 of the whole file (FIPS 180-4, node:crypto); the gzip variant
 * against gzip of the same bytes (RFC 1952, node:zlib).
 */
import { createHash, randomBytes } from 'node:crypto';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ByteStream } from '../../src/io/fits/byteStream.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-bytestream-');
const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

async function readAll(file: string, chunkBytes: number, pieces: number[], length: number): Promise<{ bytes: Uint8Array; sha256: string }> {
  const s = new ByteStream(file, chunkBytes);
  const out = new Uint8Array(length);
  let at = 0, k = 0;
  try {
    while (at < length) {
      const want = Math.min(pieces[k++ % pieces.length], length - at);
      if (k % 3 === 0) { at += await s.skip(want); continue; } // skipped bytes stay 0 in out
      const got = await s.readInto(out.subarray(at), want);
      if (got === 0) break;
      at += got;
    }
    return { bytes: out, sha256: await s.finish() };
  } finally {
    await s.close();
  }
}

describe('ByteStream over a ring of reused buffers', () => {
  it('hands out every byte in order and hashes the whole file, plain and gzip, for any chunk and read sizes', async () => {
    const data = randomBytes(20_000);
    const plain = join(dir, 'data.bin'), gz = join(dir, 'data.bin.gz');
    writeFileSync(plain, data);
    writeFileSync(gz, gzipSync(data));
    const gzBytes = gzipSync(data);
    await fc.assert(fc.asyncProperty(fc.integer({ min: 1, max: 9000 }), fc.array(fc.integer({ min: 1, max: 7000 }), { minLength: 1, maxLength: 6 }), async (chunk, pieces) => {
      for (const [file, raw] of [[plain, data], [gz, gzBytes]] as const) {
        const r = await readAll(file, chunk, pieces, data.length);
        const expected = Uint8Array.from(data);
        let at = 0, k = 0; // zero the skipped ranges as readAll did
        while (at < data.length) {
          const want = Math.min(pieces[k++ % pieces.length], data.length - at);
          if (k % 3 === 0) expected.fill(0, at, at + want);
          at += want;
        }
        expect(Buffer.from(r.bytes).equals(Buffer.from(expected))).toBe(true);
        expect(r.sha256).toBe(sha(raw));
      }
    }), { seed: 5, numRuns: 30 });
  });

  it('an empty file gives no bytes and the SHA-256 of nothing', async () => {
    const empty = join(dir, 'empty.bin');
    writeFileSync(empty, new Uint8Array(0));
    const s = new ByteStream(empty, 16);
    expect(await s.atEnd()).toBe(true);
    expect(await s.finish()).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855'); // SHA-256 of the empty string (FIPS 180-4 examples)
    await s.close();
  });
});
