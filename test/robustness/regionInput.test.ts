/**
 * Malformed region files and catalogues: every problem is one InputError line
 * naming the key path (or the catalogue row) and what was expected, never a
 * stack trace. A table of hand-made cases, then a seeded fast-check fuzz that
 * mutates a valid document (deletes keys, swaps types, inserts NaN/Infinity/
 * huge numbers) and checks that only success or an InputError comes out,
 * through the library and through `runCli(['mask', ...])`.
 * Expectations: the error contract of src/core/errors.ts and the region
 * language's own ranges (latitudes -90..90, radii 0..180 deg); common
 * practice, no source.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { stringify } from 'yaml';
import { runCli } from '../../src/cli/main.js';
import { InputError } from '../../src/core/errors.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-region-input-');
const regionFile = join(dir, 'regions.yaml');

/** Parses `text` as region file `regionFile` and evaluates `name` (default: every region) at Nside 4. */
function parseAndEvaluate(text: string | unknown, name?: string): void {
  const doc = parseRegionDocument(text, regionFile);
  for (const n of name ? [name] : [...doc.regions.keys()]) evaluateRegion(doc, n, { nside: 4, frame: 'galactic' });
}

function errorOf(f: () => void): Error {
  try { f(); } catch (e) { return e as Error; }
  throw new Error('expected an error, got none');
}

/** The error must be an InputError on one line, mention `where`, and carry no stack lines. */
function expectClearInputError(e: Error, where: string | RegExp): void {
  expect(e).toBeInstanceOf(InputError);
  expect(e.message).not.toContain('\n');
  if (typeof where === 'string') expect(e.message).toContain(where);
  else expect(e.message).toMatch(where);
}

