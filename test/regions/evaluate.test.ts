import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { compileRegion } from '../../src/regions/program.js';
import { beginRing, setPoint, signedDistance } from '../../src/regions/distance.js';
import { pixelRadiusBound } from '../../src/regions/subpixels.js';
import { exposureNormalisation, relativeExposure } from '../../src/regions/exposure.js';
import { ringTable } from '../../src/sphere/ringTable.js';
import { nestToRing, ringToNest } from '../../src/sphere/pixelIndex.js';
import { convertLonLat } from '../../src/sphere/frameRotation.js';
import { createSkyMap } from '../../src/maps/create.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import type { RegionDocument } from '../../src/regions/types.js';
import { tempDir } from '../helpers/tempDir.js';

const d = (x: number): number => (x * Math.PI) / 180;

/** Inside-test of every pixel centre, without any pruning: the reference for the per-ring shortcuts. */
function bruteCentres(doc: RegionDocument, name: string, nside: number, frame: 'galactic' | 'equatorial'): Float32Array {
  const prog = compileRegion(doc, name, frame, '.');
  const t = ringTable(nside);
  const out = new Float32Array(12 * nside * nside);
  const P = new Float64Array(10);
  for (let r = 0; r < t.count; r++) {
    beginRing(prog.root, t.theta[r], pixelRadiusBound(nside));
    for (let j = 0; j < t.length[r]; j++) {
      const phi = t.phi0[r] + j * t.dphi[r];
      setPoint(prog, P, t.sinTheta[r] * Math.cos(phi), t.sinTheta[r] * Math.sin(phi), t.z[r]);
      if (signedDistance(prog.root, P) >= 0) out[t.first[r] + j] = 1;
    }
  }
  return out;
}

/** Covered fraction by counting all 4^k sub-pixel centres (uniform, no pruning, no leaf formula). */
function bruteFractions(doc: RegionDocument, name: string, nside: number, frame: 'galactic' | 'equatorial', k: number): Float64Array {
  const prog = compileRegion(doc, name, frame, '.');
  const fine = nside * 2 ** k, t = ringTable(fine);
  const out = new Float64Array(12 * nside * nside);
  const P = new Float64Array(10);
  const ringOf = new Int32Array(12 * fine * fine);
  for (let r = 0; r < t.count; r++) for (let j = 0; j < t.length[r]; j++) ringOf[t.first[r] + j] = r;
  for (let p = 0; p < 12 * fine * fine; p++) {
    const r = ringOf[p], j = p - t.first[r];
    beginRing(prog.root, t.theta[r], pixelRadiusBound(fine));
    const phi = t.phi0[r] + j * t.dphi[r];
    setPoint(prog, P, t.sinTheta[r] * Math.cos(phi), t.sinTheta[r] * Math.sin(phi), t.z[r]);
    if (signedDistance(prog.root, P) >= 0) out[nestToRing(nside, Math.floor(ringToNest(fine, p) / 4 ** k))] += 1 / 4 ** k;
  }
  return out;
}

const frameArb = fc.constantFrom('galactic', 'equatorial');
const shapeArb = fc.oneof(
  fc.record({ frame: frameArb, lon: fc.integer({ min: -180, max: 359 }), w: fc.integer({ min: 5, max: 300 }), b1: fc.integer({ min: -80, max: 60 }), h: fc.integer({ min: 3, max: 60 }) })
    .map((s) => ({ box: { frame: s.frame, lonDeg: [s.lon, s.lon + s.w > 360 ? s.lon + s.w - 360 : s.lon + s.w], latDeg: [s.b1, Math.min(90, s.b1 + s.h)] } })),
  fc.record({ frame: frameArb, lon: fc.integer({ min: 0, max: 359 }), lat: fc.integer({ min: -90, max: 90 }), r: fc.integer({ min: 2, max: 70 }) })
    .map((s) => ({ disc: { frame: s.frame, atDeg: [s.lon, s.lat], radiusDeg: s.r } })),
  fc.record({ frame: frameArb, lon: fc.integer({ min: 0, max: 359 }), lat: fc.integer({ min: -90, max: 90 }), r: fc.integer({ min: 2, max: 40 }) })
    .map((s) => ({ ring: { frame: s.frame, atDeg: [s.lon, s.lat], radiiDeg: [s.r, s.r + 15] } })),
  fc.record({ frame: frameArb, a: fc.integer({ min: 0, max: 40 }), h: fc.integer({ min: 3, max: 50 }) })
    .map((s) => ({ band: { frame: s.frame, absLatDeg: [s.a, s.a + s.h] } })),
  fc.record({ lat: fc.integer({ min: -90, max: 90 }), z: fc.integer({ min: 10, max: 80 }) })
    .map((s) => ({ site: { latDeg: s.lat, maxZenithDeg: s.z } })),
);
const regionArb = fc.record({ op: fc.constantFrom('all', 'any'), items: fc.array(shapeArb, { minLength: 1, maxLength: 3 }), cut: fc.array(shapeArb, { maxLength: 2 }) })
  .map((r) => ({ regions: { a: r.cut.length > 0 ? { [r.op]: r.items, except: r.cut } : { [r.op]: r.items } } }));

