import { describe, expect, it } from 'vitest';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';

const d = (x: number): number => (x * Math.PI) / 180;
const rel = (a: number, b: number): number => Math.abs(a - b) / b;

// Exact solid angles (spherical geometry, common knowledge):
//   lon/lat box: dl (sin b2 - sin b1); band of declination: 2 pi (sin d2 - sin d1);
//   disc of radius r: 2 pi (1 - cos r); annulus: 2 pi (cos r1 - cos r2); |b| < x: 4 pi sin x.
const doc = parseRegionDocument(`
regions:
  box: { box: { frame: galactic, lonDeg: [20, 110], latDeg: [-4, 4] } }
  site: { site: { latDeg: 33, maxZenithDeg: 45 } }
  disc: { disc: { frame: equatorial, atDeg: [83.6, 22.0], radiusDeg: 3 } }
  ring: { ring: { frame: galactic, atDeg: [-10, 30], radiiDeg: [2, 5] } }
  plane: { band: { frame: galactic, absLatDeg: [0, 4] } }
  high: { band: { frame: galactic, absLatDeg: [30, 90] } }
  sky: { sky: true }
`);
const exact: Record<string, number> = {
  box: d(90) * (Math.sin(d(4)) - Math.sin(d(-4))),
  site: 2 * Math.PI * (Math.sin(d(78)) - Math.sin(d(-12))),
  disc: 2 * Math.PI * (1 - Math.cos(d(3))),
  ring: 2 * Math.PI * (Math.cos(d(2)) - Math.cos(d(5))),
  plane: 4 * Math.PI * Math.sin(d(4)),
  high: 4 * Math.PI * (1 - Math.sin(d(30))),
  sky: 4 * Math.PI,
};

describe('solid angles with fractional coverage at Nside 256 (spherical geometry, common knowledge)', () => {
  for (const frame of ['galactic', 'equatorial'] as const) {
    it(`match the closed forms to 1e-5 relative in the ${frame} frame (required: 1e-4)`, () => {
      for (const name of Object.keys(exact)) {
        const w = evaluateRegion(doc, name, { nside: 256, frame });
        expect(rel(w.solidAngleSr, exact[name])).toBeLessThan(1e-5);
        let bad = 0;
        for (let i = 0; i < w.fraction.length; i++) if (!(w.fraction[i] >= 0 && w.fraction[i] <= 1)) bad++;
        expect(bad).toBe(0);
      }
    });
  }

  it('whole sky is exactly 4 pi in both modes', () => {
    for (const mode of ['centre', 'fraction'] as const) {
      const w = evaluateRegion(doc, 'sky', { nside: 64, frame: 'galactic', mode });
      expect(w.fraction.every((v) => v === 1)).toBe(true);
      expect(rel(w.solidAngleSr, 4 * Math.PI)).toBeLessThan(1e-14);
    }
  });
});

describe('the error shrinks as Nside grows (spherical geometry, common knowledge)', () => {
  it('centre mode: Galactic box evaluated in the equatorial frame, Nside 16 -> 256', () => {
    const errs = [16, 64, 256].map((nside) => rel(evaluateRegion(doc, 'box', { nside, frame: 'equatorial', mode: 'centre' }).solidAngleSr, exact.box));
    expect(errs[1]).toBeLessThan(errs[0]);
    expect(errs[2]).toBeLessThan(errs[1]);
    expect(errs[2]).toBeLessThan(2e-3);
  });

  it('fraction mode at a fixed depth of 2: declination band and Galactic box, Nside 32 -> 512', () => {
    for (const [name, frame] of [['site', 'galactic'], ['box', 'galactic'], ['disc', 'galactic']] as const) {
      const errs = [32, 128, 512].map((nside) => rel(evaluateRegion(doc, name, { nside, frame, depth: 2 }).solidAngleSr, exact[name]));
      expect(errs[2]).toBeLessThan(errs[0]);
      expect(Math.max(errs[1], errs[2])).toBeLessThan(errs[0]);
    }
  });

  it('fraction mode converges with depth: Galactic box at Nside 64, depth 0 -> 6', () => {
    const errs = [0, 2, 4, 6].map((depth) => rel(evaluateRegion(doc, 'box', { nside: 64, frame: 'galactic', depth }).solidAngleSr, exact.box));
    expect(errs[3]).toBeLessThan(errs[0] / 100);
    expect(errs[3]).toBeLessThan(1e-5);
  });
});

describe('longitude ranges that wrap through 0/360 (common practice, no source)', () => {
  it('[340, 20], [-20, 20] and the union of [0, 20] and [340, 360] give the same pixels', () => {
    const w = parseRegionDocument(`
frame: galactic
regions:
  a: { box: { lonDeg: [340, 20], latDeg: [-10, 10] } }
  b: { box: { lonDeg: [-20, 20], latDeg: [-10, 10] } }
  c: { any: [ { box: { lonDeg: [0, 20], latDeg: [-10, 10] } }, { box: { lonDeg: [340, 360], latDeg: [-10, 10] } } ] }
`);
    for (const mode of ['centre', 'fraction'] as const) {
      const [a, b, c] = ['a', 'b', 'c'].map((n) => evaluateRegion(w, n, { nside: 64, frame: 'galactic', mode }));
      expect(a.fraction).toEqual(b.fraction);
      let diff = 0;
      for (let i = 0; i < a.fraction.length; i++) diff = Math.max(diff, Math.abs(a.fraction[i] - c.fraction[i]));
      expect(diff).toBeLessThan(mode === 'centre' ? 1e-12 : 0.02); // the seam at 0 is split differently
      expect(rel(a.solidAngleSr, d(40) * 2 * Math.sin(d(10)))).toBeLessThan(mode === 'centre' ? 2e-2 : 1e-5);
    }
  });
});
