/**
 * Loading a FITS file's bytes: plain, or gzip-compressed (detected by the
 * gzip magic bytes 1f 8b, RFC 1952 section 2.3.1, whatever the file name) and
 * inflated with node:zlib.
 */
import { gunzipSync } from 'node:zlib';
import { constants as bufferConstants } from 'node:buffer';
import { ComputeError, InputError } from '../../core/errors.js';
import { availableMemoryBytes, describeLimit } from '../../core/memory.js';
import { readInputBytes } from '../inputFile.js';

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
 * Inflates gzip bytes under the memory limit (core/memory.ts; `memoryLimitBytes`
 * overrides it): zlib stops as soon as the output would pass the limit less the
 * compressed bytes held, so a small file cannot decode to gigabytes first.
 */
export function gunzipWithinMemory(raw: Uint8Array, file: string, memoryLimitBytes?: number): Buffer {
  const limit = availableMemoryBytes(memoryLimitBytes);
  const budget = Math.max(0, Math.floor(limit.bytes - (limit.source === 'system' ? 0 : raw.length)));
  if (budget >= MAX_INFLATED_BYTES) return gunzipFits(raw, file);
  try {
    return gunzipSync(raw, { maxOutputLength: Math.max(1, budget) });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'ERR_BUFFER_TOO_LARGE') return gunzipFits(raw, file); // reports the damage
    throw new ComputeError(`inflating ${file} needs more than the ${describeLimit(limit)}, with its ${raw.length} compressed bytes held; ` +
      'decompress it where memory allows and lower its Nside (skyspan remap IN OUT --nside N)');
  }
}

/**
 * Reads a file's bytes (a regular file within the map cap, io/inputFile.ts),
 * inflating gzip within the memory limit. The returned Buffer is owned by the
 * caller (the table reader may byte-swap it in place).
 */
export function loadFitsBytes(path: string, memoryLimitBytes?: number): Buffer {
  const raw = readInputBytes(path, 'map');
  return isGzip(raw) ? gunzipWithinMemory(raw, path, memoryLimitBytes) : raw;
}
