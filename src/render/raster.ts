/**
 * An RGBA raster and anti-aliased drawing into it. Shapes are drawn into a
 * coverage layer (one float per pixel, combined by maximum so crossing strokes
 * do not darken) and the layer is then blended onto the raster in one colour.
 * Coverage of a stroke is its signed-distance ramp: clamp(w/2 + 1/2 - d, 0, 1),
 * with d the distance from the pixel centre to the segment (common practice,
 * no source). PNG encoding by pngjs.
 */
import { PNG } from 'pngjs';

/** Pixels as RGBA bytes, row-major from the top-left. */
export interface Raster {
  readonly width: number;
  readonly height: number;
  readonly data: Uint8Array;
}

/** Coverage in [0, 1] per pixel of a raster-sized layer, with the box that was drawn into. */
export interface CoverageLayer {
  readonly width: number;
  readonly height: number;
  readonly cov: Float32Array;
  /** Drawn box, inclusive pixel bounds (empty while x0 > x1); widened by every drawing call. */
  x0: number; y0: number; x1: number; y1: number;
}

/** Widens a layer's drawn box to include the inclusive pixel box (for callers writing cov directly). */
export function touch(layer: CoverageLayer, ia: number, ja: number, ib: number, jb: number): void {
  if (ia < layer.x0) layer.x0 = Math.max(0, ia);
  if (ja < layer.y0) layer.y0 = Math.max(0, ja);
  if (ib > layer.x1) layer.x1 = Math.min(layer.width - 1, ib);
  if (jb > layer.y1) layer.y1 = Math.min(layer.height - 1, jb);
}

/** A raster filled with one opaque colour 0xRRGGBB. */
export function createRaster(width: number, height: number, colour = 0xffffff): Raster {
  const data = new Uint8Array(width * height * 4);
  const r = colour >> 16, g = (colour >> 8) & 255, b = colour & 255;
  for (let i = 0; i < width * height; i++) {
    data[4 * i] = r; data[4 * i + 1] = g; data[4 * i + 2] = b; data[4 * i + 3] = 255;
  }
  return { width, height, data };
}

/** An empty coverage layer the size of a raster. */
export function createLayer(width: number, height: number): CoverageLayer {
  return { width, height, cov: new Float32Array(width * height), x0: width, y0: height, x1: -1, y1: -1 };
}

/**
 * Adds a round-capped segment from (x0, y0) to (x1, y1) (pixel coordinates,
 * pixel centres at i + 0.5) of full width `widthPx` to the layer.
 */
export function layerSegment(layer: CoverageLayer, x0: number, y0: number, x1: number, y1: number, widthPx: number): void {
  const hw = widthPx / 2;
  const pad = hw + 1;
  const ia = Math.max(0, Math.floor(Math.min(x0, x1) - pad)), ib = Math.min(layer.width - 1, Math.ceil(Math.max(x0, x1) + pad));
  const ja = Math.max(0, Math.floor(Math.min(y0, y1) - pad)), jb = Math.min(layer.height - 1, Math.ceil(Math.max(y0, y1) + pad));
  if (ia > ib || ja > jb) return;
  touch(layer, ia, ja, ib, jb);
  const dx = x1 - x0, dy = y1 - y0;
  const len2 = dx * dx + dy * dy;
  const cov = layer.cov, w = layer.width;
  for (let j = ja; j <= jb; j++) {
    const py = j + 0.5;
    for (let i = ia; i <= ib; i++) {
      const px = i + 0.5;
      let t = len2 > 0 ? ((px - x0) * dx + (py - y0) * dy) / len2 : 0;
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const ex = px - (x0 + t * dx), ey = py - (y0 + t * dy);
      const c = hw + 0.5 - Math.sqrt(ex * ex + ey * ey);
      if (c <= 0) continue;
      const k = j * w + i;
      const v = c > 1 ? 1 : c;
      if (v > cov[k]) cov[k] = v;
    }
  }
}

/** Adds a polyline of n points (xs[i], ys[i]); NaN points break the line. */
export function layerPolyline(layer: CoverageLayer, xs: ArrayLike<number>, ys: ArrayLike<number>, n: number, widthPx: number): void {
  for (let i = 1; i < n; i++) {
    const ax = xs[i - 1], ay = ys[i - 1], bx = xs[i], by = ys[i];
    if (ax === ax && ay === ay && bx === bx && by === by) layerSegment(layer, ax, ay, bx, by, widthPx);
  }
}

/** Sets full coverage on the axis-aligned rectangle [x, x + w) x [y, y + h) (integer pixels). */
export function layerRect(layer: CoverageLayer, x: number, y: number, w: number, h: number): void {
  const i0 = Math.max(0, Math.round(x)), i1 = Math.min(layer.width, Math.round(x + w));
  const j0 = Math.max(0, Math.round(y)), j1 = Math.min(layer.height, Math.round(y + h));
  if (i0 >= i1 || j0 >= j1) return;
  touch(layer, i0, j0, i1 - 1, j1 - 1);
  for (let j = j0; j < j1; j++) layer.cov.fill(1, j * layer.width + i0, j * layer.width + i1);
}

/** Blends a layer onto the raster in colour 0xRRGGBB with overall opacity alpha in [0, 1]. */
export function compositeLayer(raster: Raster, layer: CoverageLayer, colour: number, alpha = 1): void {
  const r = colour >> 16, g = (colour >> 8) & 255, b = colour & 255;
  const d = raster.data, cov = layer.cov, w = layer.width;
  for (let j = layer.y0; j <= layer.y1; j++) {
    for (let k = j * w + layer.x0, end = j * w + layer.x1; k <= end; k++) {
      const a = cov[k] * alpha;
      if (a <= 0) continue;
      const o = 4 * k;
      d[o] = Math.round(d[o] + (r - d[o]) * a);
      d[o + 1] = Math.round(d[o + 1] + (g - d[o + 1]) * a);
      d[o + 2] = Math.round(d[o + 2] + (b - d[o + 2]) * a);
    }
  }
}

/**
 * Encodes the raster as an RGB PNG (alpha dropped: every pixel is opaque).
 * One row filter (Paeth) instead of trying all five per row, and zlib level 6:
 * a few per cent larger files for several times faster encoding (measured in
 * bench/render.ts).
 */
export function encodePng(raster: Raster): Buffer {
  const png = new PNG({ width: raster.width, height: raster.height, colorType: 2, inputColorType: 6, inputHasAlpha: true });
  png.data = Buffer.from(raster.data.buffer, raster.data.byteOffset, raster.data.byteLength);
  return PNG.sync.write(png, { colorType: 2, inputColorType: 6, inputHasAlpha: true, deflateLevel: 6, filterType: 4 });
}
