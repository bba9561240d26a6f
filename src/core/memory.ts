/**
 * Memory estimates made before the big allocations: a HEALPix map of Nside N
 * holds 12 N^2 pixels per plane (Gorski et al. 2005, ApJ 622, 759, eq. 2),
 * each of 4 (float32) or 8 (float64) bytes. A job that would need more than
 * the memory available is refused with a clear message naming the estimate
 * and the way to need less, instead of failing half-way or swapping.
 *
 * The limit is, in order: an explicit `limitBytes`, the environment variable
 * SKYSPAN_MEMORY_LIMIT_BYTES (a positive number of bytes), else what the
 * system reports available now (os.freemem, capped by the process's
 * constrained memory, e.g. a cgroup limit).
 */
import { freemem } from 'node:os';
import { ComputeError, InputError } from './errors.js';

/** Environment variable that caps the memory skyspan assumes it may use (bytes). */
export const MEMORY_LIMIT_ENV = 'SKYSPAN_MEMORY_LIMIT_BYTES';

/**
 * Bytes held by `planes` full-sky planes at `nside` with `bytesPerValue`
 * bytes per pixel (12 nside^2 pixels per plane), times `copies` (1 + the
 * number of working arrays of the same size the job keeps at its peak).
 * Valid for any positive nside, planes, bytesPerValue and copies.
 */
export function estimateMapBytes(nside: number, planes: number, bytesPerValue: number, copies = 1): number {
  return 12 * nside * nside * planes * bytesPerValue * copies;
}

/** Where the limit of {@link availableMemoryBytes} came from, for messages. */
export interface MemoryLimit { bytes: number; source: 'option' | 'environment' | 'system' }

/**
 * The memory a job may use, in bytes, and where that figure came from (see the
 * module doc). Throws an InputError when SKYSPAN_MEMORY_LIMIT_BYTES is set
 * but is not a positive number.
 */
export function availableMemoryBytes(limitBytes?: number, env: NodeJS.ProcessEnv = process.env): MemoryLimit {
  if (limitBytes !== undefined) return { bytes: limitBytes, source: 'option' };
  const text = env[MEMORY_LIMIT_ENV];
  if (text !== undefined && text.trim() !== '') {
    const v = Number(text);
    if (!(v > 0) || !Number.isFinite(v)) {
      throw new InputError(`is '${text}', expected a positive number of bytes`, { keyPath: MEMORY_LIMIT_ENV },
        'unset it to use the memory the system reports available');
    }
    return { bytes: v, source: 'environment' };
  }
  const constrained = typeof process.constrainedMemory === 'function' ? process.constrainedMemory() ?? 0 : 0;
  const free = freemem();
  return { bytes: constrained > 0 ? Math.min(constrained, free) : free, source: 'system' };
}

/** Human-readable byte count (GiB/MiB/KiB, 1024-based). */
export function formatBytes(n: number): string {
  if (n >= 2 ** 30) return `${(n / 2 ** 30).toFixed(1)} GiB`;
  if (n >= 2 ** 20) return `${(n / 2 ** 20).toFixed(1)} MiB`;
  return `${Math.ceil(n / 1024)} KiB`;
}

/**
 * Throws a ComputeError when `neededBytes` exceeds the available memory (see
 * {@link availableMemoryBytes}); the message names what the memory is for,
 * the estimate, the limit and its source, and `hint` (how to need less).
 * `heldBytes` (already allocated by the job) counts against an explicit limit
 * (option or environment) but not against the system's free memory, which
 * already excludes it.
 */
export function assertFits(neededBytes: number, what: string, hint: string, limitBytes?: number, heldBytes = 0): void {
  const limit = availableMemoryBytes(limitBytes);
  if (limit.source !== 'system') neededBytes += heldBytes;
  if (neededBytes > limit.bytes) {
    throw new ComputeError(`${what} needs about ${formatBytes(neededBytes)}, more than the ${describeLimit(limit)}; ${hint}`);
  }
}

/**
 * {@link assertFits} for a job whose size is set by a working Nside: the hint
 * is to halve it (`--nside N/2`) or free memory.
 */
export function assertNsideFits(neededBytes: number, what: string, nside: number, limitBytes?: number): void {
  assertFits(neededBytes, `${what} at Nside ${nside}`,
    `lower the working Nside${nside > 1 ? ` (e.g. --nside ${nside / 2})` : ''} or free memory`, limitBytes);
}

/** "200.0 MiB (limit set by SKYSPAN_MEMORY_LIMIT_BYTES)" and the like, for messages. */
export function describeLimit(limit: MemoryLimit): string {
  const from = limit.source === 'environment' ? ` (limit set by ${MEMORY_LIMIT_ENV})`
    : limit.source === 'option' ? ' (limit given as an option)' : ' the system reports free';
  return `${formatBytes(limit.bytes)}${from}`;
}