const G = 'frame: galactic\nregions:\n';
describe('malformed region files: one line naming the key path', () => {
  const cases: [string, string, string | RegExp][] = [
    ['YAML that does not parse', 'regions: [unclosed', /regions\.yaml: not valid YAML or JSON at line 1/],
    ['a list at the top', '- a\n- b', 'key (top)'],
    ['an empty file', '', 'key (top)'],
    ['no regions key', 'frame: galactic', 'key regions: found nothing (missing key)'],
    ['regions of the wrong type', 'regions: 5', 'key regions: found 5'],
    ['a null region', 'regions:\n  a: null', 'key regions.a: found null'],
    ['an unknown shape key', 'regions:\n  a: { circle: 1 }', "key regions.a.circle: found unknown key 'circle'"],
    ['two shape keys', 'regions:\n  a: { sky: true, band: { absLatDeg: [0, 4] } }', 'key regions.a: found shape keys sky and band'],
    ['a text for a number', `${G}  a: { disc: { atDeg: [1, 2], radiusDeg: big } }`, 'key regions.a.disc.radiusDeg: found "big", expected a finite number'],
    ['a missing radius', `${G}  a: { disc: { atDeg: [10, 5] } }`, 'key regions.a.disc.radiusDeg: found nothing (missing key)'],
    ['a latitude of 95 deg', `${G}  a: { disc: { atDeg: [10, 95], radiusDeg: 1 } }`, 'key regions.a.disc.atDeg[1]: found 95, expected <= 90'],
    ['a longitude of 400 deg', `${G}  a: { disc: { atDeg: [400, 5], radiusDeg: 1 } }`, 'key regions.a.disc.atDeg[0]: found 400'],
    ['a negative radius', `${G}  a: { disc: { atDeg: [1, 2], radiusDeg: -1 } }`, 'key regions.a.disc.radiusDeg: found -1, expected > 0'],
    ['YAML .nan', `${G}  a: { disc: { atDeg: [10, 5], radiusDeg: .nan } }`, 'key regions.a.disc.radiusDeg: found NaN, expected a finite number'],
    ['YAML .inf', 'regions:\n  a: { site: { latDeg: .inf, maxZenithDeg: 45 } }', 'key regions.a.site.latDeg: found Infinity'],
    ['YAML -.inf', `${G}  a: { band: { absLatDeg: [-.inf, 4] } }`, 'key regions.a.band.absLatDeg[0]: found -Infinity'],
    ['1e400 (overflows to Infinity)', `${G}  a: { disc: { atDeg: [1e400, 5], radiusDeg: 1 } }`, 'key regions.a.disc.atDeg[0]: found Infinity'],
    ['a huge radius', `${G}  a: { disc: { atDeg: [10, 5], radiusDeg: 1e308 } }`, 'key regions.a.disc.radiusDeg: found 1e+308, expected <= 180'],
    ['NaN deep in a list', `${G}  a: { any: [{ sky: true }, { disc: { atDeg: [1, 2], radiusDeg: .nan } }] }`, 'key regions.a.any[1].disc.radiusDeg: found NaN'],
    ['an inverted range', `${G}  a: { band: { absLatDeg: [4, 1] } }`, 'key regions.a.band.absLatDeg: found inverted range [4, 1]'],
    ['an empty longitude range', `${G}  a: { box: { lonDeg: [10, 10] } }`, 'key regions.a.box.lonDeg: found [10, 10]'],
    ['three numbers for a position', `${G}  a: { disc: { atDeg: [1, 2, 3], radiusDeg: 1 } }`, 'key regions.a.disc.atDeg: found [1, 2, 3]'],
    ['no frame anywhere', 'regions:\n  a: { disc: { atDeg: [10, 5], radiusDeg: 1 } }', 'key regions.a.disc.frame: found no frame'],
    ['an unknown frame', 'regions:\n  a: { disc: { frame: ecliptic, atDeg: [1, 2], radiusDeg: 1 } }', 'key regions.a.disc.frame: found "ecliptic"'],
    ['a zero zenith cut', 'regions:\n  a: { site: { latDeg: 10, maxZenithDeg: 0 } }', 'key regions.a.site.maxZenithDeg: found 0, expected > 0'],
    ['an unknown weighting', 'regions:\n  a: { site: { latDeg: 10, maxZenithDeg: 40, weight: lots } }', 'key regions.a.site.weight: found "lots"'],
    ['an unknown reference', 'regions:\n  a: { all: [b] }', "key regions.a.all[0]: found unknown region 'b'"],
    ['a cycle', 'regions:\n  a: { all: [b] }\n  b: { any: [a] }', 'found a cycle a -> b -> a'],
    ['an empty list', 'regions:\n  a: { all: [] }', 'key regions.a.all: found an empty list'],
    ['except of the wrong type', 'regions:\n  a: { sky: true, except: 5 }', 'key regions.a.except: found 5'],
    ['about of the wrong type', 'regions:\n  a: { sky: true, about: 5 }', 'key regions.a.about: found 5, expected a text'],
    ['psfDeg without psfTimes', 'regions:\n  a: { sources: { file: x.csv, psfDeg: 0.1 } }', 'key regions.a.sources.psfTimes: found only psfDeg'],
    ['a region name that is not a name', 'regions:\n  "1a": { sky: true }', 'key regions.1a'],
  ];
  it.each(cases)('%s', (_what, text, where) => {
    const e = errorOf(() => parseAndEvaluate(text));
    expectClearInputError(e, where);
    expect(e.message.startsWith(regionFile)).toBe(true); // names the file first
  });

  it('an object input (already parsed JSON) with NaN and Infinity is refused the same way', () => {
    expectClearInputError(errorOf(() => parseAndEvaluate({ frame: 'galactic', regions: { a: { disc: { atDeg: [NaN, 0], radiusDeg: 1 } } } })),
      'key regions.a.disc.atDeg[0]: found NaN');
    expectClearInputError(errorOf(() => parseAndEvaluate({ regions: { a: { site: { latDeg: 0, maxZenithDeg: -Infinity } } } })),
      'key regions.a.site.maxZenithDeg: found -Infinity');
  });

  it('evaluation options out of range name the option', () => {
    const doc = parseRegionDocument('regions:\n  a: { sky: true }\n', regionFile);
    for (const nside of [0, 3, NaN, Infinity, 1e9]) {
      expectClearInputError(errorOf(() => evaluateRegion(doc, 'a', { nside, frame: 'galactic' })), `key nside: NSIDE is ${nside}`);
    }
    expectClearInputError(errorOf(() => evaluateRegion(doc, 'zz', { nside: 4, frame: 'galactic' })), "found no region 'zz'");
  });
});

