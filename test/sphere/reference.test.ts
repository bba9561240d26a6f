/**
 * The per-pixel reference wrappers (src/sphere/reference.ts) on healpy 1.16
 * spot values (printed by scripts/healpy_reference.py, "spot", and checked against it in
 * healpixGeometry.test.ts; theta = arccos(47/48) by hand there) and on the
 * definition of a disc (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { pixelToAngle, angleToPixel, ringToNestRef, nestToRingRef, queryDiscInclusive } from '../../src/sphere/reference.js';
import { pixelCentres } from '../../src/sphere/bulk.js';
import { angularDistance } from '../../src/core/math.js';

describe('reference wrappers', () => {
  it('reproduce the healpy spot values', () => {
    const a = pixelToAngle(4, 'RING', 0);
    expect(a.theta).toBeCloseTo(0.2044802, 7);
    expect(a.phi).toBeCloseTo(Math.PI / 4, 12);
    expect(angleToPixel(4, 'RING', Math.PI / 2, 0)).toBe(72);
    expect(angleToPixel(4, 'NESTED', Math.PI / 2, 0)).toBe(76);
    expect(ringToNestRef(4, 72)).toBe(76);
    expect(nestToRingRef(4, 76)).toBe(72);
  });
  it('wrap phi into [0, 2 pi) on both sides', () => {
    const a = pixelToAngle(1, 'RING', 0); // @hscmap/healpix returns 9 pi / 4 here
    expect(a.phi).toBeCloseTo(Math.PI / 4, 12);
    expect(angleToPixel(8, 'RING', 1.0, 0.3 + 2 * Math.PI)).toBe(angleToPixel(8, 'RING', 1.0, 0.3));
    expect(angleToPixel(8, 'RING', 1.0, 0.3 - 2 * Math.PI)).toBe(angleToPixel(8, 'RING', 1.0, 0.3));
  });
  it('list every pixel whose centre lies in a disc (and not far beyond it)', () => {
    const nside = 32, npix = 12 * nside * nside;
    const th = new Float64Array(npix), ph = new Float64Array(npix);
    pixelCentres(nside, 'RING', th, ph);
    const t0 = 1.1, p0 = 6.2, r = 0.15;
    const list = new Set(queryDiscInclusive(nside, 'RING', t0, p0, r));
    for (let p = 0; p < npix; p++) {
      const d = angularDistance(p0, Math.PI / 2 - t0, ph[p], Math.PI / 2 - th[p]);
      if (d <= r) expect(list.has(p)).toBe(true);
      if (d > r + 0.1) expect(list.has(p)).toBe(false);
    }
  });
});
