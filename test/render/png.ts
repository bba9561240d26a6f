/** Test helper: decode a PNG with pngjs and read pixels back. */
import { PNG } from 'pngjs';

export interface Decoded { width: number; height: number; data: Buffer }

export function decode(png: Buffer): Decoded {
  const p = PNG.sync.read(png);
  return { width: p.width, height: p.height, data: p.data };
}

/** 0xRRGGBB at pixel (i, j). */
export function pixelAt(d: Decoded, i: number, j: number): number {
  const o = 4 * (j * d.width + i);
  return (d.data[o] << 16) | (d.data[o + 1] << 8) | d.data[o + 2];
}
