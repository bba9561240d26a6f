/**
 * What is drawn over the colours of a sky picture: the graticule with its
 * labels, region outlines (the boundary of covered fraction > 0.5) and shaded
 * masks (two-tone hatching where the fraction > 0.5). Regions come as per-pixel
 * fractions on their own HEALPix grid (RING order) and frame; they are looked
 * up through the same cached machinery as the map.
 */
import type { FrameName } from '../sphere/frames.js';
import { rotationMatrix } from '../sphere/frameRotation.js';
import { degToRad } from '../sphere/angles.js';
import { createLayer, compositeLayer, layerPolyline, touch, type CoverageLayer, type Raster } from './raster.js';
import { layerText } from './strokeFont.js';
import { pixelLookup } from './pixelLookup.js';
import type { SkyView } from './skyView.js';

/** A region to draw: covered fraction per RING pixel of a HEALPix grid in a frame. */
export interface RegionOverlay {
  readonly name: string;
  readonly nside: number;
  readonly frame: FrameName;
  readonly fraction: Float32Array;
  /** Line or hatch colour 0xRRGGBB (default: white for outlines, light grey for masks). */
  readonly colour?: number;
}

/** Where the picture area sits in the raster, and the drawing scale (1 at 1200 px wide). */
export interface AreaPlacement { ox: number; oy: number; u: number }

/** Per picture-area pixel: 1 where the shown map pixel of the region has fraction > 0.5, else 0. */
function rawMask(view: SkyView, region: RegionOverlay, displayFrame: FrameName): Uint8Array {
  const m = rotationMatrix(displayFrame, region.frame);
  const look = pixelLookup(view, region.nside, 'RING', m);
  const mask = new Uint8Array(look.length);
  const f = region.fraction;
  for (let k = 0; k < look.length; k++) { const p = look[k]; mask[k] = p >= 0 && f[p] > 0.5 ? 1 : 0; }
  return mask;
}

/**
 * HEALPix pixels are diamonds, so a set of them has a zigzag rim. The mask is
 * box-averaged over about one map pixel (at least 5 x 5 picture pixels): the
 * smooth field's 1/2 level is the drawn boundary.
 */
function smoothHalf(view: SkyView, nside: number): number {
  const pixRad = Math.sqrt((4 * Math.PI) / (12 * nside * nside));
  const pxPerRad = view.window ? view.width / (view.window.lonMaxRad - view.window.lonMinRad) : view.width / (2 * Math.PI);
  return Math.max(2, Math.min(8, Math.round((1.2 * pixRad * pxPerRad) / 2)));
}

/** Box average of a 0/1 mask over (2 half + 1)^2 pixels (summed-area table), clipped at the edges. */
function boxAverage(mask: Uint8Array, w: number, h: number, half: number): Float32Array {
  const sat = new Int32Array((w + 1) * (h + 1));
  for (let j = 0; j < h; j++) {
    let row = 0;
    for (let i = 0; i < w; i++) { row += mask[j * w + i]; sat[(j + 1) * (w + 1) + i + 1] = sat[j * (w + 1) + i + 1] + row; }
  }
  const out = new Float32Array(mask.length);
  for (let j = 0; j < h; j++) {
    const j0 = Math.max(0, j - half), j1 = Math.min(h, j + half + 1);
    for (let i = 0; i < w; i++) {
      const i0 = Math.max(0, i - half), i1 = Math.min(w, i + half + 1);
      const s = sat[j1 * (w + 1) + i1] - sat[j0 * (w + 1) + i1] - sat[j1 * (w + 1) + i0] + sat[j0 * (w + 1) + i0];
      out[j * w + i] = s / ((i1 - i0) * (j1 - j0));
    }
  }
  return out;
}

/** Inside-mask of a region, smoothed: 1 where the box-averaged mask exceeds 1/2. */
function regionMask(view: SkyView, region: RegionOverlay, displayFrame: FrameName): Uint8Array {
  const avg = boxAverage(rawMask(view, region, displayFrame), view.width, view.height, smoothHalf(view, region.nside));
  const out = new Uint8Array(avg.length);
  for (let k = 0; k < avg.length; k++) out[k] = avg[k] > 0.5 ? 1 : 0;
  return out;
}

