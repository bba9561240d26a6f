/**
 * Peak memory of reducing a template file's survival map over a region, the
 * whole-map path against the row-block stream (src/plan/survivalStream.ts),
 * for survival cubes of 10 and 30 planes (float32, Nside 256 by default;
 * values invented) generated into bench/data/ and deleted afterwards. Each
 * reduction runs once in a fresh child process (bench/survivalChild.ts);
 * printed: its peak RSS before the reduction (template and region weights
 * held) and after it, the growth, the time, and the cube's size.
 * The streamed growth should not follow the number of planes.
 *
 * Run alone: npx tsx bench/survival.ts   (SKYSPAN_BENCH_SURVIVAL_NSIDE)
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, rmSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeMapFile } from '../src/io/mapFile.js';
import { createSkyMap } from '../src/maps/create.js';

const HERE = dirname(fileURLToPath(import.meta.url));
const ROOT = resolve(HERE, '..');
const NSIDE = Number(process.env.SKYSPAN_BENCH_SURVIVAL_NSIDE ?? 256);
const DIR = join(HERE, 'data', 'survival');

const mib = (b: number) => `${(b / 2 ** 20).toFixed(0)} MiB`;

/** Runs the benchmark (see module doc). */
export async function benchSurvival(): Promise<void> {
  mkdirSync(DIR, { recursive: true });
  const npix = 12 * NSIDE * NSIDE;
  const templateFile = join(DIR, 'template.fits');
  try {
    writeMapFile(templateFile, createSkyMap({ nside: NSIDE, ordering: 'RING', frame: 'galactic', column: 'T', unit: '',
      planes: [Float32Array.from({ length: npix }, (_, p) => 1 + Math.sin(p * 1e-3) ** 2)] }), { dtype: 'float32', force: true });
    for (const planes of [10, 30]) {
      const file = join(DIR, `survival-${planes}.fits`);
      writeMapFile(file, createSkyMap({ nside: NSIDE, ordering: 'RING', frame: 'galactic', column: 'SURVIVAL', unit: '',
        planes: Array.from({ length: planes }, (_, k) => Float32Array.from({ length: npix }, (_, p) => Math.exp(-(k + 1) * 0.02 * (1 + Math.cos(p * 1e-4))))),
        energiesGeV: Float64Array.from({ length: planes }, (_, k) => 1e4 * 1.2 ** k) }), { dtype: 'float32', force: true });
      const size = statSync(file).size;
      const got: Record<string, { before: number; after: number; seconds: number; first: number }> = {};
      for (const mode of ['whole', 'streamed']) {
        const out = execFileSync(process.execPath, ['--import', 'tsx', join(HERE, 'survivalChild.ts'), mode, file, templateFile], { cwd: ROOT, encoding: 'utf8' });
        got[mode] = JSON.parse(out.trim().split('\n').pop()!);
      }
      const g = (m: string) => got[m].after - got[m].before;
      console.log(`Nside ${NSIDE}, ${planes} planes (${mib(size)} file), peak RSS before the reduction ${mib(got.whole.before)}: ` +
        `whole ${mib(got.whole.after)} (+${mib(g('whole'))}) in ${got.whole.seconds.toFixed(2)} s, ` +
        `streamed ${mib(got.streamed.after)} (+${mib(g('streamed'))}) in ${got.streamed.seconds.toFixed(2)} s; same first plane: ${got.whole.first === got.streamed.first}`);
    }
  } finally {
    rmSync(DIR, { recursive: true, force: true });
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) await benchSurvival();
