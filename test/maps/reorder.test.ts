/**
 * RING <-> NESTED reordering of whole maps (src/maps/reorder.ts), checked
 * against the @hscmap/healpix reference index conversion and by round trip.
 */
import { describe, expect, it } from 'vitest';
import { reorder } from '../../src/maps/reorder.js';
import { createSkyMap } from '../../src/maps/create.js';
import { ringToNestRef } from '../../src/sphere/reference.js';
import { BLANK } from '../../src/maps/skyMap.js';

describe('reorder', () => {
  it('moves RING pixel p to NESTED index ring2nest(p) and back, for float32 and float64', () => {
    for (const nside of [1, 4, 32]) {
      const npix = 12 * nside * nside;
      const a = new Float64Array(npix), b = new Float32Array(npix);
      for (let p = 0; p < npix; p++) { a[p] = p + 0.5; b[p] = p % 7 === 0 ? BLANK : p; }
      const m = createSkyMap({ nside, ordering: 'RING', frame: 'galactic', planes: [a, b], energiesGeV: [1, 2], unit: 'u' });
      const n = reorder(m, 'NESTED');
      expect(n.ordering).toBe('NESTED');
      expect(n.planes[1]).toBeInstanceOf(Float32Array);
      for (let p = 0; p < npix; p++) expect(n.planes[0][ringToNestRef(nside, p)]).toBe(a[p]);
      const back = reorder(n, 'RING');
      expect(Array.from(back.planes[0])).toEqual(Array.from(a));
      expect(Array.from(back.planes[1])).toEqual(Array.from(b));
      expect(back.unit).toBe('u');
      expect(Array.from(back.energiesGeV!)).toEqual([1, 2]);
    }
  });
  it('returns the same map when the ordering already matches', () => {
    const m = createSkyMap({ nside: 1, ordering: 'RING', frame: 'galactic', planes: [new Float32Array(12)] });
    expect(reorder(m, 'RING')).toBe(m);
  });
});
