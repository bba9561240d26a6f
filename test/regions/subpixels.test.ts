import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { nestToRing } from '../../src/sphere/pixelIndex.js';
import { ringTable } from '../../src/sphere/ringTable.js';
import { pixelRadiusBound, ringToFaceXY, subpixelCentre } from '../../src/regions/subpixels.js';

/** Centre of NESTED pixel `nest` from the lead's verified kernels (nestToRing + ringTable). */
function viaRing(nside: number, nest: number): [number, number] {
  const t = ringTable(nside);
  const ring = nestToRing(nside, nest);
  let r = 0;
  while (r + 1 < t.count && t.first[r + 1] <= ring) r++;
  return [t.z[r], t.phi0[r] + (ring - t.first[r]) * t.dphi[r]];
}

function spread(v: number): number {
  let s = 0;
  for (let b = 0; b < 16; b++) s += ((v >> b) & 1) * 2 ** (2 * b);
  return s;
}

describe('NESTED sub-pixel centres (Gorski et al. 2005, ApJ 622, 759; checked against nestToRing + ringTable)', () => {
  it('match every pixel centre at Nside 1 to 16', () => {
    const out = new Float64Array(3);
    for (const nside of [1, 2, 4, 8, 16]) {
      const n2 = nside * nside;
      for (let nest = 0; nest < 12 * n2; nest++) {
        const face = Math.floor(nest / n2), f = nest - face * n2;
        let ix = 0, iy = 0;
        for (let b = 0; b < 8; b++) { ix |= ((f >> (2 * b)) & 1) << b; iy |= ((f >> (2 * b + 1)) & 1) << b; }
        subpixelCentre(face, ix, iy, nside, out);
        const [z, phi] = viaRing(nside, nest);
        expect(Math.abs(out[0] - z)).toBeLessThan(1e-15);
        expect(Math.abs(out[2] - phi)).toBeLessThan(1e-13);
        expect(Math.abs(out[1] - Math.sqrt(1 - z * z))).toBeLessThan(1e-12);
      }
    }
  });

  it('match at random pixels up to Nside 8192 (seeded property test), and ringToFaceXY inverts the layout', () => {
    const out = new Float64Array(3), fxy = new Float64Array(3);
    fc.assert(fc.property(fc.integer({ min: 5, max: 13 }), fc.integer({ min: 0, max: 11 }), fc.nat(), fc.nat(), (order, face, a, b) => {
      const nside = 2 ** order;
      const ix = a % nside, iy = b % nside;
      const nest = face * nside * nside + spread(ix) + 2 * spread(iy);
      subpixelCentre(face, ix, iy, nside, out);
      const [z, phi] = viaRing(nside, nest);
      ringToFaceXY(nside, nestToRing(nside, nest), fxy);
      return Math.abs(out[0] - z) < 1e-14 && Math.abs(out[2] - phi) < 1e-12 && fxy[0] === face && fxy[1] === ix && fxy[2] === iy;
    }), { seed: 20261202, numRuns: 300 });
  });

  it('pixelRadiusBound holds every sub-pixel centre of a pixel (depth 5) at Nside 1, 2, 4, 64 (common practice, no source)', () => {
    const c = new Float64Array(3), s = new Float64Array(3);
    for (const nside of [1, 2, 4, 64]) {
      const bound = pixelRadiusBound(nside);
      let worst = 0;
      const faces = nside === 64 ? [0, 4, 8] : [...Array(12).keys()];
      for (const face of faces) for (let ix = 0; ix < Math.min(nside, 4); ix++) for (let iy = 0; iy < Math.min(nside, 4); iy++) {
        subpixelCentre(face, ix, iy, nside, c);
        for (let u = 0; u < 32; u++) for (let v = 0; v < 32; v++) {
          subpixelCentre(face, ix * 32 + u, iy * 32 + v, nside * 32, s);
          const cosd = c[0] * s[0] + c[1] * s[1] * Math.cos(c[2] - s[2]);
          worst = Math.max(worst, Math.acos(Math.min(1, cosd)));
        }
      }
      expect(worst).toBeLessThan(bound);
      expect(worst).toBeGreaterThan(0.7 * bound); // the bound is not wildly loose
    }
  });
});
