/**
 * The colour bar under a sky picture: the colour table as a horizontal strip,
 * ticks at round values of the scale, the unit below, and a swatch for blank
 * pixels when the picture shows any.
 */
import { LUT_SIZE, type ColourLut } from './colourMap.js';
import { createLayer, compositeLayer, layerRect, layerSegment, type Raster } from './raster.js';
import { layerText } from './strokeFont.js';
import { formatTick, normalise, scaleTicks, type ValueScale } from './valueScale.js';

/** Placement of the bar: left x, top y, width and height (pixels), and the drawing scale u. */
export interface BarPlacement { x: number; y: number; width: number; height: number; u: number }

/** Height in pixels the bar needs below its top, with ticks, labels and unit line. */
export function colourBarHeight(u: number): number {
  return Math.round(14 * u + 30 * u + 22 * u);
}

/** Draws the bar; `label` is the unit text (with '^' superscripts), `blankSwatch` adds the 'no data' key. */
export function drawColourBar(raster: Raster, at: BarPlacement, scale: ValueScale, lut: ColourLut, label: string, blankSwatch: boolean): void {
  const { x, y, width, u } = at;
  const h = Math.round(14 * u);
  const x0 = Math.round(x), y0 = Math.round(y), w = Math.round(width);
  const d = raster.data;
  for (let i = 0; i < w; i++) {
    const e = Math.min(LUT_SIZE - 1, Math.floor(((i + 0.5) / w) * LUT_SIZE));
    for (let j = 0; j < h; j++) {
      const o = 4 * ((y0 + j) * raster.width + x0 + i);
      d[o] = lut.rgb[3 * e]; d[o + 1] = lut.rgb[3 * e + 1]; d[o + 2] = lut.rgb[3 * e + 2];
    }
  }
  const ink = createLayer(raster.width, raster.height);
  const lw = Math.max(1, u);
  layerSegment(ink, x0, y0, x0 + w, y0, lw); layerSegment(ink, x0, y0 + h, x0 + w, y0 + h, lw);
  layerSegment(ink, x0, y0, x0, y0 + h, lw); layerSegment(ink, x0 + w, y0, x0 + w, y0 + h, lw);
  const size = 11 * u;
  for (const v of scaleTicks(scale)) {
    const tx = x0 + normalise(scale, v) * w;
    layerSegment(ink, tx, y0 + h, tx, y0 + h + 5 * u, lw);
    layerText(ink, formatTick(v), tx, y0 + h + 8 * u + size + 2 * u, size, 'middle');
  }
  const kind = scale.kind === 'linear' ? '' : scale.kind === 'log' ? '   (log scale)' : `   (asinh scale, softening ${formatTick(scale.softening)})`;
  layerText(ink, label + kind, x0 + w / 2, y0 + h + 30 * u + 12 * u, 12 * u, 'middle');
  if (blankSwatch) {
    const sx = x0 + w + 18 * u;
    const sw = Math.round(h);
    const blank = createLayer(raster.width, raster.height);
    layerRect(blank, sx, y0, sw, h);
    compositeLayer(raster, blank, lut.blank, 1);
    layerText(ink, 'no data', sx + sw + 6 * u, y0 + h / 2 + size / 2, size, 'start');
  }
  compositeLayer(raster, ink, 0x30343a, 1);
}
