import { describe, expect, it } from 'vitest';
import { interpolateViridis } from 'd3-scale-chromatic';
import { renderSkyMap } from '../../src/render/skyImage.js';
import { mollweideProjection } from '../../src/render/skyView.js';
import { parseCssColour } from '../../src/render/colourMap.js';
import { angToRing } from '../../src/sphere/pixelIndex.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { reorder } from '../../src/maps/reorder.js';
import { cosAngle, fieldMap } from './fixtures.js';
import { decode, pixelAt } from './png.js';

const D2R = Math.PI / 180;

/**
 * Mollweide forward projection written out independently of d3 (Snyder 1987,
 * Map Projections: A Working Manual, USGS PP 1395, p. 249: x = (2 sqrt2 / pi) R
 * lambda cos(theta), y = sqrt2 R sin(theta), 2 theta + sin 2 theta = pi sin phi,
 * solved by Newton's method), placed on a picture area pw wide with longitude
 * growing to the left.
 */
function snyderPixel(pw: number, lonDeg: number, latDeg: number): [number, number] {
  const R = pw / (4 * Math.SQRT2);
  const phi = latDeg * D2R, lam = lonDeg * D2R;
  let t = phi;
  for (let k = 0; k < 50; k++) t -= (2 * t + Math.sin(2 * t) - Math.PI * Math.sin(phi)) / (2 + 2 * Math.cos(2 * t));
  const x = ((2 * Math.SQRT2) / Math.PI) * R * lam * Math.cos(t), y = Math.SQRT2 * R * Math.sin(t);
  return [pw / 2 - x, pw / 4 - y];
}

/** Centroid of picture-area pixels whose colour is the highest colour-table entry present. */
function brightestCentroid(png: Buffer, lutRgb: Uint8Array, left: number, top: number, w: number, h: number): [number, number] {
  const d = decode(png);
  const index = new Map<number, number>();
  for (let k = 0; k < 256; k++) index.set((lutRgb[3 * k] << 16) | (lutRgb[3 * k + 1] << 8) | lutRgb[3 * k + 2], k);
  let best = -1, sx = 0, sy = 0, n = 0;
  for (let j = 0; j < h; j++) for (let i = 0; i < w; i++) {
    const k = index.get(pixelAt(d, left + i, top + j));
    if (k === undefined || k < best) continue;
    if (k > best) { best = k; sx = sy = n = 0; }
    sx += i + 0.5; sy += j + 0.5; n++;
  }
  return [sx / n, sy / n];
}