/**
 * Draws the outline of each region: an anti-aliased line along the 1/2 level of
 * the smoothed mask (distance to the level estimated as |f - 1/2| / |grad f|,
 * common practice, no source), light over a dark halo.
 */
export function drawOutlines(raster: Raster, view: SkyView, at: AreaPlacement, regions: readonly RegionOverlay[], displayFrame: FrameName): void {
  const w = view.width, h = view.height;
  const lineHalf = Math.max(0.8, 1.1 * at.u), haloHalf = lineHalf + Math.max(1, 1.2 * at.u);
  for (const region of regions) {
    const f = boxAverage(rawMask(view, region, displayFrame), w, h, smoothHalf(view, region.nside));
    const inner = createLayer(raster.width, raster.height), halo = createLayer(raster.width, raster.height);
    for (const l of [inner, halo]) touch(l, at.ox, at.oy, at.ox + w - 1, at.oy + h - 1);
    for (let j = 1; j < h - 1; j++) {
      for (let i = 1; i < w - 1; i++) {
        const k = j * w + i, v = f[k] - 0.5;
        if (v > 0.45 || v < -0.45 || view.vx[k] !== view.vx[k]) continue;
        const gx = (f[k + 1] - f[k - 1]) / 2, gy = (f[k + w] - f[k - w]) / 2;
        const g = Math.sqrt(gx * gx + gy * gy);
        if (!(g > 1e-6)) continue;
        const d = Math.abs(v) / g;
        const q = (at.oy + j) * raster.width + at.ox + i;
        const ci = lineHalf + 0.5 - d, ch = haloHalf + 0.5 - d;
        if (ci > 0) inner.cov[q] = ci > 1 ? 1 : ci;
        if (ch > 0) halo.cov[q] = ch > 1 ? 1 : ch;
      }
    }
    compositeLayer(raster, halo, 0x101418, 0.55);
    compositeLayer(raster, inner, region.colour ?? 0xffffff, 1);
  }
}

/** Hatches each region (diagonal stripes where fraction > 0.5). */
export function drawShades(raster: Raster, view: SkyView, at: AreaPlacement, regions: readonly RegionOverlay[], displayFrame: FrameName): void {
  const period = Math.max(4, Math.round(7 * at.u)), thick = Math.max(2, Math.round(2.5 * at.u));
  for (const region of regions) {
    const mask = regionMask(view, region, displayFrame);
    // Two-tone stripes (light, then dark half a period later) read on any colour.
    const light = createLayer(raster.width, raster.height), dark = createLayer(raster.width, raster.height);
    for (const l of [light, dark]) touch(l, at.ox, at.oy, at.ox + view.width - 1, at.oy + view.height - 1);
    const shift = Math.floor(period / 2);
    for (let j = 0; j < view.height; j++) {
      for (let i = 0; i < view.width; i++) {
        if (!mask[j * view.width + i]) continue;
        const ph = (i + j) % period, q = (at.oy + j) * raster.width + at.ox + i;
        if (ph < thick) light.cov[q] = 1;
        else if (ph >= shift && ph < shift + thick) dark.cov[q] = 1;
      }
    }
    compositeLayer(raster, light, region.colour ?? 0xf2f2f2, 0.75);
    compositeLayer(raster, dark, 0x101418, 0.6);
  }
}

/** Graticule spacing in degrees. */
export interface GraticuleSteps { lonStepDeg: number; latStepDeg: number }

/** A round step (1, 2, 5, 10, 15, 30, 60 deg ...) giving about `count` lines over a span of degrees. */
export function graticuleStep(spanDeg: number, count = 5): number {
  const steps = [0.1, 0.2, 0.5, 1, 2, 5, 10, 15, 20, 30, 45, 60, 90];
  return steps.find((s) => spanDeg / s <= count) ?? 90;
}

/** Longitude label in [0, 360) for display, e.g. 300 for -60. */
export function lonLabel(lonDeg: number): string {
  let l = lonDeg % 360;
  if (l < 0) l += 360;
  return `${Number(l.toFixed(2))}°`;
}

/** Latitude label with sign, e.g. '+30°', '0°', '-60°'. */
export function latLabel(latDeg: number): string {
  const v = Number(latDeg.toFixed(2));
  return `${v > 0 ? '+' : ''}${v}°`;
}

