/**
 * A sky map as a slide-ready PNG: Mollweide (or a zoomed plate carree window),
 * Galactic centre in the middle and longitude growing to the left, Galactic or
 * equatorial display frame, linear / log / asinh colour scale over a
 * perceptually uniform colour table, colour bar with unit, labelled graticule,
 * region outlines and hatched masks.
 */
import { InputError } from '../core/errors.js';
import type { SkyMap } from '../maps/skyMap.js';
import type { FrameName } from '../sphere/frames.js';
import { rotationMatrix } from '../sphere/frameRotation.js';
import { degToRad } from '../sphere/angles.js';
import { colourLut, type ColourLut, type ColourMapName } from './colourMap.js';
import { resolveScale, type ScaleKind, type ValueScale } from './valueScale.js';
import { createLayer, compositeLayer, createRaster, encodePng, layerSegment } from './raster.js';
import { layerText } from './strokeFont.js';
import { cartesianView, mollweideView, type SkyView } from './skyView.js';
import { pixelLookup } from './pixelLookup.js';
import { colouriseArea } from './colourise.js';
import { drawGraticule, drawOutlines, drawShades, graticuleStep, latLabel, lonLabel, type RegionOverlay } from './overlays.js';
import { colourBarHeight, drawColourBar } from './colourBar.js';
import { drawDiscMarks, type DiscMark } from './discMarks.js';

/** A lon/lat window in degrees for the zoomed view; lonMaxDeg > lonMinDeg (e.g. -40 .. 60). */
export interface ZoomWindowDeg { lonMinDeg: number; lonMaxDeg: number; latMinDeg: number; latMaxDeg: number }

/** Options of {@link renderSkyMap}. Degrees here (the API edge). */
export interface SkyImageOptions {
  /** Picture width in pixels, 300..8000 (default 1200). */
  width?: number;
  /** Plane index, 0-based (default 0). */
  plane?: number;
  scale?: ScaleKind;
  min?: number;
  max?: number;
  /** asinh softening in map units. */
  softening?: number;
  colourMap?: ColourMapName;
  /** Display frame (default: the map's frame; 'galactic' for a map of unknown frame). */
  frame?: 'galactic' | 'equatorial';
  /** Longitude in the middle of a Mollweide picture (default 0: the Galactic centre, or RA 0). */
  viewLonDeg?: number;
  zoom?: ZoomWindowDeg;
  /** Graticule on/off or its steps (default: 60/30 deg on Mollweide, automatic on a zoom). */
  graticule?: boolean | { lonStepDeg: number; latStepDeg: number };
  title?: string;
  /** Colour-bar label (default: the map's unit, or 'map value'). */
  unit?: string;
  outlines?: readonly RegionOverlay[];
  shades?: readonly RegionOverlay[];
  /** Mask discs outlined as circles (never smaller than a few pixels), in `frame`. */
  discs?: { frame: FrameName; marks: readonly DiscMark[] };
}

/** The picture and what a caller (or a test) needs to read it. */
export interface SkyImage {
  readonly png: Buffer;
  readonly width: number;
  readonly height: number;
  /** The picture area's top-left corner in the picture. */
  readonly areaLeft: number;
  readonly areaTop: number;
  readonly view: SkyView;
  readonly scale: ValueScale;
  readonly lut: ColourLut;
  readonly displayFrame: 'galactic' | 'equatorial';
  /** Picture pixels showing a blank map pixel. */
  readonly blankPixels: number;
}

function checkOptions(o: SkyImageOptions, map: SkyMap): void {
  const w = o.width ?? 1200;
  if (!(Number.isInteger(w) && w >= 300 && w <= 8000)) throw new InputError(`width is ${w}, expected a whole number of pixels from 300 to 8000`, { keyPath: 'width' });
  const p = o.plane ?? 0;
  if (!(Number.isInteger(p) && p >= 0 && p < map.planes.length)) {
    throw new InputError(`plane ${p + 1} does not exist: the map has ${map.planes.length} plane(s), numbered from 1`, { keyPath: 'plane' });
  }
  const z = o.zoom;
  if (z && !(z.lonMaxDeg > z.lonMinDeg && z.lonMaxDeg - z.lonMinDeg <= 360 && z.latMaxDeg > z.latMinDeg && z.latMinDeg >= -90 && z.latMaxDeg <= 90)) {
    throw new InputError(`zoom window l ${z.lonMinDeg}..${z.lonMaxDeg}, b ${z.latMinDeg}..${z.latMaxDeg} deg is not a window`, { keyPath: 'zoom' },
      'give l1 < l2 (at most 360 deg apart) and -90 <= b1 < b2 <= 90');
  }
}

