/**
 * Memory check before the big allocations of a factor job: evaluating a region
 * at Nside N holds its dense weights (a Float32 fraction and a Float32
 * exposure per pixel, 8 bytes x 12 N^2) plus the evaluator's own working
 * arrays (taken as as much again) before they shrink to the sparse list.
 * The estimate is compared with the memory the system reports available.
 */
import { freemem } from 'node:os';
import { ComputeError } from '../core/errors.js';
import { nside2npix } from '../sphere/nside.js';

/** Bytes a region evaluation at `nside` needs at its peak (see module doc). */
export function regionEvaluationBytes(nside: number): number {
  return 16 * nside2npix(nside);
}

/** Bytes held by `planes` template planes of `bytesPerValue` at `nside`. */
export function templateBytes(nside: number, planes: number, bytesPerValue: number): number {
  return nside2npix(nside) * planes * bytesPerValue;
}

/** Human-readable byte count (GiB/MiB, 1024-based). */
export function formatBytes(n: number): string {
  if (n >= 2 ** 30) return `${(n / 2 ** 30).toFixed(1)} GiB`;
  if (n >= 2 ** 20) return `${(n / 2 ** 20).toFixed(1)} MiB`;
  return `${Math.ceil(n / 1024)} KiB`;
}

/** Memory the system reports available now, in bytes. */
export function availableBytes(): number {
  const constrained = typeof process.constrainedMemory === 'function' ? process.constrainedMemory() : 0;
  const free = freemem();
  return constrained && constrained > 0 ? Math.min(constrained, free) : free;
}

/**
 * Throws a ComputeError naming the estimate, what it is for and the way out
 * (a lower Nside; `nside` NaN when not known) when `neededBytes` exceeds `limitBytes` (default: what the
 * system reports available).
 */
export function assertMemoryFits(neededBytes: number, what: string, nside: number, limitBytes = availableBytes()): void {
  if (neededBytes > limitBytes) {
    const at = Number.isFinite(nside) ? ` at Nside ${nside}` : '';
    const lower = Number.isFinite(nside) && nside > 1 ? ` (e.g. --nside ${nside / 2})` : ' with --nside';
    throw new ComputeError(
      `${what}${at} needs about ${formatBytes(neededBytes)}, more than the ${formatBytes(limitBytes)} available; ` +
      `lower the working Nside${lower} or free memory`);
  }
}
