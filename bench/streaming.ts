/**
 * Benchmark of the streamed factor job on an energy cube: a K-plane Nside-N
 * float32 cube (PLANE1..PLANEK columns beside an ENERGIES table, the layout
 * skyspan writes; values invented) generated into bench/data/ (gitignored)
 * and deleted afterwards. Whole processes, timed by /usr/bin/time -v (wall
 * and peak RSS from the operating system), each run once:
 *   - reference: a plain Node script that reads the file once in 4 MiB chunks
 *     and sums every big-endian float32;
 *   - `bin/skyspan.js factors ... --json` over the cube (the regions of
 *     bench/factors.ts, centre mode), single-threaded and in a worker;
 *   - `bin/skyspan.js --version`, the start-up alone.
 * With SKYSPAN_BENCH_ENSEMBLE=M it also links the cube under M names and times the
 * ensemble with --workers 1 and --workers 2.
 *
 * Run alone: npx tsx bench/streaming.ts   (SKYSPAN_BENCH_NSIDE, SKYSPAN_BENCH_PLANES;
 * SKYSPAN_BENCH_QUICK=1 times the reference and the single-threaded job only)
 */
import { execFileSync } from 'node:child_process';
import { closeSync, linkSync, mkdirSync, openSync, rmSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { bintableHdu, headerBytes, primaryHdu } from '../src/io/fits/writer.js';
import { REGIONS } from './factors.js';

const HERE = dirname(fileURLToPath(import.meta.url));
const ROOT = resolve(HERE, '..');
const NSIDE = Number(process.env.SKYSPAN_BENCH_NSIDE ?? 1024);
const PLANES = Number(process.env.SKYSPAN_BENCH_PLANES ?? 30);
const ENSEMBLE = Number(process.env.SKYSPAN_BENCH_ENSEMBLE ?? 0);
const DIR = join(HERE, 'data', 'streaming');


/** Writes the cube row block by row block (never whole in memory). */
function makeCube(path: string): void {
  const npix = 12 * NSIDE * NSIDE, rowBytes = 4 * PLANES;
  const cards: [string, string | number | boolean][] = [['XTENSION', 'BINTABLE'], ['BITPIX', 8], ['NAXIS', 2], ['NAXIS1', rowBytes],
    ['NAXIS2', npix], ['PCOUNT', 0], ['GCOUNT', 1], ['TFIELDS', PLANES]];
  for (let j = 1; j <= PLANES; j++) cards.push([`TTYPE${j}`, `PLANE${j}`], [`TFORM${j}`, '1E']);
  cards.push(['PIXTYPE', 'HEALPIX'], ['ORDERING', 'RING'], ['COORDSYS', 'G'], ['NSIDE', NSIDE], ['INDXSCHM', 'IMPLICIT'], ['CUBECOL', 'BENCH']);
  const fd = openSync(path, 'w');
  writeSync(fd, primaryHdu());
  writeSync(fd, headerBytes(cards));
  const rows = 65536, buf = Buffer.alloc(rows * rowBytes);
  for (let p0 = 0; p0 < npix; p0 += rows) {
    const n = Math.min(rows, npix - p0);
    for (let i = 0; i < n; i++) {
      const base = 1 + 0.5 * Math.sin((p0 + i) * 1e-4);
      for (let j = 0; j < PLANES; j++) buf.writeFloatBE(base * (1 + 0.05 * j), (i * PLANES + j) * 4);
    }
    writeSync(fd, buf, 0, n * rowBytes);
  }
  const pad = (2880 - ((npix * rowBytes) % 2880)) % 2880;
  writeSync(fd, Buffer.alloc(pad));
  const energies = Float64Array.from({ length: PLANES }, (_, j) => 10 ** (2 + j / 10));
  for (const part of bintableHdu([{ name: 'ENERGY', type: 'float64', repeat: 1, unit: 'GeV', values: energies }], [['EXTNAME', 'ENERGIES']])) writeSync(fd, part);
  closeSync(fd);
}

/** The reference: read the file once in 4 MiB chunks, swap to little-endian, sum every float32 (whole process). */
const SUM_SCRIPT = `const fs=require('fs');const fd=fs.openSync(process.argv[1],'r');const ab=new ArrayBuffer(4<<20);const b=Buffer.from(ab);
const f=new Float32Array(ab);let s=0,n;while((n=fs.readSync(fd,b,0,b.length,null))>0){const m=n>>2;b.subarray(0,m*4).swap32();for(let i=0;i<m;i++)s+=f[i];}
console.log(s);`;

interface Timed { wallSeconds: number; cpuSeconds: number; maxRssBytes: number; stdout: string }

/** Runs a command under /usr/bin/time -v; wall time and peak RSS as the OS reports them. */
function timed(cmd: string[], env: Record<string, string> = {}): Timed {
  const stderrFile = join(DIR, 'time.txt');
  const stdout = execFileSync('/bin/sh', ['-c', `/usr/bin/time -v -o ${stderrFile} "$@"`, 'sh', ...cmd],
    { cwd: ROOT, encoding: 'utf8', maxBuffer: 1 << 28, env: { ...process.env, ...env } });
  const t = execFileSync('cat', [stderrFile], { encoding: 'utf8' });
  const wall = /Elapsed \(wall clock\) time.*: (?:(\d+):)?(\d+):(\d+(?:\.\d+)?)/.exec(t)!;
  const rss = /Maximum resident set size \(kbytes\): (\d+)/.exec(t)!;
  const cpu = Number(/User time \(seconds\): ([\d.]+)/.exec(t)![1]) + Number(/System time \(seconds\): ([\d.]+)/.exec(t)![1]);
  return { wallSeconds: Number(wall[1] ?? 0) * 3600 + Number(wall[2]) * 60 + Number(wall[3]), cpuSeconds: cpu, maxRssBytes: Number(rss[1]) * 1024, stdout };
}

/** Runs the benchmark and prints its figures (see module doc). */
export async function benchStreaming(): Promise<void> {
  mkdirSync(DIR, { recursive: true });
  const cube = join(DIR, 'cube.fits');
  const regions = join(DIR, 'regions.yaml');
  writeFileSync(regions, REGIONS);
  try {
    console.log(`generating a ${PLANES}-plane Nside ${NSIDE} float32 cube...`);
    makeCube(cube);
    const size = statSync(cube).size;
    const load = execFileSync('cat', ['/proc/loadavg'], { encoding: 'utf8' }).trim();
    console.log(`cube: ${(size / 2 ** 30).toFixed(2)} GiB; load average before: ${load}`);
    const cli = ['node', join(ROOT, 'bin/skyspan.js')];
    const job = (files: string[], extra: string[] = []) => [...cli, 'factors', '--regions', regions, '--measured', 'survey', '--target', 'strip', 'sky',
      '--templates', ...files, '--centre', '--json', ...extra];
    const ref = timed(['node', '-e', SUM_SCRIPT, cube]);
    const quick = process.env.SKYSPAN_BENCH_QUICK === '1'; // the single-threaded job only (e.g. Nside 8192)
    const version = quick ? null : timed([...cli, '--version']);
    const single = timed(job([cube]), { SKYSPAN_SINGLE_THREAD: '1' });
    const worker = quick ? null : timed(job([cube]));
    const f = (t: Timed) => `${t.wallSeconds.toFixed(2)} s wall, ${t.cpuSeconds.toFixed(2)} s CPU, peak RSS ${(t.maxRssBytes / 2 ** 20).toFixed(0)} MiB`;
    console.log(`reference: read once + sum (node, whole process): ${f(ref)}`);
    if (version) console.log(`skyspan --version (start-up only):                 ${f(version)}`);
    console.log(`skyspan factors, one thread (whole process):       ${f(single)}  ratio ${(single.wallSeconds / ref.wallSeconds).toFixed(2)}x (target <= 2x)`);
    if (worker) console.log(`skyspan factors, worker thread (whole process):    ${f(worker)}  ratio ${(worker.wallSeconds / ref.wallSeconds).toFixed(2)}x`);
    console.log(`CPU ratios (steadier on a shared machine): one thread ${(single.cpuSeconds / ref.cpuSeconds).toFixed(2)}x` +
      (version ? `, one thread less start-up ${((single.cpuSeconds - version.cpuSeconds) / ref.cpuSeconds).toFixed(2)}x` : ''));
    const rows = JSON.parse(single.stdout).rows.length;
    console.log(`rows: ${rows} (${PLANES} planes x 2 targets)`);
    if (ENSEMBLE > 0) {
      const copies = Array.from({ length: ENSEMBLE }, (_, i) => join(DIR, `cube${i}.fits`));
      copies.forEach((c) => linkSync(cube, c)); // hard links: same bytes, same page cache, distinct template names
      const w1 = timed(job(copies, ['--workers', '1']));
      const w2 = timed(job(copies, ['--workers', '2']));
      console.log(`${ENSEMBLE} templates, --workers 1: ${f(w1)}`);
      console.log(`${ENSEMBLE} templates, --workers 2: ${f(w2)}  ratio ${(w2.wallSeconds / w1.wallSeconds).toFixed(2)}x (target <= 0.6x)`);
      console.log(`load average after: ${execFileSync('cat', ['/proc/loadavg'], { encoding: 'utf8' }).trim()}`);
    }
  } finally {
    rmSync(DIR, { recursive: true, force: true });
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  await benchStreaming();
}
