/**
 * Mask discs on a sky picture: a 0.5 deg disc on a 1200 px Mollweide picture
 * (about 1.7 px across) is drawn as a circle at the minimum radius around the
 * disc's projected centre, and a 5 deg disc in a zoomed window at its own
 * size. Positions come from the view's projection (d3-geo-projection's
 * Mollweide; plate carree in the zoom); the check is common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { renderSkyMap } from '../../src/render/skyImage.js';
import { fieldMap } from './fixtures.js';
import { decode, pixelAt } from './png.js';

const MARK = 0x7fffd4;
const near = (c: number, ref: number) => Math.abs((c >> 16) - (ref >> 16)) + Math.abs(((c >> 8) & 255) - ((ref >> 8) & 255)) + Math.abs((c & 255) - (ref & 255)) < 60;
const map = fieldMap(16, () => 1);

/** Distances (px) from the disc's projected centre of the picture pixels drawn in the marker colour, within `boxPx`. */
function markDistances(img: ReturnType<typeof renderSkyMap>, lonDeg: number, latDeg: number, boxPx: number): number[] {
  const d = decode(img.png), p = new Float64Array(2);
  img.view.project(lonDeg * Math.PI / 180, latDeg * Math.PI / 180, p);
  const cx = img.areaLeft + p[0], cy = img.areaTop + p[1], out: number[] = [];
  for (let j = Math.floor(cy - boxPx); j <= Math.ceil(cy + boxPx); j++) {
    for (let i = Math.floor(cx - boxPx); i <= Math.ceil(cx + boxPx); i++) if (near(pixelAt(d, i, j), MARK)) out.push(Math.hypot(i + 0.5 - cx, j + 0.5 - cy));
  }
  return out;
}

describe('mask discs on sky pictures', () => {
  it('a disc far below a pixel across is circled at the minimum radius (5 px at 1200 px wide)', () => {
    const img = renderSkyMap(map, { width: 1200, scale: 'linear', min: 0, max: 2, graticule: false,
      discs: { frame: 'galactic', marks: [{ lonRad: (30 * Math.PI) / 180, latRad: 0, radiusRad: (0.5 * Math.PI) / 180 }] } });
    const minR = 5;
    const ds = markDistances(img, 30, 0, 20);
    expect(ds.length).toBeGreaterThanOrEqual(8);
    for (const r of ds) expect(Math.abs(r - minR)).toBeLessThan(1.5);
  });
  it('a disc several pixels wide is circled at its own size in a zoomed window', () => {
    const img = renderSkyMap(map, { width: 600, scale: 'linear', min: 0, max: 2, graticule: false,
      zoom: { lonMinDeg: 0, lonMaxDeg: 40, latMinDeg: -20, latMaxDeg: 20 },
      discs: { frame: 'galactic', marks: [{ lonRad: (20 * Math.PI) / 180, latRad: 0, radiusRad: (5 * Math.PI) / 180 }] } });
    const R = (5 * img.view.width) / 40;
    const ds = markDistances(img, 20, 0, R + 10);
    expect(ds.length).toBeGreaterThanOrEqual(40);
    // plate carree: the rim of a 5 deg disc on the equator is a circle to 0.2 % (1 - cos 5 deg / ...), within the line width
    for (const r of ds) expect(Math.abs(r / R - 1)).toBeLessThan(0.06);
  });
});
