/**
 * SkyMap construction (src/maps/create.ts): every invariant is checked and a
 * bad value gives an InputError naming it (common practice, no source; the
 * 12 Nside^2 pixel count is Gorski et al. 2005, ApJ 622, 759, section 4).
 */
import { describe, expect, it } from 'vitest';
import { createSkyMap } from '../../src/maps/create.js';
import { InputError } from '../../src/core/errors.js';

describe('createSkyMap', () => {
  it('builds a map with defaults', () => {
    const m = createSkyMap({ nside: 2, ordering: 'NESTED', frame: 'galactic', planes: [new Float32Array(48)] });
    expect(m.column).toBe('VALUE');
    expect(m.unit).toBe('');
    expect(m.energiesGeV).toBeNull();
    expect(m.planes[0].length).toBe(48);
  });
  it('keeps an energy axis', () => {
    const m = createSkyMap({
      nside: 1, ordering: 'RING', frame: 'equatorial', planes: [new Float64Array(12), new Float64Array(12)],
      energiesGeV: [1e3, 1e4], unit: 'GeV^-1 cm^-2 s^-1 sr^-1', column: 'FLUX',
    });
    expect(Array.from(m.energiesGeV!)).toEqual([1e3, 1e4]);
  });
  it('refuses bad input with one clear line', () => {
    const ok = { ordering: 'RING' as const, frame: 'galactic' as const };
    expect(() => createSkyMap({ ...ok, nside: 3, planes: [new Float32Array(108)] }, { file: 'a.fits' }))
      .toThrow(/^a\.fits: NSIDE is 3, expected a power of two/);
    expect(() => createSkyMap({ ...ok, nside: 2, planes: [new Float32Array(47)] }))
      .toThrow(/plane 0 holds 47 values, expected 12 Nside\^2 = 48/);
    expect(() => createSkyMap({ ...ok, nside: 1, planes: [] })).toThrow(InputError);
    expect(() => createSkyMap({ ...ok, nside: 1, planes: [new Float32Array(12)], energiesGeV: [1, 2] }))
      .toThrow(/2 energies for 1 planes/);
    expect(() => createSkyMap({ ...ok, nside: 1, planes: [new Float32Array(12)], energiesGeV: [NaN] }))
      .toThrow(/energy 0 is NaN GeV/);
    expect(() => createSkyMap({ ...ok, ordering: 'XYZ' as never, nside: 1, planes: [new Float32Array(12)] }))
      .toThrow(/ordering is 'XYZ'/);
    expect(() => createSkyMap({ ...ok, frame: 'ecliptic' as never, nside: 1, planes: [new Float32Array(12)] }))
      .toThrow(/frame is 'ecliptic'/);
  });
});
