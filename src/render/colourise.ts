/**
 * The per-picture colouring kernel: map value -> scale -> colour-table entry,
 * over a cached pixel lookup. Plain loop over typed arrays; blank pixels
 * (HEALPix sentinel or NaN) get the colour map's blank colour.
 */
import { BLANK } from '../maps/skyMap.js';
import type { MapArray } from '../maps/skyMap.js';
import { LUT_SIZE, type ColourLut } from './colourMap.js';
import { scaleTransform, type ValueScale } from './valueScale.js';
import type { Raster } from './raster.js';

const BLANK_TOL = 1e-5 * Math.abs(BLANK); // same test as maps/blank.ts isBlank, inlined for the hot loop

/**
 * Colours the pw x ph picture area at (ox, oy) of the raster from plane values
 * through lookup (map pixel per area pixel, -1 = no sky: left untouched).
 * Returns the number of area pixels that showed a blank map pixel.
 */
export function colouriseArea(
  raster: Raster, ox: number, oy: number, pw: number, ph: number,
  plane: MapArray, lookup: Int32Array, scale: ValueScale, lut: ColourLut,
): number {
  const kind = scale.kind === 'linear' ? 0 : scale.kind === 'log' ? 1 : 2;
  const beta = scale.softening;
  const s0 = scaleTransform(scale.kind, scale.min, beta);
  const inv = 1 / (scaleTransform(scale.kind, scale.max, beta) - s0);
  const rgb = lut.rgb, d = raster.data, W = raster.width;
  const br = lut.blank >> 16, bg = (lut.blank >> 8) & 255, bb = lut.blank & 255;
  let blanks = 0;
  for (let j = 0; j < ph; j++) {
    let o = 4 * ((oy + j) * W + ox);
    let k = j * pw;
    for (let i = 0; i < pw; i++, k++, o += 4) {
      const p = lookup[k];
      if (p < 0) continue;
      const v = plane[p];
      if (v !== v || Math.abs(v - BLANK) <= BLANK_TOL) {
        d[o] = br; d[o + 1] = bg; d[o + 2] = bb; blanks++;
        continue;
      }
      let t: number;
      if (kind === 0) t = (v - s0) * inv;
      else if (kind === 1) t = v > 0 ? (Math.log(v) - s0) * inv : 0;
      else t = (Math.asinh(v / beta) - s0) * inv;
      let e = Math.floor(t * LUT_SIZE);
      if (!(e >= 0)) e = 0; else if (e > LUT_SIZE - 1) e = LUT_SIZE - 1;
      d[o] = rgb[3 * e]; d[o + 1] = rgb[3 * e + 1]; d[o + 2] = rgb[3 * e + 2];
    }
  }
  return blanks;
}
