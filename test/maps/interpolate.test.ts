/**
 * Bilinear interpolation on four pixel centres (src/maps/interpolate.ts)
 * against healpy 1.16's get_interp_weights (Debian python3-healpy, through
 * scripts/healpy_reference.py), for 410 directions including the poles and the
 * phi wrap; plus exactness and blank handling (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { interpolationWeights, interpolateRing } from '../../src/maps/interpolate.js';
import { pixelCentres } from '../../src/sphere/bulk.js';
import { isBlank } from '../../src/maps/blank.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { healpyReference } from '../sphere/healpyFixture.js';

const ref = healpyReference();

describe.skipIf(!ref)('interpolationWeights against healpy.get_interp_weights', () => {
  it('gives the same four pixels and weights (1e-12) at Nside 1, 4 and 32', () => {
    const { theta, phi } = ref!.directions;
    const pix = new Uint32Array(4), w = new Float64Array(4);
    for (const [key, r] of Object.entries(ref!.interp)) {
      const n = Number(key);
      for (let i = 0; i < theta.length; i++) {
        interpolationWeights(n, theta[i], phi[i], pix, w);
        expect(Array.from(pix)).toEqual(r.pix[i]);
        for (let k = 0; k < 4; k++) expect(Math.abs(w[k] - r.w[i][k])).toBeLessThan(1e-12);
      }
    }
  });
});

describe('documented example', () => {
  it.skipIf(!ref)('the weights written out below are healpy\'s (scripts/healpy_reference.py, "spot")', () => {
    const [p, w] = ref!.spot.interp_4_001_03;
    expect(p).toEqual([1, 2, 3, 0]);
    const hw = [0.23777388, 0.23777388, 0.25288605, 0.27156619];
    for (let k = 0; k < 4; k++) expect(Math.abs(w[k] - hw[k])).toBeLessThan(5e-9);
  });
  it('interpolationWeights(4, 0.01, 0.3) uses the polar ring 1, 2, 3, 0 (healpy 1.16 gives the same, checked above)', () => {
    const pix = new Uint32Array(4), w = new Float64Array(4);
    interpolationWeights(4, 0.01, 0.3, pix, w);
    expect(Array.from(pix)).toEqual([1, 2, 3, 0]);
    // healpy.get_interp_weights(4, 0.01, 0.3) weights, printed by scripts/healpy_reference.py (Debian python3-healpy).
    const hw = [0.23777388, 0.23777388, 0.25288605, 0.27156619];
    for (let k = 0; k < 4; k++) expect(w[k]).toBeCloseTo(hw[k], 7);
  });
});

describe('interpolateRing', () => {
  const nside = 16, npix = 12 * nside * nside;
  const th = new Float64Array(npix), ph = new Float64Array(npix);
  pixelCentres(nside, 'RING', th, ph);

  it('returns the pixel value at a pixel centre and sums weights to 1', () => {
    const plane = new Float64Array(npix).map((_, i) => Math.sin(i));
    const pix = new Uint32Array(4), w = new Float64Array(4);
    for (let p = 0; p < npix; p += 37) {
      expect(interpolateRing(plane, nside, th[p], ph[p])).toBeCloseTo(plane[p], 12);
      interpolationWeights(nside, th[p] + 0.01, ph[p] + 7, pix, w);
      expect(Math.abs(w[0] + w[1] + w[2] + w[3] - 1)).toBeLessThan(1e-14);
    }
  });
  it('is exact for a field linear in theta between rings in the belt', () => {
    const plane = Float64Array.from(th, (t) => 3 * t - 1);
    for (const t of [0.9, 1.3, 1.5707, 2.0]) expect(interpolateRing(plane, nside, t, 0.77)).toBeCloseTo(3 * t - 1, 12);
  });
  it('at the poles gives the mean of the four polar pixels', () => {
    const plane = Float64Array.from(th, (_, i) => i);
    expect(interpolateRing(plane, nside, 0, 1.0)).toBeCloseTo(1.5, 12);
    expect(interpolateRing(plane, nside, Math.PI, 4.0)).toBeCloseTo(npix - 2.5, 12);
  });
  it('drops blank neighbours and renormalises; all blank gives BLANK', () => {
    const plane = new Float32Array(npix).fill(2);
    plane[100] = BLANK;
    plane[101] = NaN;
    // Between pixels 100 and 101 (same ring): only the other ring remains, value 2.
    const t = (th[100] + th[140]) / 2;
    expect(interpolateRing(plane, nside, t, (ph[100] + ph[101]) / 2)).toBeCloseTo(2, 6);
    plane.fill(BLANK);
    expect(isBlank(interpolateRing(plane, nside, 1, 1))).toBe(true);
  });
});
