/**
 * One pass over a file, front to back, in chunks: plain, or gzip-compressed
 * (detected by the magic bytes 1f 8b, RFC 1952 section 2.3.1) and inflated as
 * it streams. The SHA-256 (FIPS 180-4) of the file's own bytes (the
 * compressed bytes for a gzip file) is updated from the very chunks that are
 * decoded, so provenance never reads a file a second time.
 */
import { createHash, type Hash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { pipeline, Readable } from 'node:stream';
import { createGunzip } from 'node:zlib';
import { InputError } from '../../core/errors.js';
import { openInput } from '../inputFile.js';

/** Bytes per chunk read from the disk. */
const CHUNK_BYTES = 4 << 20;

async function* rawChunks(path: string, hash: Hash, counter: { raw: number }): AsyncGenerator<Buffer> {
  const { fd } = openInput(path, 'streamed map'); // a regular file, checked before any byte is read
  const s = createReadStream(path, { fd, highWaterMark: CHUNK_BYTES, autoClose: true });
  try {
    for await (const c of s) {
      hash.update(c as Buffer);
      counter.raw += (c as Buffer).length;
      yield c as Buffer;
    }
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code ?? (e as Error).message;
    throw new InputError(`cannot read the file (${code})`, { file: path }, 'check the path and permissions');
  }
}

async function* fileChunks(path: string, hash: Hash, counter: { raw: number; gzip: boolean }): AsyncGenerator<Buffer> {
  const raw = rawChunks(path, hash, counter);
  const first = await raw.next();
  if (first.done) return;
  if (!(first.value.length >= 2 && first.value[0] === 0x1f && first.value[1] === 0x8b)) {
    yield first.value;
    yield* raw;
    return;
  }
  counter.gzip = true;
  const gz = createGunzip();
  const src = Readable.from((async function* () { yield first.value; yield* raw; })());
  pipeline(src, gz, (err) => { if (err) gz.destroy(err); });
  try {
    for await (const c of gz) yield c as Buffer;
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(`gzip stream is damaged or cut short (${(e as Error).message})`, { file: path },
      'decompress it with gunzip to see whether the file is complete');
  }
}

/**
 * A forward-only reader of a file's (decompressed) bytes. `offset` counts the
 * bytes handed out so far; {@link ByteStream.finish} reads what is left and
 * returns the file's SHA-256.
 */
export class ByteStream {
  /** Bytes of the (decompressed) stream consumed so far. */
  offset = 0;
  private readonly hash = createHash('sha256');
  private readonly counter = { raw: 0, gzip: false };
  private readonly chunks: AsyncGenerator<Buffer>;
  private cur: Buffer = Buffer.alloc(0);
  private pos = 0;
  private done = false;

  constructor(readonly file: string) {
    this.chunks = fileChunks(file, this.hash, this.counter);
  }

  /** True when the file was gzip-compressed (known after the first read). */
  get gzip(): boolean { return this.counter.gzip; }

  /** Bytes of the file itself read so far (compressed bytes for gzip). */
  get rawBytes(): number { return this.counter.raw; }

  private async fill(): Promise<boolean> {
    while (this.pos >= this.cur.length) {
      if (this.done) return false;
      const n = await this.chunks.next();
      if (n.done) { this.done = true; return false; }
      this.cur = n.value;
      this.pos = 0;
    }
    return true;
  }

  /**
   * Copies the next `n` bytes into `into` (from its start) and returns how
   * many were copied: fewer than `n` only at the end of the stream.
   */
  async readInto(into: Uint8Array, n: number): Promise<number> {
    let got = 0;
    while (got < n && await this.fill()) {
      const take = Math.min(n - got, this.cur.length - this.pos);
      into.set(this.cur.subarray(this.pos, this.pos + take), got);
      this.pos += take;
      got += take;
    }
    this.offset += got;
    return got;
  }

  /** The next `n` bytes, or an InputError naming `what` when the stream ends first. */
  async readExact(n: number, what: string): Promise<Buffer> {
    const out = Buffer.allocUnsafe(n);
    const got = await this.readInto(out, n);
    if (got < n) throw this.truncated(what, n - got);
    return out;
  }

  /** Skips `n` bytes; returns how many were skipped (fewer only at the end). */
  async skip(n: number): Promise<number> {
    let got = 0;
    while (got < n && await this.fill()) {
      const take = Math.min(n - got, this.cur.length - this.pos);
      this.pos += take;
      got += take;
    }
    this.offset += got;
    return got;
  }

  /** True when no byte is left. */
  async atEnd(): Promise<boolean> {
    return !(await this.fill());
  }

  /** The error for a stream that ends `missing` bytes before `what` is complete. */
  truncated(what: string, missing: number): InputError {
    return new InputError(`the file ends ${missing} bytes before the end of ${what}`, { file: this.file, byteOffset: this.offset },
      'the file is truncated or its NAXISn values are wrong');
  }

  /** Reads the rest of the file (so the hash covers every byte) and returns its SHA-256 as 64 hex digits. */
  async finish(): Promise<string> {
    while (await this.fill()) { this.offset += this.cur.length - this.pos; this.pos = this.cur.length; }
    return this.hash.digest('hex');
  }

  /** Stops reading early (on an error) and releases the file. */
  async close(): Promise<void> {
    this.done = true;
    await this.chunks.return(undefined);
  }
}