describe('source catalogues: the file and row are named', () => {
  const header = 'name,lon,lat,radius';
  const rows: [string, string, string | RegExp][] = [
    ['an empty file', '', 'has no header line'],
    ['only comments', '# nothing here\n', 'has no header line'],
    ['a latitude of 95 deg (line 3)', `${header}\na,10,1,0.5\nb,20,95,0.5\n`, 'line 3: column lat: found "95"'],
    ['a longitude that is text', `${header}\na,abc,1,0.5\n`, 'line 2: column lon: found "abc"'],
    ['nan', `${header}\na,10,nan,0.5\n`, 'line 2: column lat: found "nan"'],
    ['NaN', `${header}\na,10,NaN,0.5\n`, 'line 2: column lat: found "NaN"'],
    ['Infinity', `${header}\na,10,1,Infinity\n`, 'line 2: column radius: found "Infinity"'],
    ['a huge longitude', `${header}\na,1e308,1,0.5\n`, 'line 2: column lon: found "1e308"'],
    ['a zero radius', `${header}\na,10,1,0\n`, 'line 2: column radius: found "0"'],
    ['a negative radius after a comment line (line 4)', `${header}\n# c\na,10,1,0.5\nb,10,1,-1\n`, 'line 4: column radius: found "-1"'],
    ['a short row', `${header}\na,10\n`, 'line 2: has 2 fields, the header has 4'],
    ['a long row', `${header}\na,10,1,0.5,7,8\n`, 'line 2: has 6 fields, the header has 4'],
    ['an unclosed quote', `${header}\n"a,10,1,0.5\n`, 'line 2: a quoted field has no closing quote'],
    ['an unknown frame', 'name,lon,lat,radius,frame\na,10,1,0.5,ecliptic\n', 'line 2: column frame: found "ecliptic"'],
    ['no lat column', 'name,lon,b,radius\na,10,1,0.5\n', "key regions.m.sources.columns.lat: found no column 'lat'"],
  ];
  it.each(rows)('%s', (what, text, where) => {
    const cat = join(dir, `cat-${what.replace(/\W+/g, '-')}.csv`);
    writeFileSync(cat, text);
    const doc = `frame: galactic\nregions:\n  m: { sources: { file: ${JSON.stringify(cat)} } }\n  s: { sky: true, except: m }\n`;
    const e = errorOf(() => parseAndEvaluate(doc, 's'));
    expectClearInputError(e, where);
  });

  it('a missing catalogue names the file and the reason', () => {
    const doc = `frame: galactic\nregions:\n  m: { sources: { file: ${JSON.stringify(join(dir, 'absent.csv'))} } }\n`;
    expectClearInputError(errorOf(() => parseAndEvaluate(doc)), /absent\.csv: cannot read the file \(ENOENT\)/);
  });

  it('an empty catalogue (header only) masks nothing and says so in a note', () => {
    // Not an error by design of the region language: the note marks it (checked here so it cannot pass silently).
    const cat = join(dir, 'none.csv');
    writeFileSync(cat, `${header}\n`);
    const doc = parseRegionDocument(`frame: galactic\nregions:\n  m: { sources: { file: ${JSON.stringify(cat)} } }\n  s: { sky: true, except: m }\n`, regionFile);
    const w = evaluateRegion(doc, 's', { nside: 4, frame: 'galactic' });
    expect(w.notes.some((n) => /none\.csv .* has no sources; it masks nothing/.test(n))).toBe(true);
    expect(w.solidAngleSr).toBeCloseTo(4 * Math.PI, 10);
  });
});

// ---------------------------------------------------------------------------------------------
// Fuzz: mutate a valid document.

const catalogue = join(dir, 'sources.csv');
writeFileSync(catalogue, 'name,lon,lat,radius\nsrc-a,35,0.5,1\nsrc-b,78.5,2,\n');
const VALID = {
  frame: 'galactic',
  regions: {
    survey: { all: [{ site: { latDeg: 33, maxZenithDeg: 45, weight: 'zenith' } }, { box: { lonDeg: [20, 110], latDeg: [-4, 4] } }], except: 'masked' },
    masked: { sources: { file: catalogue, radiusDeg: 0.5, psfDeg: 0.2, psfTimes: 2 } },
    strip: { band: { absLatDeg: [0, 4] }, about: 'the plane' },
    spot: { disc: { frame: 'equatorial', atDeg: [83.6, 22], radiusDeg: 3 } },
    halo: { ring: { atDeg: [0, 0], radiiDeg: [10, 20] } },
    both: { any: ['strip', 'spot', { sky: true, except: [{ band: { absLatDeg: [10, 90] } }] }] },
  },
};

