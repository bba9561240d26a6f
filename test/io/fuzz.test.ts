/**
 * Fuzzing the FITS map reader (fast-check, seeded): valid HEALPix files of
 * every layout skyspan reads (implicit 1E and 1024E rows, several columns,
 * explicit PIXEL tables, both energy-cube layouts, gzip) are truncated at
 * every block boundary and at random offsets, get flipped bytes in header and
 * data, wrong NAXIS1/NAXIS2/TFIELDS/TFORM/NSIDE values, a missing END card,
 * NAXIS2 = 2^40, and cut or corrupted gzip streams. Every case must end in a
 * successful read or an InputError with a one-line message (the rule of
 * common practice, no source). SKYSPAN_FUZZ_RUNS sets the random-case count
 * (default 10,000).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gzipSync } from 'node:zlib';
import { InputError } from '../../src/core/errors.js';
import { readMapBytes } from '../../src/io/mapFile.js';
import { bintableHdu, primaryHdu } from '../../src/io/fits/writer.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { findCard, removeEnd, setCard, testMap } from './fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const RUNS = Number(process.env.SKYSPAN_FUZZ_RUNS ?? 10_000);
const dir = tempDir('skyspan-fuzz-');

function written(name: string, ...args: Parameters<typeof writeMapFile>[1 | 2][]): Uint8Array {
  const p = join(dir, name);
  writeMapFile(p, args[0] as any, (args[1] ?? {}) as any);
  return new Uint8Array(readFileSync(p));
}

const cube = (nside: number, k: number) => testMap(nside, {
  column: 'CUBE', planes: Array.from({ length: k }, (_, j) => testMap(nside, { k: j }).planes[0]),
  energiesGeV: Float64Array.from({ length: k }, (_, j) => 2 ** j),
});
const vectorCube = Buffer.concat([
  primaryHdu(),
  ...bintableHdu([{ name: 'S', type: 'float32', repeat: 3, values: Float32Array.from({ length: 36 }, (_, i) => i) }],
    [['PIXTYPE', 'HEALPIX'], ['ORDERING', 'RING'], ['NSIDE', 1], ['COORDSYS', 'G']]),
  ...bintableHdu([{ name: 'ENERGY', type: 'float64', repeat: 1, unit: 'MeV', values: Float64Array.from([1, 2, 3]) }], [['EXTNAME', 'ENERGIES']]),
]);

const bases: [string, Uint8Array][] = [
  ['implicit-1E', written('a.fits', testMap(2))],
  ['implicit-3col-f64-nested', written('b.fits', [0, 1, 2].map((k) => testMap(4, { k, column: `C${k}`, f64: true, ordering: 'NESTED' })))],
  ['implicit-1024E', written('c.fits', testMap(16, { frame: 'equatorial' }))],
  ['explicit', written('d.fits', testMap(4, { blankEvery: 3 }), { layout: 'explicit' })],
  ['explicit-2col-f64', written('e.fits', [testMap(2, { f64: true, blankEvery: 2 }), testMap(2, { column: 'Q', f64: true })], { layout: 'explicit' })],
  ['cube-columns', written('f.fits', cube(1, 3))],
  ['cube-explicit', written('g.fits', testMap(1, { ...cube(1, 2), blankEvery: 0 }), { layout: 'explicit' })],
  ['cube-vector', new Uint8Array(vectorCube)],
];

const KEYS = ['NAXIS1', 'NAXIS2', 'TFIELDS', 'TFORM1', 'TFORM2', 'NSIDE', 'NAXIS', 'BITPIX', 'PCOUNT', 'GCOUNT', 'FIRSTPIX', 'LASTPIX', 'INDXSCHM', 'ORDERING', 'TTYPE1'];
const VALUES = ['0', '-1', '1', '2', '3', '7', '12', '64', '1023', '8192', String(2 ** 31), String(2 ** 40), '1.5', "'1024Z'", "'E'", "'2J'", "'X'", "'1PE(3)'", 'T', "'RING'", "'EXPLICIT'", "''"];

type Mutation =
  | { kind: 'truncate'; at: number }
  | { kind: 'flip'; region: 'header' | 'data' | 'any'; spots: [number, number][] }
  | { kind: 'keyword'; key: string; value: string; hdu: number }
  | { kind: 'noEnd' }
  | { kind: 'gzipCut'; at: number }
  | { kind: 'gzipFlip'; spots: [number, number][] };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('truncate' as const), at: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({ kind: fc.constant('flip' as const), region: fc.constantFrom('header' as const, 'data' as const, 'any' as const),
    spots: fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.integer({ min: 0, max: 255 })), { minLength: 1, maxLength: 8 }) }),
  fc.record({ kind: fc.constant('keyword' as const), key: fc.constantFrom(...KEYS), value: fc.constantFrom(...VALUES), hdu: fc.integer({ min: 0, max: 2 }) }),
  fc.record({ kind: fc.constant('noEnd' as const) }),
  fc.record({ kind: fc.constant('gzipCut' as const), at: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({ kind: fc.constant('gzipFlip' as const),
    spots: fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.integer({ min: 0, max: 255 })), { minLength: 1, maxLength: 4 }) }),
);

function apply(base: Uint8Array, m: Mutation): Uint8Array {
  switch (m.kind) {
    case 'truncate': return base.slice(0, Math.floor(m.at * base.length));
    case 'flip': {
      const out = base.slice();
      const lo = m.region === 'data' ? 2880 * 2 : 0;
      const hi = m.region === 'header' ? Math.min(out.length, 2880 * 2) : out.length;
      for (const [f, v] of m.spots) out[lo + Math.floor(f * (hi - lo - 1))] = v;
      return out;
    }
    case 'keyword': {
      const from = m.hdu * 2880;
      return findCard(base, m.key, from) >= 0 ? setCard(base, m.key, m.value, from) : base;
    }
    case 'noEnd': return removeEnd(base);
    case 'gzipCut': { const gz = gzipSync(base); return gz.subarray(0, Math.floor(m.at * gz.length)); }
    case 'gzipFlip': {
      const gz = new Uint8Array(gzipSync(base));
      for (const [f, v] of m.spots) gz[Math.floor(f * (gz.length - 1))] = v;
      return gz;
    }
  }
}

const counts = { cases: 0, read: 0, inputError: 0, byKind: {} as Record<string, number> };
let slowestMs = 0;
let slowestLabel = '';

/** One case: the read succeeds, or throws an InputError on one line; anything else fails the test. */
function check(bytes: Uint8Array, label: string): void {
  counts.cases++;
  const t0 = performance.now();
  try {
    const { maps } = readMapBytes(bytes, 'fuzz.fits');
    let decoded = 0;
    for (const m of maps) for (const p of m.planes) { expect(p.length).toBe(12 * m.nside * m.nside); decoded += p.byteLength; }
    // What a read may allocate: 16 bytes per input byte (a deflate stream inflates at most ~1032-fold),
    // or up to 1 GiB for a partial map expanded to the full sky (mapRead.ts).
    const inputBytes = bytes[0] === 0x1f && bytes[1] === 0x8b ? 1032 * bytes.length : bytes.length;
    expect(decoded).toBeLessThanOrEqual(Math.max(16 * inputBytes, 2 ** 30));
    counts.read++;
  } catch (e) {
    if (!(e instanceof InputError)) throw new Error(`${label}: not an InputError: ${(e as Error)?.stack ?? String(e)}`);
    expect(e.message).toMatch(/^fuzz\.fits/);
    expect(e.message).not.toMatch(/\n/);
    counts.inputError++;
  }
  const dt = performance.now() - t0;
  if (dt > slowestMs) { slowestMs = dt; slowestLabel = label; }
}

