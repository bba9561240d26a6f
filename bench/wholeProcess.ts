/**
 * Whole-process benchmarks: the installed command (`node bin/skyspan.js`,
 * bundled dist/bin/) timed as a user runs it, start-up included, against the
 * reference's whole process, alternating A B A B (SKYSPAN_BENCH_REPS times
 * each, default 5). Wall and CPU time come from /usr/bin/time, as does the
 * peak RSS (the operating system's maximum resident set size). Printed per
 * line: median wall time (min-max), median CPU time, median peak RSS, and the
 * ratio of the median wall times.
 *   version  `skyspan --version` against bare `node -e 0`
 *   worker   `skyspan info` on a small map, worker thread against SKYSPAN_SINGLE_THREAD=1 (the worker's start-up cost)
 *   info     `skyspan info` on the Nside 2048 float32 map against bench/readSumBigEndian.mjs (read + sum)
 *   factors  the Nside 2048 footprint factor job (bench/factors.ts regions, centre mode, --json)
 *            against scripts/factor_reference.py (healpy + numpy), with the k values compared
 *   start    the demo plan (`npm start`'s job) with an empty cache and with a warm one
 * Run alone: npx tsx bench/wholeProcess.ts [version worker info factors start]
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureBenchTemplate } from './benchTemplate.js';
import { referenceJob, REGIONS } from './factors.js';

const HERE = dirname(fileURLToPath(import.meta.url));
const ROOT = resolve(HERE, '..');
const BIN = join(ROOT, 'bin/skyspan.js');
const PY = '/usr/bin/python3';
const TIME = '/usr/bin/time';
const REPS = Math.max(3, Number(process.env.SKYSPAN_BENCH_REPS ?? 5));

/** One process run as measured by /usr/bin/time. */
interface Run { wallS: number; cpuS: number; rssMB: number; stdout: string }

/** A command line to run: program, arguments, extra environment, stdin text. */
interface Job { label: string; cmd: string; args: string[]; env?: Record<string, string>; input?: string; before?: () => void }

function measure(job: Job, scratch: string): Run {
  job.before?.();
  const timeFile = join(scratch, 'time.txt');
  const r = spawnSync(TIME, ['-o', timeFile, '-f', '%e %U %S %M', job.cmd, ...job.args],
    { cwd: ROOT, input: job.input, encoding: 'utf8', maxBuffer: 1 << 28, env: { ...process.env, ...job.env } });
  if (r.status !== 0) throw new Error(`${job.label} failed (status ${r.status}): ${r.stderr.slice(-400)}`);
  const [e, u, s, m] = readFileSync(timeFile, 'utf8').trim().split(/\s+/).slice(-4).map(Number);
  return { wallS: e, cpuS: u + s, rssMB: m / 1024, stdout: r.stdout };
}

const median = (xs: number[]) => { const s = [...xs].sort((a, b) => a - b); const n = s.length; return n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2; };
const fmt = (s: number) => (s < 1 ? `${(s * 1000).toFixed(0)} ms` : `${s.toFixed(2)} s`);

function describe(label: string, runs: Run[]): string {
  const w = runs.map((r) => r.wallS);
  return `  ${label.padEnd(44)} wall ${fmt(median(w))} (${fmt(Math.min(...w))}-${fmt(Math.max(...w))}), CPU ${fmt(median(runs.map((r) => r.cpuS)))}, peak RSS ${median(runs.map((r) => r.rssMB)).toFixed(0)} MB`;
}

/** Runs A and B alternately REPS times each, prints both and the ratio of median wall times; returns the runs. */
function alternate(a: Job, b: Job, scratch: string, target?: string): { a: Run[]; b: Run[] } {
  const ra: Run[] = [], rb: Run[] = [];
  for (let i = 0; i < REPS; i++) { ra.push(measure(a, scratch)); rb.push(measure(b, scratch)); }
  console.log(describe(a.label, ra));
  console.log(describe(b.label, rb));
  const ratio = median(ra.map((r) => r.wallS)) / median(rb.map((r) => r.wallS));
  const cpu = median(ra.map((r) => r.cpuS)) / median(rb.map((r) => r.cpuS));
  console.log(`  ratio of medians A/B: wall ${ratio.toFixed(3)}x, CPU ${cpu.toFixed(3)}x${target ? `   (${target})` : ''}`);
  return { a: ra, b: rb };
}