type Path = (string | number)[];
function paths(v: unknown, at: Path = [], out: Path[] = []): Path[] {
  if (v !== null && typeof v === 'object') {
    for (const [k, c] of Object.entries(v)) {
      const p = [...at, Array.isArray(v) ? Number(k) : k];
      out.push(p);
      paths(c, p, out);
    }
  }
  return out;
}

const REPLACEMENTS: unknown[] = [NaN, Infinity, -Infinity, 1e308, -1e308, 0, -1, 400, 1e-300, '', 'text', '45', null, true, false,
  [], [1], [1, 2, 3], [NaN, NaN], {}, { sky: true }, 'strip', 'nowhere'];

type Mutation = { pick: number; op: 'delete' | 'replace' | 'insert'; value: number };
function mutate(doc: unknown, ms: Mutation[]): unknown {
  const copy = structuredClone(doc) as Record<string, unknown>;
  for (const m of ms) {
    const all = paths(copy);
    if (all.length === 0) break;
    const p = all[m.pick % all.length];
    let parent: Record<string | number, unknown> = copy;
    for (const k of p.slice(0, -1)) parent = parent[k] as Record<string | number, unknown>;
    const last = p[p.length - 1];
    const value = structuredClone(REPLACEMENTS[m.value % REPLACEMENTS.length]);
    if (m.op === 'delete') {
      if (Array.isArray(parent)) parent.splice(last as number, 1); else delete parent[last];
    } else if (m.op === 'replace') parent[last] = value;
    else if (Array.isArray(parent)) parent.splice(last as number, 0, value);
    else parent[`${String(last)}X`] = value;
  }
  return copy;
}

const mutations = fc.array(fc.record({ pick: fc.nat(), op: fc.constantFrom('delete', 'replace', 'insert'), value: fc.nat() }) as fc.Arbitrary<Mutation>,
  { minLength: 1, maxLength: 3 });

describe('fuzz: mutated region documents give success or one InputError', () => {
  it('the valid document itself evaluates (so the fuzz starts from a working file)', () => {
    expect(() => parseAndEvaluate(VALID)).not.toThrow();
    expect(() => parseAndEvaluate(stringify(VALID))).not.toThrow();
  });

  it('library: 400 mutations, as objects and as YAML text', () => {
    let failures = 0;
    fc.assert(fc.property(mutations, fc.boolean(), (ms, asText) => {
      const doc = mutate(VALID, ms);
      try {
        parseAndEvaluate(asText ? stringify(doc) : doc);
      } catch (e) {
        failures++;
        if (!(e instanceof InputError)) throw new Error(`not an InputError: ${(e as Error)?.stack ?? String(e)}`);
        if ((e as Error).message.includes('\n')) throw new Error(`message on several lines: ${(e as Error).message}`);
      }
    }), { seed: 20261202, numRuns: 400 });
    expect(failures).toBeGreaterThan(100); // most mutations break the document: the fuzz really reaches the error paths
  });

  it('runCli mask: 60 mutated files, exit 0, or 1/2 with one "skyspan:" line and no stack', async () => {
    let refused = 0;
    await fc.assert(fc.asyncProperty(mutations, fc.constantFrom('survey', 'strip', 'both', 'halo', 'masked'), async (ms, name) => {
      const file = join(dir, 'fuzz.yaml');
      writeFileSync(file, stringify(mutate(VALID, ms)));
      let err = '';
      const code = await runCli(['mask', file, name, '--nside', '4', '--depth', '1', '--json'], { out: () => {}, err: (t) => { err += t; } });
      if (code === 0) { expect(err).toBe(''); return; }
      refused++;
      expect([1, 2]).toContain(code);
      const lines = err.trimEnd().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(/^skyspan: /);
      expect(lines[0]).not.toContain('internal error');
      expect(err).not.toMatch(/^\s*at /m);
    }), { seed: 7, numRuns: 60 });
    expect(refused).toBeGreaterThan(10);
  });
});
