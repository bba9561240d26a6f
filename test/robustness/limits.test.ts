/**
 * Limits on what skyspan reads (issue 16): inputs that are not regular files
 * or are larger than the stated caps are refused before a byte is read; a
 * .fits.gz inflates only within the memory limit; an NSIDE that disagrees
 * with the data length is refused, as Debian's python3-healpy refuses it
 * (scripts/healpy_read_refusal.py). Wording: common practice, no source.
 */
import { execFileSync } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { ComputeError, InputError } from '../../src/core/errors.js';
import { MEMORY_LIMIT_ENV } from '../../src/core/memory.js';
import { readCsv } from '../../src/io/csv.js';
import { writeAll, writeFileAtomic } from '../../src/io/atomicWrite.js';
import { sha256File } from '../../src/io/hash.js';
import { MAP_INPUT_CAP_BYTES, TEXT_INPUT_CAP_BYTES } from '../../src/io/inputFile.js';
import { readMapFile, writeMapFile } from '../../src/io/mapFile.js';
import { readSpectrumPoints } from '../../src/physics/points.js';
import { readMeasurement } from '../../src/compare/measurement.js';
import { readFactors } from '../../src/compare/factorsFile.js';
import { loadPlan } from '../../src/plan/loadPlan.js';
import { readTemplateSpec } from '../../src/templates/readSpecFile.js';
import { read, setCard, testMap, write } from '../io/fitsMutate.js';
import { PYTHON, requirePython, skipWithoutPython } from '../helpers/python.js';

const dir = mkdtempSync(join(tmpdir(), 'skyspan-limits-'));
const fifo = join(dir, 'pipe.csv');
execFileSync('mkfifo', [fifo]);
/** A sparse file of `bytes` bytes (no disk used). */
function sparse(name: string, bytes: number): string {
  const p = join(dir, name);
  const fd = openSync(p, 'w');
  closeSync(fd);
  execFileSync('truncate', ['-s', String(bytes), p]);
  return p;
}
const bigText = sparse('big.csv', TEXT_INPUT_CAP_BYTES + 1);
const bigMap = sparse('big.fits', MAP_INPUT_CAP_BYTES + 1);

function oneLineInputError(f: () => unknown, pattern: RegExp): void {
  let caught: unknown;
  try { f(); } catch (e) { caught = e; }
  expect(caught).toBeInstanceOf(InputError);
  expect((caught as Error).message).not.toContain('\n');
  expect((caught as Error).message).toMatch(pattern);
}

const readers: [string, (p: string) => unknown][] = [
  ['readCsv', readCsv], ['readSpectrumPoints', readSpectrumPoints], ['readMapFile', readMapFile],
  ['readMeasurement', readMeasurement], ['readFactors', (p) => readFactors(p)], ['loadPlan', loadPlan],
  ['readTemplateSpec', readTemplateSpec], ['sha256File', sha256File],
];

afterEach(() => { delete process.env[MEMORY_LIMIT_ENV]; });

describe('inputs are opened through one check (src/io/inputFile.ts)', () => {
  it.each(readers)('%s refuses a FIFO, /dev/zero and a directory before reading, in one line', (_name, reader) => {
    // Before: a FIFO blocked the open for ever and /dev/zero grew without bound.
    oneLineInputError(() => reader(fifo), /pipe\.csv.*is a FIFO \(named pipe\), not a regular file/);
    oneLineInputError(() => reader('/dev/zero'), /\/dev\/zero.*is a character device, not a regular file/);
    oneLineInputError(() => reader(dir), /is a directory, not a regular file \(give the path of a file inside it\)/);
  });
  it('text readers refuse a file over the 256 MiB cap, map readers one over the map cap, naming both sizes', () => {
    for (const r of [readCsv, readSpectrumPoints, readMeasurement, loadPlan]) {
      oneLineInputError(() => r(bigText), /big\.csv.*is 256\.0 MiB, more than the 256\.0 MiB cap for text inputs/);
    }
    oneLineInputError(() => readMapFile(bigMap), /big\.fits.*more than the \d+\.\d GiB cap for map files/);
    expect(statSync(bigMap).size).toBe(MAP_INPUT_CAP_BYTES + 1);
  });
  it('the CLI says it in one line and exits 1', async () => {
    let err = '';
    const code = await runCli(['info', fifo], { out: () => {}, err: (t) => { err += t; } });
    expect(code).toBe(1);
    expect(err).toMatch(/^skyspan: .*pipe\.csv: is a FIFO \(named pipe\), not a regular file/);
    expect(err.trim().split('\n')).toHaveLength(1);
  });
});

