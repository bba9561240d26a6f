/**
 * The plan of the cache and output-folder tests: the fixture of fixture.ts
 * (two template files with invented survival maps, Nside 32) plus one
 * invented template spec built at Nside 8 with absorption, so that one run
 * stores all three kinds of cache entry: template, survival and region.
 * Also a comparison of two output folders that ignores only what may differ
 * between runs (creation times, the cache record, provenance hashes).
 */
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { makePlanFixture } from './fixture.js';

/** Writes the fixture; `cacheDir` is where the tests keep its cache. */
export function makeCachePlanFixture(): { dir: string; plan: string; cacheDir: string } {
  const fx = makePlanFixture({ absorption: 'cmb', samples: 500 });
  writeFileSync(join(fx.dir, 'slab.yaml'), ['name: invented-slab', 'description: invented test model (exponential gas slab, uniform cosmic rays)',
    'gas:', '  - {component: exponentialSlab, densityCm3: 1, scaleHeightKpc: 0.15}', 'cosmicRays: {distribution: constant}',
    'integration: {maxDistanceKpc: 20, stepKpc: 2, nodesPerSegment: 2}', ''].join('\n'));
  const text = readFileSync(fx.plan, 'utf8').replace('  files: [templates]', '  files: [templates]\n  build: [slab.yaml]\n  buildNside: 8')
    .replace('mapWidth: 600', 'mapWidth: 300');
  writeFileSync(fx.plan, text);
  return { dir: fx.dir, plan: fx.plan, cacheDir: join(fx.dir, 'cache') };
}

const ISO_TIME = /\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(?:\.\d+)?Z/g;

function normalised(dir: string, name: string): string {
  const text = readFileSync(join(dir, name), name.endsWith('.png') ? 'latin1' : 'utf8');
  if (name === 'results.json') {
    const r = JSON.parse(text) as Record<string, unknown>;
    delete r.cache; delete r.createdUtc;
    return JSON.stringify(r);
  }
  return text.replace(ISO_TIME, 'TIME');
}

/** Names of the files that differ between two run folders (or exist in one only); provenance.json is left out (it holds hashes of dated files). */
export function differingOutputs(a: string, b: string): string[] {
  const na = readdirSync(a).filter((f) => f !== 'provenance.json').sort(), nb = readdirSync(b).filter((f) => f !== 'provenance.json').sort();
  const out = [...na.filter((f) => !nb.includes(f)), ...nb.filter((f) => !na.includes(f))];
  for (const f of na) if (nb.includes(f) && normalised(a, f) !== normalised(b, f)) out.push(f);
  return out;
}

/** Entry files of a cache folder by kind, each list sorted. */
export function entriesByKind(cacheDir: string): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const f of readdirSync(cacheDir).sort()) {
    const m = /^([a-z]+)-[0-9a-f]{64}\.bin$/.exec(f);
    if (m) (out[m[1]] ??= []).push(join(cacheDir, f));
  }
  return out;
}
