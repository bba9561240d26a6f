/**
 * Peak memory of an Nside 4096 single-plane factor job: the invented analytic
 * template of scripts/make_bench_template.py as a float32 RING map (805 MB of
 * pixels), read from FITS, and the factors of one measured region
 * (a declination band of a site times a Galactic box, minus a source disc)
 * to a |b| < 4 deg strip and the whole sky, centre-in-region mode.
 * The job runs in a fresh child process under /usr/bin/time -v (when present)
 * so the peak resident set size is its own; printed: peak RSS from the kernel
 * (time -v) and from process.resourceUsage(), over the map size, and the
 * same for reading alone, so the ratio shows the job's working memory.
 *
 * Run alone: npx tsx bench/peakMemory.ts   (template generated in bench/data/)
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { benchTemplatePath, ensureBenchTemplate } from './benchTemplate.js';

const HERE = dirname(fileURLToPath(import.meta.url));
const ROOT = resolve(HERE, '..');
const NSIDE = Number(process.env.SKYSPAN_BENCH_PEAK_NSIDE ?? 4096);
const FITS = benchTemplatePath(NSIDE);
const TIME = '/usr/bin/time';

const REGIONS = `frame: galactic
regions:
  survey:
    all:
      - site: { latDeg: 33, maxZenithDeg: 45 }
      - box: { lonDeg: [20, 110], latDeg: [-4, 4] }
    except: { disc: { atDeg: [52, -1], radiusDeg: 1 } }
  strip: { band: { absLatDeg: [0, 4] } }
  sky: { sky: true }
`;

interface ChildResult { seconds: number; maxRssBytes: number; kI?: number; pixels: number }

/** Child body: read the map (and with kind 'factors' compute the factors), print figures as JSON. */
async function child(kind: string): Promise<void> {
  const { readSkyMap } = await import('../src/io/mapFile.js');
  const t0 = performance.now();
  const map = readSkyMap(FITS);
  let kI: number | undefined;
  if (kind === 'factors') {
    const { parseRegionDocument } = await import('../src/regions/document.js');
    const { computeFactors } = await import('../src/scaling/factors.js');
    const r = computeFactors({ templates: [{ name: 't', map }], regions: parseRegionDocument(REGIONS),
      measured: 'survey', targets: ['strip', 'sky'], mode: 'centre' });
    kI = r.rows[0].kI;
  }
  const res: ChildResult = { seconds: (performance.now() - t0) / 1e3, maxRssBytes: process.resourceUsage().maxRSS * 1024,
    kI, pixels: map.planes[0].length };
  process.stdout.write(JSON.stringify(res));
}

/** Runs the child (under /usr/bin/time -v when available); returns its figures and the kernel's peak RSS. */
function runChild(kind: string): ChildResult & { timeMaxRssBytes: number | null } {
  const node = [process.execPath, '--import', 'tsx', fileURLToPath(import.meta.url), '--child', kind];
  const useTime = existsSync(TIME);
  const r = spawnSync(useTime ? TIME : node[0], useTime ? ['-v', ...node] : node.slice(1),
    { cwd: ROOT, encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) throw new Error(`child '${kind}' failed (${r.status}): ${r.stderr.slice(-2000)}`);
  const m = /Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr);
  return { ...(JSON.parse(r.stdout) as ChildResult), timeMaxRssBytes: m ? Number(m[1]) * 1024 : null };
}

/** Runs the benchmark and prints its figures (see module doc). */
export async function benchPeakMemory(): Promise<void> {
  ensureBenchTemplate(NSIDE);
  const mapBytes = 12 * NSIDE * NSIDE * 4;
  const gib = (b: number) => `${(b / 2 ** 30).toFixed(2)} GiB`;
  console.log(`template: Nside ${NSIDE}, float32, 1 plane: ${gib(mapBytes)} of pixels, file ${gib(statSync(FITS).size)}`);
  const read = runChild('read');
  const job = runChild('factors');
  const show = (name: string, r: typeof job) => console.log(`${name}: peak RSS ${r.timeMaxRssBytes === null ? 'n/a' : gib(r.timeMaxRssBytes)} (time -v), `
    + `${gib(r.maxRssBytes)} (resourceUsage) = ${(Math.max(r.maxRssBytes, r.timeMaxRssBytes ?? 0) / mapBytes).toFixed(2)}x the map, ${r.seconds.toFixed(1)} s`);
  show('read only          ', read);
  show('read + factors job ', job);
  console.log(`k_I(survey -> strip) = ${job.kI}; limit of the job: 24 GiB, peak ${(Math.max(job.maxRssBytes, job.timeMaxRssBytes ?? 0) / 2 ** 30 / 24 * 100).toFixed(1)}% of it`);
}

if (process.argv[2] === '--child') {
  await child(process.argv[3]);
} else if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  await benchPeakMemory();
}
