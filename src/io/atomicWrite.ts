/**
 * Nothing is lost: every output goes to a temporary file in the destination's
 * folder and is renamed into place only when complete. An existing file is
 * replaced only with `force`; a path that is also an input is refused.
 */
import { closeSync, existsSync, fsyncSync, lstatSync, mkdirSync, openSync, renameSync, rmSync, unlinkSync, writeSync, realpathSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError } from '../core/errors.js';

/** Options of {@link writeFileAtomic}. */
export interface AtomicWriteOptions {
  /** Replace an existing file (default false: refuse). */
  force?: boolean;
  /** Paths that are inputs of the current job; writing over one is refused. */
  inputs?: readonly string[];
}

const pending = new Set<string>();
const trackedOutputs = new Map<string, string>();
const finished: string[] = [];

/** A temporary file starts, becomes its output (`finish`) or is deleted after a failure (`abandon`). */
export interface TemporaryFileEvent { kind: 'start' | 'finish' | 'abandon'; temporary: string; output: string }
let listener: ((e: TemporaryFileEvent) => void) | null = null;

/**
 * Sets (or clears with null) the function told of every temporary file's
 * start, finish and abandonment; the CLI uses it to report a command running
 * in a worker thread to the thread that handles SIGINT/SIGTERM.
 */
export function onTemporaryFileEvent(fn: ((e: TemporaryFileEvent) => void) | null): void {
  listener = fn;
}

/** Outputs completed (renamed into place) by this process so far, in order. */
export function finishedOutputs(): string[] {
  return [...finished];
}

/** Temporary files not yet renamed, for the interrupt handler to delete. */
export function pendingTemporaryFiles(): string[] {
  return [...pending];
}

/** Deletes every temporary file (or staging folder) still pending (called on SIGINT/SIGTERM). */
export function removePendingTemporaryFiles(): void {
  for (const p of pending) {
    try { removeTemporary(p, trackedOutputs.get(p)); } catch { /* already gone */ }
    pending.delete(p);
  }
}

/**
 * Records a temporary made outside {@link writeFileAtomic} (a staging folder,
 * see atomicFolder.ts) so that SIGINT/SIGTERM removes it: `start` when
 * created, `finish` once renamed into place as `output`, `abandon` once removed.
 */
export function trackTemporary(kind: TemporaryFileEvent['kind'], temporary: string, output: string): void {
  if (kind === 'start') { pending.add(temporary); trackedOutputs.set(temporary, output); }
  else { pending.delete(temporary); trackedOutputs.delete(temporary); }
  if (kind === 'finish') finished.push(output);
  listener?.({ kind, temporary, output });
}

/**
 * Removes a temporary file, or a staging folder `<x>.tmp` with everything in
 * it; throws (like unlink) when it is gone already, i.e. it became its output.
 * A staging folder is first renamed aside, so a concurrent rename into place
 * either happened before (and this throws) or cannot happen. The previous
 * output folder set aside as `<x>.old` (atomicFolder.ts) is put back when the
 * output is missing, and deleted when the new output is in place.
 */
export function removeTemporary(tmp: string, output?: string): void {
  const old = tmp.replace(/\.tmp$/, '.old');
  const dropOld = () => { if (old !== tmp && output && existsSync(output)) try { rmSync(old, { recursive: true, force: true }); } catch { /* harmless leftover */ } };
  let claimed: string;
  try {
    if (!lstatSync(tmp).isDirectory()) { unlinkSync(tmp); return; }
    claimed = `${tmp}.removing`;
    renameSync(tmp, claimed);
  } catch (e) {
    dropOld();
    throw e;
  }
  if (output && !existsSync(output) && existsSync(old)) try { renameSync(old, output); } catch { /* the writer put it back */ }
  rmSync(claimed, { recursive: true, force: true });
}

