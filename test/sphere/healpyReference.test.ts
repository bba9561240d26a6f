/**
 * src/sphere kernels against healpy 1.16 (Debian python3-healpy) through the
 * committed script scripts/healpy_reference.py: pix2ang and ring2nest for every
 * pixel at Nside 1..16, ang2pix (RING and NESTED) for 400 seeded random
 * directions plus the poles, the phi = 0 / 2 pi wrap and the cap/belt boundary,
 * at Nside 1, 4, 64, 1024 and 8192.
 */
import { describe, expect, it } from 'vitest';
import { pixelCentres, anglesToPixels } from '../../src/sphere/bulk.js';
import { ringToNest } from '../../src/sphere/pixelIndex.js';
import { nside2npix } from '../../src/sphere/nside.js';
import { healpyReference } from './healpyFixture.js';

const ref = healpyReference();

describe.skipIf(!ref)('sphere kernels against healpy (scripts/healpy_reference.py)', () => {
  it('pixel centres and RING -> NESTED for every pixel at Nside 1..16', () => {
    for (const [key, r] of Object.entries(ref!.pix2ang)) {
      const n = Number(key), npix = nside2npix(n);
      const th = new Float64Array(npix), ph = new Float64Array(npix);
      pixelCentres(n, 'RING', th, ph);
      for (let p = 0; p < npix; p++) {
        expect(Math.abs(th[p] - r.theta[p])).toBeLessThan(1e-14);
        expect(Math.abs(ph[p] - r.phi[p])).toBeLessThan(1e-14);
        expect(ringToNest(n, p)).toBe(r.ring2nest[p]);
      }
    }
  });

  it('batched angle -> pixel equals healpy.ang2pix in both orderings, poles and phi wrap included', () => {
    const { theta, phi } = ref!.directions;
    const out = new Uint32Array(theta.length);
    for (const [key, r] of Object.entries(ref!.ang2pix)) {
      const n = Number(key);
      anglesToPixels(n, 'RING', theta, phi, out);
      expect(Array.from(out)).toEqual(r.ring);
      anglesToPixels(n, 'NESTED', theta, phi, out);
      expect(Array.from(out)).toEqual(r.nest);
    }
  });
});
