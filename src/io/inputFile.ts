/**
 * Opening an input file, the one way every reader does it: the path is opened
 * without blocking (O_NONBLOCK, so a FIFO cannot hang the open), checked with
 * fstat to be a regular file no larger than a stated cap, and only then read.
 * A FIFO, a character device (/dev/zero), a socket or a directory is refused
 * in one line before any byte is read; so is a file over the cap.
 *
 * Caps: text inputs (CSV, YAML, JSON) {@link TEXT_INPUT_CAP_BYTES}; map files
 * (FITS, plain or gzip) {@link MAP_INPUT_CAP_BYTES}, the most a Buffer holds.
 * Map reading then also checks the memory limit (core/memory.ts). A streamed
 * map (read in row blocks, never held whole) has no size cap.
 */
import { closeSync, constants, fstatSync, openSync, readSync, type Stats } from 'node:fs';
import { constants as bufferConstants } from 'node:buffer';
import { InputError, type InputLocation } from '../core/errors.js';
import { formatBytes } from '../core/memory.js';

/** Largest text input read (CSV, YAML, JSON): 256 MiB, well under V8's longest string (about 512 MiB). */
export const TEXT_INPUT_CAP_BYTES = 256 * 2 ** 20;

/** Largest map file read (FITS, plain or gzip): the most a Node Buffer holds (4 GiB on Node 20), at most 8 GiB. */
export const MAP_INPUT_CAP_BYTES = Math.min(bufferConstants.MAX_LENGTH, 2 ** 33);

/** What kind of file an input is, for its cap and messages. */
export type InputKind = 'text' | 'map' | 'streamed map';

function kindOf(s: Stats): string {
  if (s.isDirectory()) return 'a directory';
  if (s.isFIFO()) return 'a FIFO (named pipe)';
  if (s.isCharacterDevice()) return 'a character device';
  if (s.isBlockDevice()) return 'a block device';
  if (s.isSocket()) return 'a socket';
  return 'not a regular file';
}

/**
 * Opens `path` for reading and checks it (see the module doc); returns the
 * open descriptor and the file's size in bytes. The caller closes the
 * descriptor. `where` locates the error (default: the file itself).
 */
export function openInput(path: string, kind: InputKind, where: InputLocation = { file: path }): { fd: number; sizeBytes: number } {
  const named = where.file === path ? 'the file' : path;
  let fd: number;
  try {
    fd = openSync(path, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code ?? String(e);
    throw new InputError(`cannot read ${named} (${code})`, where, 'check the path and permissions');
  }
  try {
    const s = fstatSync(fd);
    if (!s.isFile()) {
      throw new InputError(`${where.file === path ? 'is' : `${path} is`} ${kindOf(s)}, not a regular file`, where,
        s.isDirectory() ? 'give the path of a file inside it' : 'skyspan reads inputs only from regular files; save the data to a file first');
    }
    const cap = kind === 'text' ? TEXT_INPUT_CAP_BYTES : kind === 'map' ? MAP_INPUT_CAP_BYTES : Infinity;
    if (s.size > cap) {
      throw new InputError(`${where.file === path ? 'is' : `${path} is`} ${formatBytes(s.size)}, more than the ${formatBytes(cap)} cap for ${kind === 'text' ? 'text inputs' : 'map files'}`,
        where, kind === 'text' ? 'this is not a table or settings file skyspan can use; check the path' : 'lower its Nside or split it into one map column per file');
    }
    return { fd, sizeBytes: s.size };
  } catch (e) {
    closeSync(fd);
    throw e;
  }
}

/** Reads a checked input's bytes (see {@link openInput}); the Buffer is the caller's to change. */
export function readInputBytes(path: string, kind: InputKind, where: InputLocation = { file: path }): Buffer {
  const { fd, sizeBytes } = openInput(path, kind, where);
  try {
    const buf = Buffer.allocUnsafe(sizeBytes);
    let got = 0;
    while (got < sizeBytes) {
      const n = readSync(fd, buf, got, Math.min(sizeBytes - got, 2 ** 30), got);
      if (n === 0) break; // the file shrank while being read
      got += n;
    }
    return got === sizeBytes ? buf : buf.subarray(0, got);
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(`cannot read ${where.file === path ? 'the file' : path} (${(e as NodeJS.ErrnoException).code ?? String(e)})`, where);
  } finally {
    closeSync(fd);
  }
}

/** Reads a checked text input as UTF-8 (see {@link openInput}). */
export function readInputText(path: string, where: InputLocation = { file: path }): string {
  return readInputBytes(path, 'text', where).toString('utf8');
}