const node = (label: string, args: string[], env?: Record<string, string>): Job => ({ label, cmd: process.execPath, args, env });

const suites: Record<string, (scratch: string) => void> = {
  version(scratch) {
    console.log('skyspan --version against bare Node:');
    alternate(node('A skyspan --version', [BIN, '--version']), node('B node -e 0', ['-e', '0']), scratch,
      'target: skyspan median <= 0.25 s and <= 120 MB');
  },
  worker(scratch) {
    const small = join(ROOT, 'examples/demo/demo-map.fits');
    console.log('worker thread start-up: skyspan info on the small demo map, worker against one thread:');
    alternate(node('A info (worker thread)', [BIN, 'info', small]), node('B info (SKYSPAN_SINGLE_THREAD=1)', [BIN, 'info', small], { SKYSPAN_SINGLE_THREAD: '1' }), scratch,
      'the difference of the medians is the start-up cost of the worker');
  },
  info(scratch) {
    const fits = ensureBenchTemplate(2048);
    console.log('skyspan info on the Nside 2048 float32 map (201 MB) against a plain Node read + big-endian sum:');
    alternate(node('A skyspan info', [BIN, 'info', fits]), node('B node bench/readSumBigEndian.mjs', [join(HERE, 'readSumBigEndian.mjs'), fits]), scratch,
      'target <= 1.5x');
  },
  factors(scratch) {
    const fits = ensureBenchTemplate(2048);
    const regions = join(scratch, 'regions.yaml');
    writeFileSync(regions, REGIONS);
    console.log('footprint factor job, Nside 2048, centre mode, whole process: skyspan factors --json against the healpy + numpy script:');
    const r = alternate(
      node('A skyspan factors --centre --json', [BIN, 'factors', '--regions', regions, '--measured', 'survey', '--target', 'strip', 'sky',
        '--templates', fits, '--centre', '--json']),
      { label: 'B python3 scripts/factor_reference.py', cmd: PY, args: [join(ROOT, 'scripts/factor_reference.py')], input: JSON.stringify(referenceJob(fits)) },
      scratch, 'target <= 0.15x');
    const sky = JSON.parse(r.a[0].stdout) as { rows: { target: string; kI: number }[] };
    const py = JSON.parse(r.b[0].stdout) as { targets: Record<string, { kI: number }> };
    for (const t of ['strip', 'sky']) {
      const a = sky.rows.find((x) => x.target === t)!.kI, b = py.targets[t].kI;
      console.log(`  k_I survey -> ${t}: skyspan ${a}, healpy ${b} (relative difference ${Math.abs(a / b - 1).toExponential(2)})`);
    }
  },
  start(scratch) {
    const plan = join(ROOT, 'examples/northern-plane/plan.yaml');
    const coldRoot = join(scratch, 'cold'), warmRoot = join(scratch, 'warm');
    const args = (root: string) => [BIN, 'run', plan, '-o', join(root, 'northern-plane'), '--force', '--quiet'];
    measure(node('warm-up', args(warmRoot)), scratch); // fills the warm cache
    console.log("npm start's job (the demo plan), whole process, empty cache against warm cache:");
    alternate({ ...node('A empty cache (as after a fresh clone)', args(coldRoot)), before: () => rmSync(coldRoot, { recursive: true, force: true }) },
      node('B warm cache', args(warmRoot)), scratch, 'targets: empty <= 10 s, warm <= 3 s');
  },
};

/** Runs the named whole-process suites (all by default). */
export async function benchWholeProcess(names: string[] = []): Promise<void> {
  if (!existsSync(TIME)) throw new Error(`${TIME} is needed for the whole-process benchmarks (Debian package time)`);
  execFileSync(process.execPath, [join(ROOT, 'scripts/build.mjs')], { cwd: ROOT, stdio: 'inherit' }); // measure the current sources, built as `npm run build` builds them
  console.log(`whole process (as users run it): node bin/skyspan.js (bundled dist/bin/), A B alternating, ${REPS} runs each; median (min-max); peak RSS from /usr/bin/time`);
  const scratch = mkdtempSync(join(tmpdir(), 'skyspan-bench-'));
  try {
    for (const n of names.length ? names : Object.keys(suites)) {
      if (!suites[n]) throw new Error(`unknown whole-process suite '${n}'; known: ${Object.keys(suites).join(', ')}`);
      suites[n](scratch);
    }
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  await benchWholeProcess(process.argv.slice(2));
}