describe('per-ring pruning and interval filling (checked against testing every pixel; common practice, no source)', () => {
  it('centre mode equals the inside-test of every pixel centre (seeded random regions, Nside 16, both frames)', () => {
    fc.assert(fc.property(regionArb, frameArb, (spec, frame) => {
      const doc = parseRegionDocument(spec);
      const w = evaluateRegion(doc, 'a', { nside: 16, frame, mode: 'centre' });
      const ref = bruteCentres(doc, 'a', 16, frame);
      let diff = 0;
      for (let i = 0; i < ref.length; i++) if (ref[i] !== w.fraction[i]) diff++;
      return diff === 0;
    }), { seed: 424242, numRuns: 120 });
  });

  it('fraction mode agrees with counting all 4^4 sub-pixel centres of every pixel (seeded random regions, Nside 8)', () => {
    fc.assert(fc.property(regionArb, frameArb, (spec, frame) => {
      const doc = parseRegionDocument(spec);
      const w = evaluateRegion(doc, 'a', { nside: 8, frame, depth: 6 });
      const ref = bruteFractions(doc, 'a', 8, frame, 4);
      let worst = 0;
      for (let i = 0; i < ref.length; i++) worst = Math.max(worst, Math.abs(ref[i] - w.fraction[i]));
      return worst < 0.08; // uniform 16 x 16 counting is itself off by up to ~1/16 along an edge
    }), { seed: 777, numRuns: 25 });
  });
});