/**
 * Draws graticule lines over the picture area (light, translucent) and, on a
 * Mollweide view, longitude labels along a parallel south of the equator and latitude labels left
 * of the ellipse; on a cartesian view the labels go on the frame (see the
 * picture composer).
 */
export function drawGraticule(raster: Raster, view: SkyView, at: AreaPlacement, steps: GraticuleSteps): void {
  const lines: CoverageLayer = createLayer(raster.width, raster.height);
  const N = 241;
  const xs = new Float64Array(N), ys = new Float64Array(N), p = new Float64Array(2);
  const lw = Math.max(1, 1.1 * at.u);
  const c = view.centreLonRad * 180 / Math.PI;
  const [lon0, lon1, lat0, lat1] = view.window
    ? [view.window.lonMinRad, view.window.lonMaxRad, view.window.latMinRad, view.window.latMaxRad].map((r) => r * 180 / Math.PI)
    : [c - 180, c + 180, -90, 90];
  const put = (k: number, lonDeg: number, latDeg: number) => {
    if (view.project(degToRad(lonDeg), degToRad(latDeg), p)) { xs[k] = at.ox + p[0]; ys[k] = at.oy + p[1]; } else { xs[k] = NaN; ys[k] = NaN; }
  };
  const eps = 1e-7;
  for (let L = Math.ceil((lon0 + eps) / steps.lonStepDeg) * steps.lonStepDeg; L < lon1 - eps; L += steps.lonStepDeg) {
    for (let k = 0; k < N; k++) put(k, L, lat0 + ((lat1 - lat0) * k) / (N - 1));
    layerPolyline(lines, xs, ys, N, lw);
  }
  for (let B = Math.ceil((lat0 + eps) / steps.latStepDeg) * steps.latStepDeg; B < lat1 - eps; B += steps.latStepDeg) {
    if (view.kind === 'mollweide' && Math.abs(B) >= 90 - eps) continue;
    for (let k = 0; k < N; k++) put(k, lon0 + eps + ((lon1 - lon0 - 2 * eps) * k) / (N - 1), B);
    layerPolyline(lines, xs, ys, N, lw);
  }
  compositeLayer(raster, lines, 0xffffff, 0.38);
  if (view.kind !== 'mollweide') return;
  // Ellipse outline.
  const rim = createLayer(raster.width, raster.height);
  for (const side of [-1, 1]) {
    for (let k = 0; k < N; k++) put(k, c + side * (180 - 1e-6), -90 + (180 * k) / (N - 1));
    layerPolyline(rim, xs, ys, N, Math.max(1, 1.3 * at.u));
  }
  compositeLayer(raster, rim, 0x30343a, 0.9);
  // Labels: longitudes along the first parallel south of the equator, off the Galactic plane and the
  // outlines drawn there (light on a dark halo); latitudes outside the rim.
  const size = 11 * at.u, labelLat = -Math.min(30, steps.latStepDeg);
  const halo = createLayer(raster.width, raster.height), text = createLayer(raster.width, raster.height);
  for (let L = Math.ceil((lon0 + eps) / steps.lonStepDeg) * steps.lonStepDeg; L < lon1 - eps; L += steps.lonStepDeg) {
    if (!view.project(degToRad(L), degToRad(labelLat), p)) continue;
    const x = at.ox + p[0] + 4 * at.u, y = at.oy + p[1] - 5 * at.u;
    layerText(halo, lonLabel(L), x, y, size, 'start', 3 * at.u);
    layerText(text, lonLabel(L), x, y, size, 'start');
  }
  compositeLayer(raster, halo, 0x101418, 0.5);
  compositeLayer(raster, text, 0xffffff, 1);
  const side = createLayer(raster.width, raster.height);
  for (let B = Math.ceil((-90 + eps) / steps.latStepDeg) * steps.latStepDeg; B < 90 - eps; B += steps.latStepDeg) {
    if (!view.project(degToRad(c + 180 - 1e-6), degToRad(B), p)) continue;
    // 12 units clear of the rim: region outlines that reach the rim at b = 0 (a band, a box across l = 180) stay clear of "0°"
    layerText(side, latLabel(B), at.ox + p[0] - 12 * at.u, at.oy + p[1] + size / 2, size, 'end');
  }
  compositeLayer(raster, side, 0x30343a, 1);
}
