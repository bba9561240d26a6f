/**
 * One pass over a file, front to back, in chunks: plain, or gzip-compressed
 * (detected by the magic bytes 1f 8b, RFC 1952 section 2.3.1) and inflated as
 * it streams. The SHA-256 (FIPS 180-4) of the file's own bytes (the
 * compressed bytes for a gzip file) is updated from the very chunks that are
 * decoded, so provenance never reads a file a second time. (Hashing on a
 * second thread was measured and gave nothing: the whole factor job took
 * 1.06 s either way, the thread's start-up eating what the overlap saved.)
 */
import { createHash, type Hash } from 'node:crypto';
import { closeSync, fstatSync, read } from 'node:fs';
import { pipeline, Readable } from 'node:stream';
import { createGunzip } from 'node:zlib';
import { InputError } from '../../core/errors.js';
import { openInput } from '../inputFile.js';

/** Bytes per chunk read from the disk (default). */
const CHUNK_BYTES = 1 << 20;
/** Buffers in the ring: one being decoded, one being read ahead. */
const RING = 2;

/** What the reading has found so far, and the hash of the bytes read. */
interface ReadState { raw: number; gzip: boolean; hash: Hash }

function readAt(fd: number, into: Uint8Array, position: number): Promise<number> {
  return new Promise((resolve, reject) => read(fd, into, 0, into.length, position, (err, n) => (err ? reject(err) : resolve(n))));
}

/**
 * The file's bytes in chunks read into a ring of reused buffers, one read
 * ahead of the consumer (a fresh buffer per chunk costs more in page faults
 * than the read itself: measured 0.21 s of page faults for a 201 MB file on
 * the 2-core machine). A chunk handed out stays valid until the consumer asks
 * for the next one; each is hashed before it is handed out.
 */
async function* rawChunks(path: string, state: ReadState, chunkBytes: number): AsyncGenerator<Buffer> {
  const { fd } = openInput(path, 'streamed map'); // a regular file, checked before any byte is read
  let next: Promise<number> | null = null;
  try {
    const size = fstatSync(fd).size;
    const bytes = Math.max(2, Math.min(chunkBytes, size)); // at least the two bytes of the gzip magic in the first chunk
    const ring = Array.from({ length: RING }, () => Buffer.allocUnsafe(bytes));
    let slot = 0, position = 0;
    next = readAt(fd, ring[0], 0);
    for (;;) {
      const n: number = await next;
      next = null;
      if (n === 0) break;
      const chunk = ring[slot].subarray(0, n);
      state.hash.update(chunk);
      state.raw += n;
      position += n;
      const following = (slot + 1) % RING;
      next = readAt(fd, ring[following], position);
      yield chunk;
      slot = following;
    }
  } catch (e) {
    if (e instanceof InputError) throw e;
    const code = (e as NodeJS.ErrnoException).code ?? (e as Error).message;
    throw new InputError(`cannot read the file (${code})`, { file: path }, 'check the path and permissions');
  } finally {
    if (next) await next.catch(() => 0);
    closeSync(fd);
  }
}

async function* fileChunks(path: string, state: ReadState, chunkBytes: number): AsyncGenerator<Buffer> {
  const raw = rawChunks(path, state, chunkBytes);
  const first = await raw.next();
  if (first.done) return;
  if (!(first.value.length >= 2 && first.value[0] === 0x1f && first.value[1] === 0x8b)) {
    yield first.value;
    yield* raw;
    return;
  }
  state.gzip = true;
  const gz = createGunzip();
  // The inflater may hold a chunk after asking for the next one, and the ring reuses its buffers: give it copies.
  const src = Readable.from((async function* () { yield Buffer.from(first.value); for await (const c of raw) yield Buffer.from(c); })());
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
  private readonly state: ReadState = { raw: 0, gzip: false, hash: createHash('sha256') };
  private readonly chunks: AsyncGenerator<Buffer>;
  private cur: Buffer = Buffer.alloc(0);
  private pos = 0;
  private done = false;

  /** `chunkBytes`: bytes read from the disk at a time (default 1 MiB; tests use small ones to cross many chunk ends). */
  constructor(readonly file: string, chunkBytes = CHUNK_BYTES) {
    this.chunks = fileChunks(file, this.state, chunkBytes);
  }

  /** True when the file was gzip-compressed (known after the first read). */
  get gzip(): boolean { return this.state.gzip; }

  /** Bytes of the file itself read so far (compressed bytes for gzip). */
  get rawBytes(): number { return this.state.raw; }

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
    return this.state.hash.digest('hex');
  }

  /** Stops reading early (on an error) and releases the file. */
  async close(): Promise<void> {
    this.done = true;
    await this.chunks.return(undefined);
  }
}