describe('Mollweide sky picture', () => {
  it('d3 geoMollweide with the flip agrees with Snyder’s formula (independent spot check)', () => {
    const pw = 1000, proj = mollweideProjection(pw);
    for (const [l, b] of [[30, 20], [-150, -65], [0, 0], [179, 5]]) {
      const [x, y] = proj([l, b])!;
      const [xs, ys] = snyderPixel(pw, l, b);
      expect(Math.abs(x - xs)).toBeLessThan(1e-3);
      expect(Math.abs(y - ys)).toBeLessThan(1e-3);
    }
    // Longitude grows to the left, Galactic centre in the middle (astronomical convention).
    expect(proj([30, 0])![0]).toBeLessThan(proj([0, 0])![0]);
    expect(proj([0, 0])).toEqual([500, 250]);
  });

  it('puts the brightest pixel of a dipole towards (l, b) = (30, 20) deg where the projection says', () => {
    const map = fieldMap(128, (l, b) => cosAngle(l, b, 30 * D2R, 20 * D2R));
    const img = renderSkyMap(map, { width: 800, scale: 'linear', min: 0.99, max: 1, colourMap: 'viridis', graticule: false });
    const pw = img.view.width;
    const [ex, ey] = snyderPixel(pw, 30, 20);
    const [cx, cy] = brightestCentroid(img.png, img.lut.rgb, img.areaLeft, img.areaTop, pw, img.view.height);
    // One Nside-128 pixel is 0.46 deg, about 1 picture pixel here.
    expect(Math.hypot(cx - ex, cy - ey)).toBeLessThan(1.5);
  });

  it('colours the Galactic centre with d3-scale-chromatic’s viridis at the map value shown there', () => {
    const map = fieldMap(64, (l, b) => cosAngle(l, b, 30 * D2R, 20 * D2R));
    const img = renderSkyMap(map, { width: 640, scale: 'linear', min: -1, max: 1, colourMap: 'viridis', graticule: false });
    const pw = img.view.width;
    const i = Math.floor(pw / 2), j = Math.floor(pw / 4); // the pixel at (or just below-right of) the area centre
    const ll = mollweideProjection(pw).invert!([i + 0.5, j + 0.5])!;
    expect(Math.abs(ll[0])).toBeLessThan(0.5);
    expect(Math.abs(ll[1])).toBeLessThan(0.5);
    const v = map.planes[0][angToRing(64, Math.PI / 2 - ll[1] * D2R, ll[0] * D2R < 0 ? ll[0] * D2R + 2 * Math.PI : ll[0] * D2R)];
    const expected = parseCssColour(interpolateViridis((v + 1) / 2)); // d3-scale-chromatic: the outside reference
    const d = decode(img.png);
    expect(pixelAt(d, img.areaLeft + i, img.areaTop + j)).toBe(expected);
    expect(Math.abs(img.areaLeft + i - img.width / 2)).toBeLessThanOrEqual(1);
  });

  it('decodes to the requested width and the reported height, with a 2:1 ellipse', () => {
    const map = fieldMap(16, (l, b) => Math.sin(b));
    const img = renderSkyMap(map, { width: 731, title: 'size check' });
    const d = decode(img.png);
    expect(d.width).toBe(731);
    expect(d.height).toBe(img.height);
    expect(img.view.width).toBe(2 * img.view.height);
    expect(img.areaTop + img.view.height).toBeLessThan(img.height);
  });

  it('draws zero, negative and blank pixels on a log scale: lowest colour and the blank colour', () => {
    const map = fieldMap(64, (l, b) => {
      const dc = Math.acos(Math.min(1, cosAngle(l, b, 0, 0)));
      const dw = Math.acos(Math.min(1, cosAngle(l, b, 90 * D2R, 0)));
      if (dc < 8 * D2R) return BLANK;
      if (dw < 8 * D2R) return -5;
      if (b > 60 * D2R) return 0;
      if (b < -60 * D2R) return NaN;
      return 1 + Math.cos(b);
    });
    const img = renderSkyMap(map, { width: 600, scale: 'log', colourMap: 'magma', graticule: false });
    const d = decode(img.png);
    const proj = mollweideProjection(img.view.width);
    const at = (l: number, b: number) => { const [x, y] = proj([l, b])!; return pixelAt(d, img.areaLeft + Math.floor(x), img.areaTop + Math.floor(y)); };
    const lowest = (img.lut.rgb[0] << 16) | (img.lut.rgb[1] << 8) | img.lut.rgb[2];
    expect(at(0, 0)).toBe(img.lut.blank);
    expect(at(-75, -75)).toBe(img.lut.blank); // NaN is blank too
    expect(at(90, 0)).toBe(lowest);
    expect(at(10, 75)).toBe(lowest);
    expect(img.blankPixels).toBeGreaterThan(0);
    for (let k = 0; k < 256; k++) expect((img.lut.rgb[3 * k] << 16) | (img.lut.rgb[3 * k + 1] << 8) | img.lut.rgb[3 * k + 2]).not.toBe(img.lut.blank);
  });

  it('shows a map of the north Galactic pole at its equatorial position in the equatorial frame', () => {
    const map = fieldMap(128, (l, b) => Math.sin(b));
    const img = renderSkyMap(map, { width: 800, frame: 'equatorial', scale: 'linear', min: 0.995, max: 1, colourMap: 'viridis', graticule: false });
    // North Galactic pole in ICRS: RA 192.85948 deg, Dec +27.12825 deg (from memory; the values astropy uses).
    const [ex, ey] = snyderPixel(img.view.width, 192.85948 - 360, 27.12825);
    const [cx, cy] = brightestCentroid(img.png, img.lut.rgb, img.areaLeft, img.areaTop, img.view.width, img.view.height);
    expect(Math.hypot(cx - ex, cy - ey)).toBeLessThan(1.5);
  });

  it('draws a NESTED map exactly like the same map in RING order', () => {
    const ring = fieldMap(32, (l, b) => cosAngle(l, b, 1, 0.4) + 0.3 * Math.sin(3 * l));
    const a = renderSkyMap(ring, { width: 400, colourMap: 'cividis' });
    const b = renderSkyMap(reorder(ring, 'NESTED'), { width: 400, colourMap: 'cividis' });
    expect(Buffer.compare(a.png, b.png)).toBe(0);
  });

  it('puts a spot at (l, b) = (10, 2) deg at its plate carree position in a zoomed window, longitude to the left', () => {
    const map = fieldMap(256, (l, b) => cosAngle(l, b, 10 * D2R, 2 * D2R));
    const img = renderSkyMap(map, { width: 700, zoom: { lonMinDeg: -20, lonMaxDeg: 40, latMinDeg: -10, latMaxDeg: 10 },
      scale: 'linear', min: 0.999, max: 1, colourMap: 'viridis', graticule: false });
    const { width: pw, height: ph } = img.view;
    // Plate carree: x linear in longitude from lonMax at the left edge, y linear in latitude (common practice, no source).
    const ex = ((40 - 10) / 60) * pw, ey = ((10 - 2) / 20) * ph;
    const [cx, cy] = brightestCentroid(img.png, img.lut.rgb, img.areaLeft, img.areaTop, pw, ph);
    expect(Math.hypot(cx - ex, cy - ey)).toBeLessThan(1.5);
    expect(ph).toBe(Math.round(pw / 3));
  });

  it('rejects a plane that does not exist and a bad width', () => {
    const map = fieldMap(8, () => 1);
    expect(() => renderSkyMap(map, { plane: 1 })).toThrow(/plane 2 does not exist: the map has 1 plane\(s\), numbered from 1/);
    expect(() => renderSkyMap(map, { width: 100 })).toThrow(/width is 100/);
  });
});

describe('latitude labels of the full-sky picture', () => {
  it('"0°" stands at least 10 px clear of the rim, where outlines of a band or a box across l = 180 end', () => {
    // Legibility (common practice, no source): a label must not touch the drawing next to it. The rim's
    // leftmost point is the equator at the picture area's left edge (Mollweide: x = 0 at l = 180 deg).
    const map = fieldMap(8, () => 1);
    const img = renderSkyMap(map, { width: 1200, scale: 'linear', min: 0, max: 2 });
    const d = decode(img.png);
    const cy = img.areaTop + Math.round(img.view.height / 2), bg = pixelAt(d, 1, cy);
    let inkRight = -1;
    for (let j = cy - 12; j <= cy + 12; j++) for (let i = 0; i < img.areaLeft - 2; i++) if (pixelAt(d, i, j) !== bg) inkRight = Math.max(inkRight, i);
    expect(inkRight).toBeGreaterThan(0); // the label is there
    expect(img.areaLeft - inkRight).toBeGreaterThanOrEqual(10);
  });
});
