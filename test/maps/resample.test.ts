/**
 * Resampling (src/maps/resample.ts) against healpy 1.16's ud_grade (Debian
 * python3-healpy, scripts/healpy_reference.py): averaging with blanks (power 0,
 * pess=False), summing without blanks (power -2), from RING and NESTED input;
 * plus conservation checks (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { resample } from '../../src/maps/resample.js';
import { createSkyMap } from '../../src/maps/create.js';
import { reorder } from '../../src/maps/reorder.js';
import { isBlank } from '../../src/maps/blank.js';
import { BLANK, type SkyMap } from '../../src/maps/skyMap.js';
import { InputError } from '../../src/core/errors.js';
import { nestToRing } from '../../src/sphere/pixelIndex.js';
import { healpyReference } from '../sphere/healpyFixture.js';

const ref = healpyReference();

function expectClose(actual: ArrayLike<number>, expected: number[], rel = 1e-12): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const e = expected[i], a = actual[i];
    if (isBlank(e)) { expect(isBlank(a)).toBe(true); continue; }
    expect(Math.abs(a - e)).toBeLessThanOrEqual(rel * Math.max(1, Math.abs(e)));
  }
}

function mapOf(values: number[], ordering: 'RING' | 'NESTED' = 'RING'): SkyMap {
  return createSkyMap({ nside: Math.sqrt(values.length / 12), ordering, frame: 'galactic', planes: [Float64Array.from(values)] });
}

describe.skipIf(!ref)('resample against healpy.ud_grade', () => {
  it('averages intensive values over non-blank children (degrade 8 -> 4, 2; upgrade 8 -> 16)', () => {
    const u = ref!.udgrade;
    const m = mapOf(u.blanked);
    expectClose(resample(m, 2, { quantity: 'intensive' }).map.planes[0], u.ring_to_2);
    expectClose(resample(m, 4, { quantity: 'intensive' }).map.planes[0], u.ring_to_4);
    expectClose(resample(m, 16, { quantity: 'intensive' }).map.planes[0], u.ring_to_16);
  });
  it('works the same from NESTED input, output in NESTED', () => {
    const r = resample(reorder(mapOf(ref!.udgrade.blanked), 'NESTED'), 4, { quantity: 'intensive' });
    expect(r.map.ordering).toBe('NESTED');
    expectClose(r.map.planes[0], ref!.udgrade.nest_to_4);
  });
  it('sums extensive values (power -2): exact without blanks; with blanks = healpy x filled fraction', () => {
    const u = ref!.udgrade;
    expectClose(resample(mapOf(u.base), 2, { quantity: 'extensive' }).map.planes[0], u.ring_to_2_power_m2_base);
    expectClose(resample(mapOf(u.base), 32, { quantity: 'extensive' }).map.planes[0], u.ring_to_32_power_m2_base);
    // healpy scales the mean of the non-blank children by 4^k (it extrapolates
    // into blanks); skyspan sums only what is there and reports the fraction.
    const r = resample(mapOf(u.blanked), 2, { quantity: 'extensive' });
    const expected = u.ring_to_2_power_m2_blanked.map((v, i) => (isBlank(v) ? v : v * r.filledFraction[i]));
    expectClose(r.map.planes[0], expected);
  });
  it('reports the filled fraction: blank parent 0, others counted', () => {
    const u = ref!.udgrade;
    const r = resample(mapOf(u.blanked), 2, { quantity: 'intensive' });
    let blanks = 0;
    for (let p = 0; p < 768; p++) if (isBlank(u.blanked[p])) blanks++;
    // 768 input pixels, 16 per output pixel: the missing area adds up to the blanks.
    let missing = 0;
    for (let q = 0; q < 48; q++) missing += (1 - r.filledFraction[q]) * 16;
    expect(Math.round(missing)).toBe(blanks);
    // NESTED pixels 0..15 at Nside 8 were all blanked: NESTED pixel 0 at Nside 2.
    const q0 = nestToRing(2, 0);
    expect(r.filledFraction[q0]).toBe(0);
    expect(isBlank(r.map.planes[0][q0])).toBe(true);
  });
});

describe('resample conservation (common practice, no source)', () => {
  it('keeps the total of an extensive map and the mean of an intensive one', () => {
    const npix = 12 * 64 * 64;
    const p = new Float32Array(npix);
    for (let i = 0; i < npix; i++) p[i] = (i * 7919) % 101;
    const m = createSkyMap({ nside: 64, ordering: 'RING', frame: 'equatorial', planes: [p], energiesGeV: [10] });
    const sum = (a: ArrayLike<number>) => { let s = 0; for (let i = 0; i < a.length; i++) s += a[i]; return s; };
    for (const n of [1, 16, 256]) {
      const e = resample(m, n, { quantity: 'extensive' });
      expect(e.map.planes[0]).toBeInstanceOf(Float32Array);
      expect(Math.abs(sum(e.map.planes[0]) / sum(p) - 1)).toBeLessThan(1e-6);
      const i = resample(m, n, { quantity: 'intensive' });
      expect(Math.abs(sum(i.map.planes[0]) / i.map.planes[0].length / (sum(p) / npix) - 1)).toBeLessThan(1e-6);
      expect(e.map.nside).toBe(n);
      expect(e.map.energiesGeV![0]).toBe(10);
    }
  });
  it('upgrading marks children of a blank parent blank with fraction 0', () => {
    const p = new Float64Array(12).fill(1);
    p[5] = BLANK;
    const r = resample(createSkyMap({ nside: 1, ordering: 'NESTED', frame: 'galactic', planes: [p] }), 2, { quantity: 'intensive' });
    for (let c = 20; c < 24; c++) { expect(isBlank(r.map.planes[0][c])).toBe(true); expect(r.filledFraction[c]).toBe(0); }
    expect(r.filledFraction[0]).toBe(1);
  });
  it('refuses a bad Nside or quantity', () => {
    const m = createSkyMap({ nside: 1, ordering: 'RING', frame: 'galactic', planes: [new Float32Array(12)] });
    expect(() => resample(m, 3, { quantity: 'intensive' })).toThrow(InputError);
    expect(() => resample(m, 2, { quantity: 'counts' as never })).toThrow(/quantity is 'counts'/);
  });
});
