/**
 * Benchmark: reading an Nside 2048 float32 HEALPix map (50,331,648 pixels,
 * about 201 MB) with skyspan's reader and summing it, against the reference
 * of reading the raw bytes with readFileSync and summing the big-endian
 * floats in a plain DataView loop. Prints both times, their ratio, and the
 * peak resident memory of the skyspan read against the map size.
 * Targets: within 1.5x of the raw read; peak memory within 2.5x of the map.
 *
 * The map is generated once in bench/data/ (gitignored). Generation and
 * measurement each run in a fresh child process so that peak RSS belongs to
 * the read alone. Run alone: `npx tsx bench/readMap.ts`.
 */
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readSkyMap, writeMapFile } from '../src/io/mapFile.js';
import { walkHdus } from '../src/io/fits/hdu.js';

const here = fileURLToPath(import.meta.url);
const NSIDE = 2048;
const FILE = join(dirname(here), 'data', `map-nside${NSIDE}-f32.fits`);

function generate(): void {
  const n = 12 * NSIDE * NSIDE;
  const v = new Float32Array(n);
  for (let i = 0; i < n; i++) v[i] = 1 + Math.sin(i * 1e-4);
  mkdirSync(dirname(FILE), { recursive: true });
  writeMapFile(FILE, { nside: NSIDE, ordering: 'RING', frame: 'galactic', column: 'I', unit: '', planes: [v], energiesGeV: null }, { force: true });
}

function skyspanRead(): { ms: number; sum: number } {
  const t0 = performance.now();
  const m = readSkyMap(FILE);
  const p = m.planes[0];
  let sum = 0;
  for (let i = 0; i < p.length; i++) sum += p[i];
  return { ms: performance.now() - t0, sum };
}

function rawRead(): { ms: number; sum: number } {
  const t0 = performance.now();
  const buf = readFileSync(FILE);
  const hdus = walkHdus(buf, FILE); // only to locate the data; a few header cards
  const start = hdus[1].dataStart, n = hdus[1].dataBytes / 4;
  const dv = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
  let sum = 0;
  for (let i = 0, p = start; i < n; i++, p += 4) sum += dv.getFloat32(p, false);
  return { ms: performance.now() - t0, sum };
}

function measure(): void {
  const rss0 = process.resourceUsage().maxRSS * 1024;
  const a1 = skyspanRead();
  const rssSky = process.resourceUsage().maxRSS * 1024;
  const b1 = rawRead();
  const a2 = skyspanRead();
  const b2 = rawRead();
  const mapBytes = 12 * NSIDE * NSIDE * 4;
  const a = Math.min(a1.ms, a2.ms), b = Math.min(b1.ms, b2.ms);
  if (a1.sum !== b1.sum) console.log(`WARNING: sums differ: ${a1.sum} vs ${b1.sum}`);
  console.log(`in-process (diagnosis): read Nside ${NSIDE} float32 map (${(mapBytes / 1e6).toFixed(0)} MB), best of 2:`);
  console.log(`  skyspan readSkyMap + sum : ${a.toFixed(0)} ms (runs ${a1.ms.toFixed(0)}, ${a2.ms.toFixed(0)})`);
  console.log(`  readFileSync + DataView  : ${b.toFixed(0)} ms (runs ${b1.ms.toFixed(0)}, ${b2.ms.toFixed(0)})`);
  console.log(`  ratio skyspan / raw      : ${(a / b).toFixed(2)} (target <= 1.5)`);
  console.log(`  peak RSS of skyspan read : ${(rssSky / 1e6).toFixed(0)} MB (process before: ${(rss0 / 1e6).toFixed(0)} MB) = ${(rssSky / mapBytes).toFixed(2)}x the map (target <= 2.5x)`);
  console.log(`  sums agree               : ${a1.sum === b1.sum} (${a1.sum.toPrecision(10)})`);
}

function child(flag: string): void {
  const r = spawnSync(process.execPath, ['--import', 'tsx', here, flag], { stdio: 'inherit' });
  if (r.status !== 0) throw new Error(`bench child ${flag} failed with status ${r.status}`);
}

/** Generates the map if needed, then measures in a fresh process. */
export async function benchReadMap(): Promise<void> {
  if (!existsSync(FILE)) { console.log(`generating ${FILE} ...`); child('--generate'); }
  child('--measure');
}

if (process.argv[1] === here) {
  if (process.argv.includes('--generate')) generate();
  else if (process.argv.includes('--measure')) measure();
  else await benchReadMap();
}
