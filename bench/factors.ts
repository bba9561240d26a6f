/**
 * Benchmark of the factor job on an Nside 2048 float32 template read from
 * FITS: measured region = (declination band of a site at latitude 33 deg with
 * zenith <= 45 deg) x (Galactic box l 20..110 deg, |b| < 4 deg) minus four
 * 1-deg source discs; targets |b| < 4 deg at all longitudes and the whole
 * sky; centre-in-region mode (and fractional coverage, timed separately).
 * The same job written with healpy + numpy (scripts/factor_reference.py) runs
 * in the same run; printed: both times and their ratio, the ratio to just
 * reading and summing the file, and peak memory over the map size.
 * Each measurement runs in a fresh child process so peak RSS is its own.
 *
 * Run alone: npx tsx bench/factors.ts   (template generated in bench/data/)
 */
import { execFileSync } from 'node:child_process';
import { statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { benchTemplatePath, ensureBenchTemplate } from './benchTemplate.js';

const HERE = dirname(fileURLToPath(import.meta.url));
const ROOT = resolve(HERE, '..');
const NSIDE = Number(process.env.SKYSPAN_BENCH_NSIDE ?? 2048);
const FITS = benchTemplatePath(NSIDE);
const PY = '/usr/bin/python3';
const DISCS: [number, number][] = [[35, 0.5], [52, -1], [78.5, 2], [96, 0]];

/** The benchmark's region set (see module doc). */
export const REGIONS = `frame: galactic
regions:
  survey:
    all:
      - site: { latDeg: 33, maxZenithDeg: 45 }
      - box: { lonDeg: [20, 110], latDeg: [-4, 4] }
    except:
${DISCS.map(([l, b]) => `      - disc: { atDeg: [${l}, ${b}], radiusDeg: 1 }`).join('\n')}
  strip: { band: { absLatDeg: [0, 4] } }
  sky: { sky: true }
`;

type ChildResult = { seconds: number; cpuSeconds: number; readSeconds: number; maxRssBytes: number; kI?: number; kFSr?: number; sum?: number };

/** Child-process body: one measurement, printed as JSON. */
async function child(kind: string): Promise<void> {
  const { readSkyMap } = await import('../src/io/mapFile.js');
  const { kahanSum } = await import('../src/core/math.js');
  const { parseRegionDocument } = await import('../src/regions/document.js');
  const { computeFactors } = await import('../src/scaling/factors.js');
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const map = readSkyMap(FITS);
  const t1 = performance.now();
  let extra: Partial<ChildResult> = {};
  if (kind === 'sum') {
    extra = { sum: kahanSum(map.planes[0]) };
  } else {
    const r = computeFactors({ templates: [{ name: 't', map }], regions: parseRegionDocument(REGIONS),
      measured: 'survey', targets: ['strip', 'sky'], mode: kind === 'fraction' ? 'fraction' : 'centre' });
    extra = { kI: r.rows[0].kI, kFSr: r.rows[0].kFSr };
  }
  const t2 = performance.now();
  const cu = process.cpuUsage(c0);
  const res: ChildResult = { seconds: (t2 - t0) / 1e3, cpuSeconds: (cu.user + cu.system) / 1e6, readSeconds: (t1 - t0) / 1e3,
    maxRssBytes: process.resourceUsage().maxRSS * 1024, ...extra };
  process.stdout.write(JSON.stringify(res));
}

function runChild(kind: string): ChildResult {
  const out = execFileSync(process.execPath, ['--import', 'tsx', fileURLToPath(import.meta.url), '--child', kind],
    { cwd: ROOT, encoding: 'utf8', maxBuffer: 1 << 24 });
  return JSON.parse(out) as ChildResult;
}

function python(): { seconds: number; cpuSeconds: number; readSeconds: number; wallSeconds: number; maxRssBytes: number; kI: number } {
  const job = { template_fits: FITS, site_lat_deg: 33, zenith_max_deg: 45, box_l_deg: [20, 110], box_b_deg: [-4, 4],
    discs_deg: DISCS.map(([l, b]) => [l, b, 1]), strip_b_deg: 4, blank_stride: 0, exposure: false };
  const t0 = performance.now();
  const out = execFileSync(PY, [join(ROOT, 'scripts/factor_reference.py')],
    { input: JSON.stringify(job), encoding: 'utf8', maxBuffer: 1 << 24 });
  const wall = (performance.now() - t0) / 1e3;
  const r = JSON.parse(out);
  return { seconds: r.timing.totalSeconds, cpuSeconds: r.timing.cpuSeconds, readSeconds: r.timing.readSeconds, wallSeconds: wall, maxRssBytes: r.timing.maxRssBytes, kI: r.targets.strip.kI };
}

/** Runs the benchmark and prints its figures (see module doc). */
export async function benchFactors(): Promise<void> {
  ensureBenchTemplate(NSIDE);
  const mapBytes = 12 * NSIDE * NSIDE * 4;
  console.log(`template: Nside ${NSIDE}, float32, ${(statSync(FITS).size / 2 ** 20).toFixed(0)} MiB file, ${(mapBytes / 2 ** 20).toFixed(0)} MiB map`);
  const py = python();
  const sum = runChild('sum');
  const centre = runChild('centre');
  const fraction = runChild('fraction');
  const f = (s: number) => `${s.toFixed(2)} s`;
  console.log(`healpy+numpy (read + compute, in-script): ${f(py.seconds)} (read ${f(py.readSeconds)}; wall incl. interpreter ${f(py.wallSeconds)})`);
  console.log(`skyspan read + sum:                       ${f(sum.seconds)} (read ${f(sum.readSeconds)})`);
  console.log(`skyspan factors, centre mode:             ${f(centre.seconds)} (read ${f(centre.readSeconds)}, factors ${f(centre.seconds - centre.readSeconds)})`);
  console.log(`skyspan factors, fractional coverage:     ${f(fraction.seconds)} (factors ${f(fraction.seconds - fraction.readSeconds)})`);
  console.log(`CPU seconds (user+sys; steadier on a shared machine): healpy ${f(py.cpuSeconds)}, read+sum ${f(sum.cpuSeconds)}, centre ${f(centre.cpuSeconds)}, fraction ${f(fraction.cpuSeconds)}`);
  console.log(`CPU ratio skyspan/healpy (centre) ${(centre.cpuSeconds / py.cpuSeconds).toFixed(3)}x; skyspan/(read + sum) ${(centre.cpuSeconds / sum.cpuSeconds).toFixed(2)}x; fraction/healpy ${(fraction.cpuSeconds / py.cpuSeconds).toFixed(3)}x`);
  console.log(`ratio skyspan/healpy (centre):            ${(centre.seconds / py.seconds).toFixed(3)}x   (target <= 0.1x)`);
  console.log(`ratio skyspan/(read + sum):               ${(centre.seconds / sum.seconds).toFixed(2)}x   (target <= 4x)`);
  console.log(`peak RSS / map size: centre ${(centre.maxRssBytes / mapBytes).toFixed(2)}x, fraction ${(fraction.maxRssBytes / mapBytes).toFixed(2)}x, read+sum ${(sum.maxRssBytes / mapBytes).toFixed(2)}x, healpy ${(py.maxRssBytes / mapBytes).toFixed(2)}x   (target <= 3x)`);
  console.log(`agreement k_I(strip): skyspan ${centre.kI} healpy ${py.kI} (rel. diff ${Math.abs(centre.kI! / py.kI - 1).toExponential(2)})`);
}

if (process.argv[2] === '--child') {
  await child(process.argv[3]);
} else if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  await benchFactors();
}
