/**
 * Display geometry of a sky picture: which direction each picture pixel shows.
 * Two views: Mollweide's equal-area ellipse (d3-geo-projection's geoMollweide,
 * Snyder 1987, USGS PP 1395, p. 249) and a plate carree window of longitude and
 * latitude. Both put longitude increasing to the LEFT (the astronomical
 * convention, as seen from inside the sphere). The inverse (picture pixel ->
 * direction) is computed once per view and cached as unit vectors in typed
 * arrays, so that colouring an image is a plain loop.
 */
import type { GeoProjection } from 'd3-geo';
import { geoMollweide } from 'd3-geo-projection';
import { degToRad, radToDeg } from '../sphere/angles.js';

/** A sky view of a picture area of width x height pixels. */
export interface SkyView {
  readonly kind: 'mollweide' | 'cartesian';
  readonly width: number;
  readonly height: number;
  /** Cache key of the geometry. */
  readonly key: string;
  /** Unit vector (display frame) shown by each pixel centre; NaN outside the sky. */
  readonly vx: Float64Array;
  readonly vy: Float64Array;
  readonly vz: Float64Array;
  /**
   * Forward: picture coordinates (pixels, continuous, origin at the area's
   * top-left corner) of (lon, lat) in radians, written to out[0], out[1];
   * false when the direction is outside the view.
   */
  project(lonRad: number, latRad: number, out: Float64Array): boolean;
  /** Central longitude (rad); Mollweide only. */
  readonly centreLonRad: number;
  /** Window (rad) for a cartesian view: l from lonMin to lonMax (lonMax > lonMin), b from latMin to latMax. */
  readonly window?: { lonMinRad: number; lonMaxRad: number; latMinRad: number; latMaxRad: number };
}

const views = new Map<string, SkyView>();
const MAX_VIEWS = 4;

function remember(v: SkyView): SkyView {
  views.set(v.key, v);
  while (views.size > MAX_VIEWS) views.delete(views.keys().next().value as string);
  return v;
}

/**
 * The d3 Mollweide projection fitted to a width x (width/2) area: scale
 * width / (4 sqrt 2) so the ellipse's semi-axes are width/2 and width/4,
 * centred, mirrored in x (longitude grows to the left), central longitude
 * centreLonDeg. Forward takes [lonDeg, latDeg] and gives picture pixels.
 */
export function mollweideProjection(width: number, centreLonDeg = 0): GeoProjection {
  return geoMollweide()
    .reflectX(true)
    .rotate([-centreLonDeg, 0])
    .scale(width / (4 * Math.SQRT2))
    .translate([width / 2, width / 4])
    .precision(0);
}

/** The Mollweide view of a picture area `width` pixels wide (even) and width / 2 high, cached. */
export function mollweideView(width: number, centreLonDeg = 0): SkyView {
  const key = `mol:${width}:${centreLonDeg}`;
  const hit = views.get(key);
  if (hit) return hit;
  const height = width / 2;
  const proj = mollweideProjection(width, centreLonDeg);
  const n = width * height;
  const vx = new Float64Array(n), vy = new Float64Array(n), vz = new Float64Array(n);
  const a = width / 2, b = height / 2;
  const p: [number, number] = [0, 0];
  for (let j = 0; j < height; j++) {
    const v = (j + 0.5 - b) / b;
    for (let i = 0; i < width; i++) {
      const k = j * width + i;
      const u = (i + 0.5 - a) / a;
      if (u * u + v * v > 1) { vx[k] = vy[k] = vz[k] = NaN; continue; }
      p[0] = i + 0.5; p[1] = j + 0.5;
      const ll = proj.invert!(p);
      const lon = degToRad(ll ? ll[0] : NaN), lat = degToRad(ll ? ll[1] : NaN);
      const cb = Math.cos(lat);
      vx[k] = cb * Math.cos(lon); vy[k] = cb * Math.sin(lon); vz[k] = Math.sin(lat);
    }
  }
  const centreLonRad = degToRad(centreLonDeg);
  const ll: [number, number] = [0, 0];
  return remember({
    kind: 'mollweide', width, height, key, vx, vy, vz, centreLonRad,
    project(lonRad, latRad, out) {
      ll[0] = radToDeg(lonRad); ll[1] = radToDeg(latRad);
      const xy = proj(ll);
      if (!xy) return false;
      out[0] = xy[0]; out[1] = xy[1];
      return true;
    },
  });
}

/**
 * A plate carree view: longitude lonMin..lonMax (rad, lonMax > lonMin, may pass
 * 0: e.g. -30 deg to 30 deg) from right to left, latitude latMin..latMax from
 * bottom to top, `width` x `height` pixels.
 */
export function cartesianView(
  width: number, height: number, lonMinRad: number, lonMaxRad: number, latMinRad: number, latMaxRad: number,
): SkyView {
  const key = `car:${width}x${height}:${lonMinRad}:${lonMaxRad}:${latMinRad}:${latMaxRad}`;
  const hit = views.get(key);
  if (hit) return hit;
  const n = width * height;
  const vx = new Float64Array(n), vy = new Float64Array(n), vz = new Float64Array(n);
  const dl = (lonMaxRad - lonMinRad) / width, db = (latMaxRad - latMinRad) / height;
  for (let j = 0; j < height; j++) {
    const lat = latMaxRad - (j + 0.5) * db;
    const cb = Math.cos(lat), sb = Math.sin(lat);
    for (let i = 0; i < width; i++) {
      const lon = lonMaxRad - (i + 0.5) * dl;
      const k = j * width + i;
      vx[k] = cb * Math.cos(lon); vy[k] = cb * Math.sin(lon); vz[k] = sb;
    }
  }
  const TWO_PI = 2 * Math.PI;
  return remember({
    kind: 'cartesian', width, height, key, vx, vy, vz, centreLonRad: (lonMinRad + lonMaxRad) / 2,
    window: { lonMinRad, lonMaxRad, latMinRad, latMaxRad },
    project(lonRad, latRad, out) {
      // Bring lon into [lonMin, lonMin + 2 pi).
      let l = lonRad - lonMinRad;
      l -= TWO_PI * Math.floor(l / TWO_PI);
      const x = (lonMaxRad - (lonMinRad + l)) / dl;
      const y = (latMaxRad - latRad) / db;
      out[0] = x; out[1] = y;
      return x >= -1e-9 && x <= width + 1e-9 && y >= -1e-9 && y <= height + 1e-9;
    },
  });
}