function samePath(a: string, b: string): boolean {
  const ra = resolve(a), rb = resolve(b);
  if (ra === rb) return true;
  try { return realpathSync(ra) === realpathSync(rb); } catch { return false; }
}

/** Throws unless `path` may be written under the given options. */
export function checkWritable(path: string, options: AtomicWriteOptions = {}): void {
  for (const input of options.inputs ?? []) {
    if (samePath(path, input)) {
      throw new InputError('is an input of this job and is never overwritten', { file: path }, 'choose another output path');
    }
  }
  if (!options.force && existsSync(path)) {
    throw new InputError('exists already', { file: path }, 'pass --force to replace it, or choose another output path');
  }
}

/**
 * Writes `data` (bytes, a string as UTF-8, or a sequence of byte chunks) to
 * `path` through a temporary file in the same folder and a rename.
 * `writer` is injectable so tests can simulate a failing disk.
 */
export function writeFileAtomic(
  path: string,
  data: Uint8Array | string | Iterable<Uint8Array>,
  options: AtomicWriteOptions & { writer?: (fd: number, chunk: Uint8Array) => void } = {},
): void {
  checkWritable(path, options);
  const dir = dirname(path);
  const tmp = join(dir, `.${basename(path)}.${process.pid}.${Date.now().toString(36)}.tmp`);
  const write = options.writer ?? writeAll;
  // Announced before the file exists, so an interrupt handler in another thread knows it
  // by the time it can be seen on disk.
  pending.add(tmp);
  listener?.({ kind: 'start', temporary: tmp, output: path });
  let fd: number;
  try {
    fd = openSync(tmp, 'wx');
  } catch (e) {
    pending.delete(tmp);
    listener?.({ kind: 'abandon', temporary: tmp, output: path });
    throw new InputError(`cannot write here: ${(e as NodeJS.ErrnoException).code ?? String(e)}`, { file: path },
      'check that the folder exists and is writable');
  }
  try {
    const chunks: Iterable<Uint8Array> = typeof data === 'string' ? [Buffer.from(data, 'utf8')]
      : data instanceof Uint8Array ? [data] : data;
    for (const c of chunks) write(fd, c);
    fsyncSync(fd);
    closeSync(fd);
    renameSync(tmp, path);
    pending.delete(tmp);
    finished.push(path);
    listener?.({ kind: 'finish', temporary: tmp, output: path });
  } catch (e) {
    try { closeSync(fd); } catch { /* closed */ }
    try { unlinkSync(tmp); } catch { /* gone */ }
    pending.delete(tmp);
    listener?.({ kind: 'abandon', temporary: tmp, output: path });
    if (e instanceof InputError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    throw new InputError(`writing failed: ${code ?? (e as Error).message}`, { file: path },
      (code === 'ENOSPC' || code === 'EDQUOT' ? 'free disk space or choose another folder' : 'choose another folder')
      + '; earlier outputs are intact');
  }
}

/** Most bytes handed to one write(2): writeSync refuses a length over 2^31 - 1 (ERR_OUT_OF_RANGE). */
export const WRITE_PIECE_BYTES = 2 ** 30;

/** Writes all of `chunk` at the descriptor's position, in pieces of at most {@link WRITE_PIECE_BYTES}. */
export function writeAll(fd: number, chunk: Uint8Array): void {
  let off = 0;
  while (off < chunk.length) off += writeSync(fd, chunk, off, Math.min(chunk.length - off, WRITE_PIECE_BYTES));
}

/**
 * Creates an output folder (and its parents) when missing. A path that cannot
 * be a folder (under a regular file, no permission) is an {@link InputError}
 * naming the folder, not a stack trace.
 */
export function ensureOutputFolder(dir: string): void {
  try {
    mkdirSync(dir, { recursive: true });
  } catch (e) {
    throw new InputError(`cannot create the output folder: ${(e as NodeJS.ErrnoException).code ?? String(e)}`, { file: dir },
      'choose a folder you can write to');
  }
}
