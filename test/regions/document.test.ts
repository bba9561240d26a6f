import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { tempDir } from '../helpers/tempDir.js';

/** The one-line message of the InputError that parsing (and evaluating region a) throws. */
function failure(text: string, file = 'r.yaml'): string {
  try {
    const doc = parseRegionDocument(text, file);
    evaluateRegion(doc, 'a', { nside: 1, frame: 'galactic' });
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    const m = (e as Error).message;
    expect(m).not.toContain('\n');
    return m;
  }
  throw new Error('no error was thrown');
}

// Expected messages: common practice, no source (the contract is one line with
// the file, the key path, what was found and what was expected).
describe('region files: parsing', () => {
  it('reads YAML and JSON alike, degrees into radians', () => {
    const y = parseRegionDocument('frame: galactic\nregions:\n  p: { box: { lonDeg: [-20, 20], latDeg: [-4, 4] } }\n');
    const j = parseRegionDocument('{"frame": "galactic", "regions": {"p": {"box": {"lonDeg": [340, 20], "latDeg": [-4, 4]}}}}');
    for (const doc of [y, j]) {
      const n = doc.regions.get('p')!;
      expect(n.kind).toBe('box');
      if (n.kind !== 'box') return;
      expect(n.frame).toBe('galactic');
      expect(n.lonFromRad).toBeCloseTo((340 * Math.PI) / 180, 14);
      expect(n.lonWidthRad).toBeCloseTo((40 * Math.PI) / 180, 14);
      expect(n.latMaxRad).toBeCloseTo((4 * Math.PI) / 180, 14);
    }
  });

  it('accepts an object as well as text, and resolves references', () => {
    const doc = parseRegionDocument({ regions: { a: { sky: true }, b: { all: ['a'], except: { disc: { frame: 'equatorial', atDeg: [0, 0], radiusDeg: 2 } } } } });
    expect([...doc.regions.keys()]).toEqual(['a', 'b']);
    expect(doc.regions.get('b')!.except[0].kind).toBe('disc');
  });
});