describe('.fits.gz inflates within the memory limit', () => {
  // A constant Nside 256 float64 map: 6.3 MB of data, a few kB once compressed.
  const gz = join(dir, 'flat.fits.gz');
  const m = testMap(256, { f64: true });
  (m.planes[0] as Float64Array).fill(1);
  writeMapFile(gz, m, { dtype: 'float64' });
  it('a small file that would inflate past SKYSPAN_MEMORY_LIMIT_BYTES is refused while inflating', () => {
    expect(statSync(gz).size).toBeLessThan(100_000);
    process.env[MEMORY_LIMIT_ENV] = String(2 ** 20);
    let caught: unknown;
    try { readMapFile(gz); } catch (e) { caught = e; }
    expect(caught).toBeInstanceOf(ComputeError);
    expect((caught as Error).message).toMatch(/^inflating .*flat\.fits\.gz needs more than the 1\.0 MiB \(limit set by SKYSPAN_MEMORY_LIMIT_BYTES\)/);
    delete process.env[MEMORY_LIMIT_ENV];
    expect(readMapFile(gz).maps[0].planes[0].length).toBe(12 * 256 * 256);
    expect(() => readMapFile(gz, { memoryLimitBytes: 2 ** 20 })).toThrow(/limit given as an option/);
  });
});

describe('NSIDE must agree with the data length', () => {
  const good = join(dir, 'n16.fits');
  writeMapFile(good, testMap(16), {});
  const bad = join(dir, 'n32-on-n16.fits');
  write(bad, setCard(read(good), 'NSIDE', '32', 2880)); // FIRSTPIX 0, LASTPIX 3071 kept from the Nside 16 file
  it('NSIDE 32 on Nside 16 data is refused in one line (before: read as a quarter-sky map)', () => {
    oneLineInputError(() => readMapFile(bad), /n32-on-n16\.fits, keyword NSIDE, byte \d+: NSIDE 32 disagrees with the data: .* 3072 pixels per plane, a full sky at Nside 16/);
  });
  it.skipIf(skipWithoutPython)('healpy refuses the same file and reads the good one (scripts/healpy_read_refusal.py)', () => {
    requirePython();
    const out = execFileSync(PYTHON, ['scripts/healpy_read_refusal.py', good, bad], { encoding: 'utf8' })
      .trim().split('\n').map((l) => JSON.parse(l) as { refused: boolean; npix: number | null; error: string | null });
    expect(out[0]).toMatchObject({ refused: false, npix: 3072 });
    expect(out[1].refused).toBe(true);
    expect(readMapFile(good).maps[0].planes[0].length).toBe(out[0].npix);
  });
});

async function cli(argv: string[]) {
  let out = '', err = '';
  const code = await runCli(argv, { out: (t) => { out += t; }, err: (t) => { err += t; } });
  return { code, out, err };
}