/** Renders a map (see module doc) and encodes it as PNG. */
export function renderSkyMap(map: SkyMap, options: SkyImageOptions = {}): SkyImage {
  checkOptions(options, map);
  const W = options.width ?? 1200;
  const u = W / 1200;
  const planeIndex = options.plane ?? 0;
  const plane = map.planes[planeIndex];
  const mapFrame: FrameName = map.frame === 'unknown' ? (options.frame ?? 'galactic') : map.frame;
  // A map of unknown frame is taken to be in the display frame (Galactic by default); the frame note says so.
  const displayFrame = options.frame ?? (mapFrame === 'equatorial' ? 'equatorial' : 'galactic');
  const scale = resolveScale(plane, options.scale ?? 'linear', options);
  const lut = colourLut(options.colourMap ?? 'magma');
  const zoom = options.zoom;
  const titleH = options.title ? Math.round(46 * u) : Math.round(22 * u);
  let view: SkyView, ox: number, oy = titleH, belowArea: number;
  if (!zoom) {
    const pad = Math.round(58 * u);
    const pw = 2 * Math.floor((W - 2 * pad) / 2);
    ox = Math.round((W - pw) / 2);
    view = mollweideView(pw, options.viewLonDeg ?? 0);
    belowArea = Math.round(26 * u);
  } else {
    const left = Math.round(70 * u), right = Math.round(30 * u);
    const pw = W - left - right;
    const ratio = (zoom.latMaxDeg - zoom.latMinDeg) / (zoom.lonMaxDeg - zoom.lonMinDeg);
    const ph = Math.max(Math.round(0.15 * pw), Math.min(Math.round(1.2 * pw), Math.round(pw * ratio)));
    ox = left;
    view = cartesianView(pw, ph, degToRad(zoom.lonMinDeg), degToRad(zoom.lonMaxDeg), degToRad(zoom.latMinDeg), degToRad(zoom.latMaxDeg));
    belowArea = Math.round(58 * u);
  }
  const H = oy + view.height + belowArea + colourBarHeight(u) + Math.round(12 * u);
  const raster = createRaster(W, H, 0xffffff);
  const m = rotationMatrix(displayFrame, mapFrame);
  const lookup = pixelLookup(view, map.nside, map.ordering, m);
  const blankPixels = colouriseArea(raster, ox, oy, view.width, view.height, plane, lookup, scale, lut);
  const at = { ox, oy, u };
  if (options.shades?.length) drawShades(raster, view, at, options.shades, displayFrame);
  const g = options.graticule ?? true;
  if (g !== false) {
    const steps = typeof g === 'object' ? g : zoom
      ? { lonStepDeg: graticuleStep(zoom.lonMaxDeg - zoom.lonMinDeg, 6), latStepDeg: graticuleStep(zoom.latMaxDeg - zoom.latMinDeg, 5) }
      : { lonStepDeg: 60, latStepDeg: 30 };
    drawGraticule(raster, view, at, steps);
    if (zoom) drawFrameAxes(raster, view, at, steps, displayFrame);
  }
  if (options.outlines?.length) drawOutlines(raster, view, at, options.outlines, displayFrame);
  if (options.discs) drawDiscMarks(raster, view, at, options.discs.marks, options.discs.frame, displayFrame);
  const ink = createLayer(W, H);
  if (options.title) layerText(ink, options.title, ox, Math.round(30 * u), 17 * u, 'start');
  const note = (displayFrame === 'galactic' ? 'Galactic' : 'Equatorial (ICRS)') + (map.frame === 'unknown' ? ', map frame assumed' : '')
    + (map.energiesGeV ? `, plane ${planeIndex + 1} at ${Number(map.energiesGeV[planeIndex].toPrecision(4))} GeV` : '');
  layerText(ink, note, ox + view.width, Math.round((options.title ? 30 : 16) * u), 11 * u, 'end');
  compositeLayer(raster, ink, 0x30343a, 1);
  const barW = Math.round(view.width * 0.56);
  drawColourBar(raster, { x: ox + (view.width - barW) / 2, y: oy + view.height + belowArea, width: barW, height: 14 * u, u },
    scale, lut, options.unit ?? (map.unit || 'map value'), blankPixels > 0);
  return { png: encodePng(raster), width: W, height: H, areaLeft: ox, areaTop: oy, view, scale, lut, displayFrame, blankPixels };
}

/** Frame, ticks and tick labels of a zoomed (cartesian) view. */
function drawFrameAxes(raster: ReturnType<typeof createRaster>, view: SkyView, at: { ox: number; oy: number; u: number },
  steps: { lonStepDeg: number; latStepDeg: number }, frame: 'galactic' | 'equatorial'): void {
  const win = view.window!;
  const ink = createLayer(raster.width, raster.height);
  const { ox, oy, u } = at, w = view.width, h = view.height, lw = Math.max(1, 1.2 * u), size = 11 * u;
  layerSegment(ink, ox, oy, ox + w, oy, lw); layerSegment(ink, ox, oy + h, ox + w, oy + h, lw);
  layerSegment(ink, ox, oy, ox, oy + h, lw); layerSegment(ink, ox + w, oy, ox + w, oy + h, lw);
  const p = new Float64Array(2), r2d = 180 / Math.PI;
  const l0 = win.lonMinRad * r2d, l1 = win.lonMaxRad * r2d, b0 = win.latMinRad * r2d, b1 = win.latMaxRad * r2d;
  for (let L = Math.ceil(l0 / steps.lonStepDeg - 1e-9) * steps.lonStepDeg; L <= l1 + 1e-9; L += steps.lonStepDeg) {
    view.project(degToRad(L), win.latMinRad, p);
    layerSegment(ink, ox + p[0], oy + h, ox + p[0], oy + h + 5 * u, lw);
    layerText(ink, lonLabel(L), ox + p[0], oy + h + 9 * u + size, size, 'middle');
  }
  for (let B = Math.ceil(b0 / steps.latStepDeg - 1e-9) * steps.latStepDeg; B <= b1 + 1e-9; B += steps.latStepDeg) {
    view.project(win.lonMaxRad, degToRad(B), p);
    layerSegment(ink, ox - 5 * u, oy + p[1], ox, oy + p[1], lw);
    layerText(ink, latLabel(B), ox - 8 * u, oy + p[1] + size / 2, size, 'end');
  }
  const [ln, bn] = frame === 'galactic' ? ['Galactic longitude l', 'b'] : ['right ascension', 'dec'];
  layerText(ink, ln, ox + w / 2, oy + h + 42 * u, 12 * u, 'middle');
  layerText(ink, bn, ox - 52 * u, oy + h / 2 + 6 * u, 12 * u, 'end');
  compositeLayer(raster, ink, 0x30343a, 1);
}
