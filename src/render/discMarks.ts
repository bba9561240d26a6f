/**
 * Mask discs drawn as circles over a sky picture: each disc's rim is traced on
 * the sphere (48 points at its angular radius) and projected; a disc whose
 * drawn radius would be under `minRadiusPx` (5 px on a 1200 px picture, scaled, never under 3 px) is drawn as a circle of that
 * radius around its projected centre instead, so that a 0.5 deg disc on a
 * full-sky picture is still seen. Dark halo under a light line, like the
 * region outlines.
 */
import { rotationMatrix } from '../sphere/frameRotation.js';
import type { FrameName } from '../sphere/frames.js';
import { createLayer, compositeLayer, layerPolyline, type Raster } from './raster.js';
import type { SkyView } from './skyView.js';
import type { AreaPlacement } from './overlays.js';

/** A disc to mark: centre and angular radius in radians, in `frame`. */
export interface DiscMark { lonRad: number; latRad: number; radiusRad: number }

const N = 49;

/** Draws every disc of `discs` (given in `frame`) on the picture area (see module doc). */
export function drawDiscMarks(raster: Raster, view: SkyView, at: AreaPlacement, discs: readonly DiscMark[], frame: FrameName,
  displayFrame: FrameName, colour = 0x7fffd4, minRadiusPx = 5): void {
  if (!discs.length) return;
  const m = rotationMatrix(frame, displayFrame);
  const xs = new Float64Array(N), ys = new Float64Array(N), p = new Float64Array(2);
  const line = createLayer(raster.width, raster.height), halo = createLayer(raster.width, raster.height);
  const lw = Math.max(1, 1.2 * at.u), minR = Math.max(3, minRadiusPx * at.u);
  const toDisplay = (x: number, y: number, z: number, out: Float64Array): boolean => {
    const xr = m[0] * x + m[1] * y + m[2] * z, yr = m[3] * x + m[4] * y + m[5] * z, zr = m[6] * x + m[7] * y + m[8] * z;
    return view.project(Math.atan2(yr, xr), Math.atan2(zr, Math.hypot(xr, yr)), out);
  };
  for (const dsc of discs) {
    const cl = Math.cos(dsc.latRad);
    const c = [cl * Math.cos(dsc.lonRad), cl * Math.sin(dsc.lonRad), Math.sin(dsc.latRad)];
    if (!toDisplay(c[0], c[1], c[2], p)) continue;
    const cx = at.ox + p[0], cy = at.oy + p[1];
    // Two unit vectors orthogonal to the centre span the rim.
    const e1 = [-Math.sin(dsc.lonRad), Math.cos(dsc.lonRad), 0];
    const e2 = [-Math.sin(dsc.latRad) * Math.cos(dsc.lonRad), -Math.sin(dsc.latRad) * Math.sin(dsc.lonRad), cl];
    const cr = Math.cos(dsc.radiusRad), sr = Math.sin(dsc.radiusRad);
    let meanR = 0, ok = 0;
    for (let k = 0; k < N; k++) {
      const t = (2 * Math.PI * k) / (N - 1), a = sr * Math.cos(t), b = sr * Math.sin(t);
      if (toDisplay(cr * c[0] + a * e1[0] + b * e2[0], cr * c[1] + a * e1[1] + b * e2[1], cr * c[2] + a * e1[2] + b * e2[2], p)) {
        xs[k] = at.ox + p[0]; ys[k] = at.oy + p[1]; meanR += Math.hypot(xs[k] - cx, ys[k] - cy); ok++;
      } else { xs[k] = NaN; ys[k] = NaN; }
    }
    // A rim that jumps across the picture (a disc on the Mollweide seam) is drawn at the minimum size too.
    if (ok < N || meanR / ok < minR || meanR / ok > raster.width / 2) {
      for (let k = 0; k < N; k++) { const t = (2 * Math.PI * k) / (N - 1); xs[k] = cx + minR * Math.cos(t); ys[k] = cy + minR * Math.sin(t); }
    }
    layerPolyline(halo, xs, ys, N, lw + 2 * Math.max(1, at.u));
    layerPolyline(line, xs, ys, N, lw);
  }
  compositeLayer(raster, halo, 0x101418, 0.6);
  compositeLayer(raster, line, colour, 1);
}