describe('exposure per pixel', () => {
  const doc = parseRegionDocument('regions:\n  s:\n    site: { latDeg: 30, maxZenithDeg: 45, weight: zenith }\n  t:\n    site: { latDeg: 30, maxZenithDeg: 45, weight: time }\n');

  it('equals the normalised Sommers exposure at each pixel centre declination, in either frame (Sommers 2001, eq. 2)', () => {
    for (const frame of ['equatorial', 'galactic'] as const) {
      for (const name of ['s', 't']) {
        const wt = name === 's' ? 'zenith' : 'time';
        const w = evaluateRegion(doc, name, { nside: 16, frame, mode: 'centre' });
        const norm = exposureNormalisation(d(30), d(45), wt).max;
        const t = ringTable(16);
        let worst = 0, max = 0;
        for (let r = 0; r < t.count; r++) for (let j = 0; j < t.length[r]; j++) {
          const p = t.first[r] + j;
          const lat = Math.PI / 2 - t.theta[r], lon = t.phi0[r] + j * t.dphi[r];
          const dec = frame === 'equatorial' ? lat : convertLonLat(lon, lat, 'galactic', 'equatorial').latRad;
          const want = w.fraction[p] > 0 ? relativeExposure(dec, d(30), d(45), wt) / norm : 0;
          worst = Math.max(worst, Math.abs(w.exposure![p] - want));
          max = Math.max(max, w.exposure![p]);
        }
        expect(worst).toBeLessThan(1e-6); // float32 storage
        expect(max).toBeLessThanOrEqual(1);
        expect(max).toBeGreaterThan(0.99);
      }
    }
  });

  it('from an exposure map file: a map of the Sommers exposure gives back the same weights (bilinear, Nside 64 map)', () => {
    const dir = tempDir('skyspan-expmap-');
    const nside = 64, t = ringTable(nside);
    const plane = new Float32Array(12 * nside * nside);
    for (let r = 0; r < t.count; r++) for (let j = 0; j < t.length[r]; j++) {
      plane[t.first[r] + j] = 3 * relativeExposure(Math.PI / 2 - t.theta[r], d(30), d(45), 'zenith'); // any scale: normalised on reading
    }
    writeMapFile(join(dir, 'exposure.fits'), createSkyMap({ nside, ordering: 'RING', frame: 'equatorial', planes: [plane] }));
    const mapDoc = parseRegionDocument('regions:\n  m:\n    site: { latDeg: 30, maxZenithDeg: 45, weight: { map: exposure.fits } }\n', join(dir, 'r.yaml'));
    const same = evaluateRegion(mapDoc, 'm', { nside, frame: 'equatorial', mode: 'centre' });
    const ref = evaluateRegion(doc, 's', { nside, frame: 'equatorial', mode: 'centre' });
    let worst = 0;
    for (let i = 0; i < plane.length; i++) worst = Math.max(worst, Math.abs(same.exposure![i] - ref.exposure![i]));
    expect(worst).toBeLessThan(2e-3); // the map's maximum sits on a ring, not at the exact maximum
    const other = evaluateRegion(mapDoc, 'm', { nside: 32, frame: 'galactic', mode: 'centre' });
    const ref2 = evaluateRegion(doc, 's', { nside: 32, frame: 'galactic', mode: 'centre' });
    const t2 = ringTable(32);
    let inner = 0, edge = 0;
    for (let r = 0; r < t2.count; r++) for (let j = 0; j < t2.length[r]; j++) {
      const i = t2.first[r] + j;
      const dec = convertLonLat(t2.phi0[r] + j * t2.dphi[r], Math.PI / 2 - t2.theta[r], 'galactic', 'equatorial').latRad;
      const e = Math.abs(other.exposure![i] - ref2.exposure![i]);
      if (dec > d(-13) && dec < d(73)) inner = Math.max(inner, e); else edge = Math.max(edge, e);
    }
    // bilinear interpolation of a Nside 64 map: close inside, coarser where omega rises steeply at the band edge
    expect(inner).toBeLessThan(0.01);
    expect(edge).toBeLessThan(0.1);
    expect(other.notes.join(' ')).toContain('interpolated');
  });
});

describe('catalogue masks with growth by the angular resolution (r = sqrt(r_src^2 + (k psf)^2), common practice)', () => {
  it('an equatorial catalogue source gives the same pixels as a disc of the grown radius at its Galactic position', () => {
    const dir = tempDir('skyspan-cat-');
    // invented sources: one with its own radius, one with the default
    writeFileSync(join(dir, 'cat.csv'), 'name,ra,dec,radius\nx,120,-30,1\ny,200,10,\n');
    const doc = parseRegionDocument(`regions:
  cat: { sources: { file: cat.csv, frame: equatorial, radiusDeg: 0.5, psfDeg: 0.3, psfTimes: 2, columns: { lon: ra, lat: dec } } }
`, join(dir, 'r.yaml'));
    const gx = convertLonLat(d(120), d(-30), 'equatorial', 'galactic');
    const gy = convertLonLat(d(200), d(10), 'equatorial', 'galactic');
    const deg = (r: number): number => (r * 180) / Math.PI;
    const discs = parseRegionDocument({ regions: { cat: { any: [
      { disc: { frame: 'galactic', atDeg: [deg(gx.lonRad), deg(gx.latRad)], radiusDeg: Math.hypot(1, 0.6) } },
      { disc: { frame: 'galactic', atDeg: [deg(gy.lonRad), deg(gy.latRad)], radiusDeg: Math.hypot(0.5, 0.6) } },
    ] } } });
    for (const mode of ['centre', 'fraction'] as const) {
      const a = evaluateRegion(doc, 'cat', { nside: 128, frame: 'galactic', mode });
      const b = evaluateRegion(discs, 'cat', { nside: 128, frame: 'galactic', mode });
      let worst = 0;
      for (let i = 0; i < a.fraction.length; i++) worst = Math.max(worst, Math.abs(a.fraction[i] - b.fraction[i]));
      expect(worst).toBeLessThan(1e-6);
      const want = 2 * Math.PI * (2 - Math.cos(d(Math.hypot(1, 0.6))) - Math.cos(d(Math.hypot(0.5, 0.6))));
      expect(Math.abs(a.solidAngleSr / want - 1)).toBeLessThan(mode === 'centre' ? 0.05 : 1e-4);
    }
  });
});
