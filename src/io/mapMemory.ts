/**
 * The memory check made before a map file's columns are decoded (see
 * core/memory.ts for the limit and the message).
 */
import { assertFits, estimateMapBytes } from '../core/memory.js';
import type { TableColumn } from './fits/bintable.js';

/**
 * Refuses, before any decoding, a map whose decoded planes would not fit in
 * memory: each plane takes 12 Nside^2 values of 4 bytes (float32 and 8/16-bit
 * columns) or 8 bytes (the others). A single full-sky float column is decoded
 * in the file's own buffer and needs nothing more. The file's bytes, already
 * held, count against an explicit limit.
 */
export function checkDecodeMemory(cols: TableColumn[], perPixel: (c: TableColumn) => number,
  at: { nside: number; file: string; inPlace: boolean; fullSky: boolean; held: number }, limitBytes: number | undefined): void {
  let bytes = 0, planes = 0;
  for (const c of cols) {
    const k = perPixel(c);
    const e = c.format.element;
    const size = e === 'float32' || e === 'uint8' || e === 'int16' ? 4 : 8;
    const scaled = c.scale !== 1 || c.zero !== 0 || (e !== 'float32' && e !== 'float64');
    planes += k;
    if (at.inPlace && at.fullSky && k === 1 && !scaled) continue;
    bytes += estimateMapBytes(at.nside, k, scaled ? 8 : size) * (k > 1 || scaled ? 2 : 1);
  }
  if (bytes === 0) return;
  const half = at.nside > 1 ? at.nside / 2 : 1;
  assertFits(bytes, `decoding ${planes} map plane${planes === 1 ? '' : 's'} of ${at.file} at Nside ${at.nside}`,
    `lower the Nside first (skyspan remap IN OUT --nside ${half} where memory allows), or split the file into one map column per file and process them one at a time`,
    limitBytes, at.held);
}
