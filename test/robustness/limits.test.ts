/**
 * Limits on what skyspan reads (issue 16): inputs that are not regular files
 * or are larger than the stated caps are refused before a byte is read; a
 * .fits.gz inflates only within the memory limit; an NSIDE that disagrees
 * with the data length is refused, as Debian's python3-healpy refuses it
 * (scripts/healpy_read_refusal.py). Wording: common practice, no source.
 */
import { execFileSync } from 'node:child_process';
import { closeSync, mkdtempSync, openSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { ComputeError, InputError } from '../../src/core/errors.js';
import { MEMORY_LIMIT_ENV } from '../../src/core/memory.js';
import { readCsv } from '../../src/io/csv.js';
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