describe('FITS reader fuzz', () => {
  it('every base file reads', () => {
    for (const [, b] of bases) expect(readMapBytes(b.slice(), 'fuzz.fits').maps.length).toBeGreaterThan(0);
  });

  it('truncation at every block boundary, NAXIS2 = 2^40 and a missing END, for every base file', () => {
    for (const [name, b] of bases) {
      for (let at = 0; at < b.length; at += 2880) check(b.slice(0, at), `${name} cut at ${at}`);
      for (let h = 0; h < 3; h++) if (findCard(b, 'NAXIS2', h * 2880) >= 0) check(setCard(b, 'NAXIS2', String(2 ** 40), h * 2880), `${name} NAXIS2=2^40`);
      check(removeEnd(b), `${name} no END`);
    }
  });

  it(`${RUNS} random mutations end in a read or an InputError`, () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: bases.length - 1 }), mutation, (i, m) => {
      counts.byKind[m.kind] = (counts.byKind[m.kind] ?? 0) + 1;
      check(apply(bases[i][1], m), `${bases[i][0]} ${JSON.stringify(m)}`);
    }), { seed: 4242, numRuns: RUNS });
    // The figures for the closing note; not assertions on speed.
    console.log(`fuzz: ${counts.cases} cases, ${counts.read} read, ${counts.inputError} InputError, slowest ${slowestMs.toFixed(1)} ms (${slowestLabel}); mutations ${JSON.stringify(counts.byKind)}`);
    expect(counts.read).toBeGreaterThan(0);
    expect(counts.inputError).toBeGreaterThan(0);
  });
});