describe('the memory limit holds where skyspan allocates (core/memory.ts)', () => {
  const regions = join(dir, 'regions.yaml');
  writeFileSync(regions, 'regions:\n  plane:\n    box: { frame: galactic, lonDeg: [-180, 180], latDeg: [-5, 5] }\n');
  // Estimates: 12 Nside^2 pixels a plane (Gorski et al. 2005, ApJ 622, 759, eq. 2); 12 x 8192^2 x 16 bytes = 12.9 GB.
  it('mask at Nside 8192 under a 2 GB limit is refused before evaluating, in one line', async () => {
    process.env[MEMORY_LIMIT_ENV] = '2e9';
    const out = join(dir, 'mask8192.fits');
    const r = await cli(['mask', regions, 'plane', '-o', out, '--nside', '8192']);
    expect(r.code).toBe(1);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/^skyspan: evaluating region 'plane' at Nside 8192 needs about 12\.0 GiB, more than the 1\.9 GiB \(limit set by SKYSPAN_MEMORY_LIMIT_BYTES\); lower the working Nside \(e\.g\. --nside 4096\)/);
    expect(existsSync(out)).toBe(false);
  });
  it('remap to Nside 8192 under a 2 GB limit is refused before resampling', async () => {
    const src = join(dir, 'n16-remap.fits');
    writeMapFile(src, testMap(16), {});
    process.env[MEMORY_LIMIT_ENV] = '2e9';
    const r = await cli(['remap', src, join(dir, 'up.fits'), '--nside', '8192']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/^skyspan: remapping 1 plane of .* at Nside 8192 needs about 12\.0 GiB, more than the 1\.9 GiB/);
  });
  it('writing a map checks its encoded copies: a gzip output needs three, refused under a small limit', () => {
    const m = testMap(64, { f64: true }); // 49152 pixels x 8 bytes = 384 KiB a plane
    const out = join(dir, 'w.fits.gz');
    expect(() => writeMapFile(out, m, { memoryLimitBytes: 1e6 })).toThrow(/^writing 1 plane of 384 KiB to .*w\.fits\.gz needs about 1\.5 MiB, more than the 977 KiB \(limit given as an option\); write uncompressed/);
    expect(existsSync(out)).toBe(false);
    writeMapFile(join(dir, 'w.fits'), m, { memoryLimitBytes: 1e6 }); // 384 KiB encoded + 384 KiB held fit
  });
  it('sources: a count of 1e12 is refused in one line (before: "internal error: Invalid typed array length")', async () => {
    const section = join(dir, 'huge.yaml');
    writeFileSync(section, ['# invented population', 'populations:', '  name: invented-huge', '  count: 1.0e12',
      '  spatial: { distribution: green2015, scaleHeightKpc: 0.1 }', '  luminosity: { alpha: 1.8, minErgPerS: 1.0e32, maxErgPerS: 1.0e35 }',
      '  spectrum: { pivotTeV: 10, index: 2.4 }', '  energiesTeV: [10, 30]',
      '  threshold: { fluxErgCm2S: 2.0e-12, referenceDecDeg: 30, siteLatDeg: 30, maxZenithDeg: 45 }',
      '  realisations: 4', '  seed: 2', '  nside: 8', ''].join('\n'));
    const r = await cli(['sources', section, '--json']);
    expect(r.code).toBe(1);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/^skyspan: a realisation of 1\.00e\+12 sources at 2 energies with its result tables needs about \d+(\.\d)? [KMG]iB, more than .*; lower count/);
    expect(r.err).not.toContain('internal error');
    // 2000 sources (100 bytes each, 195.3 KiB) plus the result tables under a 100 kB limit: refused, naming the variable.
    writeFileSync(section, readFileSync(section, 'utf8').replace('1.0e12', '2000'));
    process.env[MEMORY_LIMIT_ENV] = '1e5';
    const s = await cli(['sources', section, '--json']);
    expect(s.code).toBe(1);
    expect(s.err).toMatch(/needs about 19\d KiB, more than the 98 KiB \(limit set by SKYSPAN_MEMORY_LIMIT_BYTES\)/);
  });
});

describe('outputs over 2 GiB are written in pieces', () => {
  it('writeAll hands write(2) at most 1 GiB at a time: 2 GiB + 1 bytes to /dev/null (before: ERR_OUT_OF_RANGE)', () => {
    const fd = openSync('/dev/null', 'w');
    try {
      expect(() => writeAll(fd, new Uint8Array(2 ** 31 + 1))).not.toThrow(); // zero pages, never touched: no resident memory
    } finally { closeSync(fd); }
  });
  it('a write failure other than a full disk does not blame disk space', () => {
    const out = join(dir, 'fails.txt');
    const fail = (code: string) => () => writeFileAtomic(out, 'x', { writer: () => { throw Object.assign(new Error(code), { code }); } });
    expect(fail('EIO')).toThrow(/^.*fails\.txt: writing failed: EIO \(choose another folder; earlier outputs are intact\)$/);
    expect(fail('ENOSPC')).toThrow(/free disk space/);
    expect(existsSync(out)).toBe(false);
  });
});

describe('a FIFO input as a real program (issue 16: it hung and ignored SIGINT and SIGTERM)', () => {
  it('skyspan info on a FIFO exits 1 with one line, with no writer ever opening the pipe', async () => {
    const { spawn } = await import('node:child_process');
    const root = join(__dirname, '../..');
    const r = await new Promise<{ code: number | null; stderr: string; killed: boolean }>((done) => {
      const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', 'info', fifo], { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
      let stderr = '', killed = false;
      child.stderr.on('data', (d) => { stderr += d; });
      const t = setTimeout(() => { killed = true; child.kill('SIGKILL'); }, 170_000); // a hang ends here and fails below (start-up under tsx can take 40 s on a loaded machine)
      child.on('close', (code) => { clearTimeout(t); done({ code, stderr, killed }); });
    });
    expect(r.killed).toBe(false);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^skyspan: .*pipe\.csv: is a FIFO \(named pipe\), not a regular file/);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  }, 180_000);
});
