/**
 * Reframing (src/maps/reframe.ts). Checks: (1) against the analytic rotated
 * field of a dipole (exact answer: the dipole axis rotated by the Hipparcos
 * matrix; accuracy figures as documented in reframe.ts); (2) against healpy
 * 1.16's Rotator(coord=['G','C']).rotate_map_pixel (Debian python3-healpy,
 * scripts/healpy_reference.py), which uses the same four-pixel scheme and
 * healpy's own Galactic matrix (4e-8 from the Hipparcos one, computed with healpy).
 */
import { describe, expect, it } from 'vitest';
import { reframe } from '../../src/maps/reframe.js';
import { createSkyMap } from '../../src/maps/create.js';
import { reorder } from '../../src/maps/reorder.js';
import { pixelCentres } from '../../src/sphere/bulk.js';
import { rotationMatrix } from '../../src/sphere/frameRotation.js';
import { isBlank } from '../../src/maps/blank.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { InputError } from '../../src/core/errors.js';
import { healpyReference } from '../sphere/healpyFixture.js';

const AXIS = (() => { const a = [0.3, -0.5, 0.81], n = Math.hypot(...a); return a.map((x) => x / n); })();

/** Dipole map in the Galactic frame and the exact answer in equatorial coordinates. */
function dipoleErrors(nside: number) {
  const npix = 12 * nside * nside;
  const th = new Float64Array(npix), ph = new Float64Array(npix);
  pixelCentres(nside, 'RING', th, ph);
  const dip = (t: number, p: number, a: number[]) =>
    Math.sin(t) * Math.cos(p) * a[0] + Math.sin(t) * Math.sin(p) * a[1] + Math.cos(t) * a[2];
  const plane = Float64Array.from(th, (t, i) => dip(t, ph[i], AXIS));
  const out = reframe(createSkyMap({ nside, ordering: 'RING', frame: 'galactic', planes: [plane] }), 'equatorial');
  // The same dipole seen in equatorial coordinates has axis M^T a (M: eq -> gal).
  const m = rotationMatrix('galactic', 'equatorial');
  const axisEq = [0, 1, 2].map((i) => m[3 * i] * AXIS[0] + m[3 * i + 1] * AXIS[1] + m[3 * i + 2] * AXIS[2]);
  const g = rotationMatrix('equatorial', 'galactic');
  let sq = 0, max = 0, maxBelt = 0;
  for (let i = 0; i < npix; i++) {
    const e = Math.abs(out.planes[0][i] - dip(th[i], ph[i], axisEq));
    // Input-frame z of this output pixel, to split the belt from the caps.
    const st = Math.sin(th[i]);
    const zIn = g[6] * st * Math.cos(ph[i]) + g[7] * st * Math.sin(ph[i]) + g[8] * Math.cos(th[i]);
    sq += e * e;
    max = Math.max(max, e);
    if (Math.abs(zIn) <= 2 / 3) maxBelt = Math.max(maxBelt, e);
  }
  return { rms: Math.sqrt(sq / npix), max, maxBelt };
}

describe('reframe accuracy on a dipole (analytic answer)', () => {
  it('Nside 64: rms < 4.5e-5, max < 6e-5 in the input belt, < 1.6e-3 overall (unit amplitude)', () => {
    const e = dipoleErrors(64);
    expect(e.rms).toBeLessThan(4.5e-5);
    expect(e.maxBelt).toBeLessThan(6e-5);
    expect(e.max).toBeLessThan(1.6e-3);
  });
  it('the rms error falls as the pixel area (second order): Nside 32 -> 64 by more than 3.5', () => {
    expect(dipoleErrors(32).rms / dipoleErrors(64).rms).toBeGreaterThan(3.5);
  });
});

const ref = healpyReference();

describe.skipIf(!ref)('reframe against healpy Rotator.rotate_map_pixel', () => {
  it('agrees on a smooth map at Nside 32 to 2e-7 (measured 4.9e-8: the two Galactic matrices differ by 4e-8)', () => {
    const r = ref!.rotate;
    const m = createSkyMap({ nside: r.nside, ordering: 'RING', frame: 'galactic', planes: [Float64Array.from(r.input)] });
    const out = reframe(m, 'equatorial').planes[0];
    let worst = 0;
    for (let i = 0; i < out.length; i++) worst = Math.max(worst, Math.abs(out[i] - r.output[i]));
    expect(worst).toBeLessThan(2e-7);
  });
});

describe('reframe handling', () => {
  it('keeps NESTED ordering, float32, and round-trips a smooth map near its input', () => {
    const nside = 32, npix = 12 * nside * nside;
    const th = new Float64Array(npix), ph = new Float64Array(npix);
    pixelCentres(nside, 'NESTED', th, ph);
    const plane = Float32Array.from(th, (t) => Math.cos(t));
    const m = createSkyMap({ nside, ordering: 'NESTED', frame: 'equatorial', planes: [plane, plane.slice()], energiesGeV: [1, 2] });
    const gal = reframe(m, 'galactic');
    expect(gal.ordering).toBe('NESTED');
    expect(gal.frame).toBe('galactic');
    expect(gal.planes[0]).toBeInstanceOf(Float32Array);
    const back = reframe(gal, 'equatorial');
    let worst = 0;
    for (let i = 0; i < npix; i++) worst = Math.max(worst, Math.abs(back.planes[1][i] - plane[i]));
    expect(worst).toBeLessThan(2e-2);
    // Same as reframing the RING version and reordering.
    const viaRing = reorder(reframe(reorder(m, 'RING'), 'galactic'), 'NESTED');
    expect(Array.from(gal.planes[0])).toEqual(Array.from(viaRing.planes[0]));
  });
  it('leaves blank regions blank and refuses an unknown frame', () => {
    const p = new Float64Array(12 * 16 * 16).fill(BLANK);
    const blankMap = createSkyMap({ nside: 16, ordering: 'RING', frame: 'galactic', planes: [p] });
    expect(reframe(blankMap, 'equatorial').planes[0].every((v) => isBlank(v))).toBe(true);
    expect(reframe(blankMap, 'galactic')).toBe(blankMap);
    const unknown = createSkyMap({ nside: 1, ordering: 'RING', frame: 'unknown', planes: [new Float32Array(12)] });
    expect(() => reframe(unknown, 'galactic')).toThrow(InputError);
  });
});