describe('region files: every bad input is one line naming the key path', () => {
  it('unknown key', () => {
    expect(failure('regions:\n  a:\n    box: { frame: galactic, lonDeg: [0, 10], latDegs: [0, 1] }\n'))
      .toBe("r.yaml, key regions.a.box.latDegs: found unknown key 'latDegs', expected one of: frame, lonDeg, latDeg (did you mean 'latDeg'?)");
    expect(failure('regions:\n  a:\n    boks: { frame: galactic }\n')).toMatch(/^r\.yaml, key regions\.a\.boks: found unknown key 'boks', expected one of: sky, site, box/);
  });

  it('wrong type', () => {
    expect(failure('regions:\n  a:\n    disc: { frame: galactic, atDeg: [10, "x"], radiusDeg: 1 }\n'))
      .toBe('r.yaml, key regions.a.disc.atDeg[1]: found "x", expected a finite number');
    expect(failure('regions:\n  a:\n    disc: { frame: galactic, radiusDeg: 1 }\n')).toContain('key regions.a.disc.atDeg: found nothing (missing key)');
    expect(failure('regions:\n  a:\n    band: { frame: gal, absLatDeg: [0, 4] }\n'))
      .toBe('r.yaml, key regions.a.band.frame: found "gal", expected one of: galactic, equatorial');
  });

  it('inverted range', () => {
    expect(failure('regions:\n  a:\n    box: { frame: galactic, latDeg: [5, -5] }\n'))
      .toBe('r.yaml, key regions.a.box.latDeg: found inverted range [5, -5], expected a range [low, high] with low < high');
    expect(failure('{"regions": {"a": {"ring": {"frame": "galactic", "atDeg": [0, 0], "radiiDeg": [2, 1]}}}}'))
      .toContain('key regions.a.ring.radiiDeg: found inverted range [2, 1]');
    expect(failure('regions:\n  a:\n    box: { frame: galactic, lonDeg: [10, 10] }\n')).toContain('key regions.a.box.lonDeg: found [10, 10]');
  });

  it('radius <= 0', () => {
    expect(failure('regions:\n  a:\n    disc: { frame: galactic, atDeg: [10, 0], radiusDeg: 0 }\n'))
      .toBe('r.yaml, key regions.a.disc.radiusDeg: found 0, expected > 0');
    expect(failure('regions:\n  a:\n    disc: { frame: galactic, atDeg: [10, 0], radiusDeg: -2 }\n')).toContain('found -2, expected > 0');
  });

  it('NaN and Infinity', () => {
    expect(failure('regions:\n  a:\n    site: { latDeg: .nan, maxZenithDeg: 45 }\n'))
      .toBe('r.yaml, key regions.a.site.latDeg: found NaN, expected a finite number');
    expect(failure('regions:\n  a:\n    site: { latDeg: 30, maxZenithDeg: .inf }\n'))
      .toBe('r.yaml, key regions.a.site.maxZenithDeg: found Infinity, expected a finite number');
  });

  it('out-of-range angles', () => {
    expect(failure('regions:\n  a:\n    disc: { frame: galactic, atDeg: [10, 95], radiusDeg: 1 }\n'))
      .toBe('r.yaml, key regions.a.disc.atDeg[1]: found 95, expected <= 90');
    expect(failure('regions:\n  a:\n    site: { latDeg: 30, maxZenithDeg: 120 }\n')).toContain('key regions.a.site.maxZenithDeg: found 120, expected <= 90');
    expect(failure('regions:\n  a:\n    box: { frame: galactic, lonDeg: [-400, 10] }\n')).toContain('key regions.a.box.lonDeg[0]: found -400, expected >= -360');
  });

  it('cycles, with the chain, and unknown names', () => {
    expect(failure('regions:\n  a: { all: [b, { sky: true }] }\n  b: { any: [c] }\n  c: { disc: { frame: galactic, atDeg: [0, 0], radiusDeg: 1 }, except: a }\n'))
      .toBe('r.yaml, key regions.c.except: found a cycle a -> b -> c -> a, expected regions that do not refer back to themselves');
    expect(failure('regions:\n  a: { all: [a] }\n')).toContain('found a cycle a -> a');
    expect(failure('regions:\n  a: { all: [b] }\n')).toBe("r.yaml, key regions.a.all[0]: found unknown region 'b', expected one of: a");
  });

  it('shape structure: two shapes, none, missing frame, weighted site under any', () => {
    expect(failure('regions:\n  a:\n    sky: true\n    disc: { frame: galactic, atDeg: [10, 5], radiusDeg: 1 }\n'))
      .toBe('r.yaml, key regions.a: found shape keys sky and disc, expected exactly one (combine shapes with all or any)');
    expect(failure('regions:\n  a: { about: nothing }\n')).toContain('key regions.a: found no shape key');
    expect(failure('regions:\n  a:\n    band: { absLatDeg: [0, 4] }\n')).toContain('key regions.a.band.frame: found no frame');
    expect(failure('regions:\n  a: { any: [ { site: { latDeg: 30, maxZenithDeg: 40, weight: zenith } } ] }\n'))
      .toContain('key regions.a.any[0].site.weight: found a weighted site under any or except');
    expect(failure('region:\n  a: { sky: true }\n')).toContain("key region: found unknown key 'region', expected one of: frame, regions (did you mean 'regions'?)");
    expect(failure('regions:\n  a: { sky: true\n')).toMatch(/^r\.yaml: not valid YAML or JSON at line \d/);
  });

  describe('catalogues', () => {
    const dir = tempDir('skyspan-cat-');
    const rf = join(dir, 'r.yaml');
    writeFileSync(join(dir, 'c.csv'), 'name,lon,lat,frame\n# invented sources\nx,10,0,galactic\ny,10,91,galactic\n');
    writeFileSync(join(dir, 'd.csv'), 'name,lon,lat,frame,radius\nx,10,0,galactic,-1\n');
    writeFileSync(join(dir, 'e.csv'), 'name,lon,lat,frame,radius\nx,10,0,gal,1\n');
    writeFileSync(join(dir, 'f.csv'), 'name,lon,lat,frame,radius\nx,abc,0,galactic,1\n');

    it('bad row, with its row number (file line)', () => {
      expect(failure('regions:\n  a:\n    sources: { file: c.csv, radiusDeg: 1 }\n', rf))
        .toBe(`${join(dir, 'c.csv')}, line 4: column lat: found "91", expected a latitude from -90 to 90 deg`);
      expect(failure('regions:\n  a:\n    sources: { file: d.csv }\n', rf)).toContain('line 2: column radius: found "-1", expected a radius above 0');
      expect(failure('regions:\n  a:\n    sources: { file: e.csv }\n', rf)).toContain('line 2: column frame: found "gal", expected galactic or equatorial');
      expect(failure('regions:\n  a:\n    sources: { file: f.csv }\n', rf)).toContain('line 2: column lon: found "abc"');
    });

    it('unknown catalogue column', () => {
      expect(failure('regions:\n  a:\n    sources: { file: c.csv, radiusDeg: 1, columns: { lon: glon } }\n', rf))
        .toBe(`${rf}, key regions.a.sources.columns.lon: found no column 'glon' in the header of c.csv (line 1; its columns: name, lon, lat, frame), `
          + "expected the lon column (did you mean 'lon'? name the column with columns.lon)");
      expect(failure('regions:\n  a:\n    sources: { file: c.csv }\n', rf)).toContain("key regions.a.sources.columns.radius: found no column 'radius'");
      expect(failure('regions:\n  a:\n    sources: { file: e.csv, psfDeg: 0.2 }\n', rf)).toContain('key regions.a.sources.psfTimes: found only psfDeg');
    });
  });
});
