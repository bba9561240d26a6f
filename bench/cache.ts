/**
 * Benchmark of a large cache entry: one Nside 1024 float64 plane (100.7 MB),
 * stored (encode with SHA-256 + atomic write) and read back with every check
 * (length, SHA-256, kind and key), against the reference of reading the same
 * file's bytes with readFileSync and nothing else; also SHA-256 alone over
 * the bytes, and the region evaluation the entry would spare at that Nside.
 * Prints times, MB/s and the ratios. Run alone: npx tsx bench/cache.ts
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ArtefactCache } from '../src/plan/cache.js';
import { parseRegionDocument } from '../src/regions/document.js';
import { evaluateRegion } from '../src/regions/evaluate.js';

const NSIDE = 1024;

function best(n: number, f: () => void): number {
  let b = Infinity;
  for (let i = 0; i < n; i++) { const t = performance.now(); f(); b = Math.min(b, performance.now() - t); }
  return b;
}

export async function benchCache(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'skyspan-bench-cache-'));
  try {
    const plane = new Float64Array(12 * NSIDE * NSIDE);
    for (let i = 0; i < plane.length; i++) plane[i] = 1 + Math.sin(i * 1e-4);
    const mb = plane.byteLength / 1e6;
    const cache = new ArtefactCache(dir);
    const key = cache.key('template', { bench: NSIDE });
    const putMs = best(2, () => cache.put('template', key, 'bench', { meta: { nside: NSIDE }, arrays: [plane] }));
    const getMs = best(3, () => { if (!cache.get('template', key, 'bench')) throw new Error('entry not read back'); });
    const rawMs = best(3, () => readFileSync(cache.path('template', key)));
    const bytes = new Uint8Array(plane.buffer);
    const shaMs = best(3, () => createHash('sha256').update(bytes).digest());
    const doc = parseRegionDocument('frame: galactic\nregions:\n  plane:\n    band: { absLatDeg: [0, 5] }\n', 'bench.yaml');
    const regionMs = best(1, () => evaluateRegion(doc, 'plane', { nside: NSIDE, frame: 'galactic', mode: 'fraction' }));
    console.log(`entry: Nside ${NSIDE}, one float64 plane, ${mb.toFixed(1)} MB`);
    console.log(`SHA-256 alone: ${shaMs.toFixed(0)} ms (${(mb / shaMs * 1e3).toFixed(0)} MB/s)`);
    console.log(`store (encode, checksum, write, fsync, rename): ${putMs.toFixed(0)} ms`);
    console.log(`read with checks: ${getMs.toFixed(0)} ms; raw readFileSync: ${rawMs.toFixed(0)} ms; ratio ${(getMs / rawMs).toFixed(2)}`);
    console.log(`region evaluation the entry spares (|b| < 5 deg band, coverage fractions): ${regionMs.toFixed(0)} ms; checked read / evaluation ${(getMs / regionMs).toFixed(2)}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) await benchCache();
