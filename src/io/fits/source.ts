/**
 * Loading a FITS file's bytes: plain, or gzip-compressed (detected by the
 * gzip magic bytes 1f 8b, RFC 1952 section 2.3.1, whatever the file name) and
 * inflated with node:zlib.
 */
import { readFileSync, statSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { constants as bufferConstants } from 'node:buffer';
import { InputError } from '../../core/errors.js';

/** True when the bytes start with the gzip magic number (RFC 1952). */
export function isGzip(bytes: Uint8Array): boolean {
  return bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b;
}

/** Largest decompressed size accepted, bounded by what a Buffer can hold. */
export const MAX_INFLATED_BYTES = Math.min(bufferConstants.MAX_LENGTH, 2 ** 33);

/**
 * Inflates a gzip stream; a cut-short or corrupted stream is an InputError.
 * `maxBytes` bounds the output so a small file cannot demand unbounded memory.
 */
export function gunzipFits(bytes: Uint8Array, file: string, maxBytes = MAX_INFLATED_BYTES): Buffer {
  try {
    return gunzipSync(bytes, { maxOutputLength: maxBytes });
  } catch (e) {
    const err = e as NodeJS.ErrnoException;
    const what = err.code === 'ERR_BUFFER_TOO_LARGE' ? `inflates to more than ${maxBytes} bytes`
      : `gzip stream is damaged or cut short (${err.message})`;
    throw new InputError(what, { file }, 'decompress it with gunzip to see whether the file is complete');
  }
}

/**
 * Reads a file's bytes, inflating gzip. The returned Buffer is owned by the
 * caller (the table reader may byte-swap it in place).
 */
export function loadFitsBytes(path: string): Buffer {
  let raw: Buffer;
  try {
    if (statSync(path).isDirectory()) throw Object.assign(new Error('is a directory'), { code: 'EISDIR' });
    raw = readFileSync(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code ?? (e as Error).message;
    throw new InputError(`cannot read the file (${code})`, { file: path }, 'check the path and permissions');
  }
  return isGzip(raw) ? gunzipFits(raw, path) : raw;
}
