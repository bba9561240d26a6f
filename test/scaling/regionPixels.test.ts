/**
 * The ring spans that evaluateRegion returns must hold every pixel with a
 * nonzero weight, and toRegionPixels must give the same sparse list with the
 * spans as with a full scan (an identity of the implementation: the spans are
 * only a shortcut; common practice, no source).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { toRegionPixels } from '../../src/scaling/regionPixels.js';
import { ringTable } from '../../src/sphere/ringTable.js';

const docs: [string, string | undefined][] = [
  [readFileSync(resolve(__dirname, '../../examples/northern-plane/regions.yaml'), 'utf8'), resolve(__dirname, '../../examples/northern-plane/regions.yaml')],
  [readFileSync(resolve(__dirname, '../../examples/southern-forecast/regions.yaml'), 'utf8'), resolve(__dirname, '../../examples/southern-forecast/regions.yaml')],
  [`frame: galactic
regions:
  a: { box: { lonDeg: [-30, 30], latDeg: [-10, 10] } }
  b: { box: { frame: equatorial, lonDeg: [350, 20], latDeg: [-20, 60] } }
  c: { disc: { atDeg: [0, 89.5], radiusDeg: 3 } }
  d: { disc: { atDeg: [180, -88], radiusDeg: 5 }, except: [ { disc: { atDeg: [180, -88], radiusDeg: 1 } } ] }
  e: { ring: { atDeg: [359.9, 0], radiiDeg: [2, 5] } }
  f: { band: { frame: equatorial, absLatDeg: [10, 30] } }
  g: { site: { latDeg: -20, maxZenithDeg: 60, weight: zenith } }
  h: { all: [ { site: { latDeg: 33, maxZenithDeg: 45, weight: time } }, { box: { lonDeg: [20, 110], latDeg: [-4, 4] } } ], except: [ { disc: { atDeg: [35, 0.5], radiusDeg: 1 } } ] }
  i: { sky: true, except: [ { band: { absLatDeg: [0, 2] } } ] }
  j: { any: [ { disc: { atDeg: [0, 0], radiusDeg: 0.01 } }, { box: { lonDeg: [0, 360], latDeg: [80, 90] } } ] }
  k: { sky: true }
  l: { box: { lonDeg: [0, 360], latDeg: [-90, 90] } }
`, undefined]];

describe('ring spans of evaluated regions', () => {
  it('cover every weighted pixel and leave the sparse lists unchanged', () => {
    let checked = 0;
    const problems: string[] = [];
    for (const [text, file] of docs) {
      const doc = parseRegionDocument(text, file);
      for (const name of doc.regions.keys()) for (const nside of [1, 8, 64]) for (const mode of ['centre', 'fraction'] as const)
        for (const frame of ['galactic', 'equatorial'] as const) {
          const w = evaluateRegion(doc, name, { nside, frame, mode });
          expect(w.ringSpans).toBeDefined();
          const sp = w.ringSpans!, t = ringTable(nside);
          const inside = new Uint8Array(w.fraction.length);
          for (let r = 0; r < t.count; r++) if (sp[2 * r] >= 0) for (let j = sp[2 * r]; j <= sp[2 * r + 1]; j++) inside[t.first[r] + j] = 1;
          for (let p = 0; p < w.fraction.length; p++) {
            if (!inside[p] && (w.fraction[p] !== 0 || (w.exposure && w.exposure[p] !== 0))) { problems.push(`${name} ${nside} ${mode} ${frame}: pixel ${p} outside`); break; }
          }
          for (const ue of [true, false]) {
            const a = toRegionPixels(w, ue), b = toRegionPixels({ ...w, ringSpans: undefined }, ue);
            expect(a.full).toBe(b.full);
            expect(a.pixelCount).toBe(b.pixelCount);
            expect(a.solidAngleSr).toBe(b.solidAngleSr);
            expect(Array.from(a.index)).toEqual(Array.from(b.index));
            expect(a.fraction === null ? null : Array.from(a.fraction)).toEqual(b.fraction === null ? null : Array.from(b.fraction));
            expect(a.exposure === null ? null : Array.from(a.exposure)).toEqual(b.exposure === null ? null : Array.from(b.exposure));
            checked++;
          }
        }
    }
    expect(problems).toEqual([]);
    expect(checked).toBeGreaterThan(300);
  });
});

describe('regions covered fully in every listed pixel', () => {
  it('have no list of ones, and their sums equal those with an explicit list of ones', async () => {
    // The null list stands for f = 1 (regionPixels.ts): the identity of the kernels with a list of ones
    // (common practice, no source). Centre coverage gives ones only; fractional coverage of a box does not.
    const { regionSums, SUMS_LENGTH } = await import('../../src/scaling/regionSums.js');
    const doc = parseRegionDocument(docs[2][0]);
    const nside = 64, npix = 12 * nside * nside;
    const plane = Float64Array.from({ length: npix }, (_, p) => 1 + Math.sin(p * 0.37) ** 2 + (p % 97 === 0 ? NaN : 0));
    const ones = (r: ReturnType<typeof toRegionPixels>) => ({ ...r, fraction: new Float32Array(r.index.length).fill(1) });
    let compared = 0;
    for (const name of ['a', 'b', 'h', 'e']) {
      const r = toRegionPixels(evaluateRegion(doc, name, { nside, frame: 'galactic', mode: 'centre' }), true);
      expect(r.fraction).toBeNull();
      expect(r.index.length).toBeGreaterThan(0);
      for (const other of [null, toRegionPixels(evaluateRegion(doc, 'c', { nside, frame: 'galactic', mode: 'centre' }), false),
        toRegionPixels(evaluateRegion(doc, 'a', { nside, frame: 'galactic', mode: 'fraction' }), false)]) {
        for (const [x, y] of [[r, other], [other, r]] as const) {
          if (!x) continue;
          const got = new Float64Array(SUMS_LENGTH), want = new Float64Array(SUMS_LENGTH);
          regionSums(plane, nside, false, x, y, got);
          regionSums(plane, nside, false, x.fraction ? x : ones(x), y ? (y.fraction ? y : ones(y)) : null, want);
          expect(Array.from(got)).toEqual(Array.from(want));
          compared++;
        }
      }
    }
    expect(compared).toBe(20);
    expect(toRegionPixels(evaluateRegion(doc, 'a', { nside, frame: 'galactic', mode: 'fraction' }), true).fraction).not.toBeNull();
  });
});
