/**
 * Huge maps are refused before they are allocated: the estimate (12 Nside^2
 * pixels per plane, Gorski et al. 2005, ApJ 622, 759, eq. 2; 4 or 8 bytes a
 * value) is compared with a limit, here set small through the option or the
 * environment variable so that small maps trigger the refusal.
 * Wording expectations: common practice, no source.
 */
import { existsSync, statSync, writeFileSync } from 'node:fs';
import { freemem } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { ComputeError, InputError } from '../../src/core/errors.js';
import { assertFits, availableMemoryBytes, estimateMapBytes, formatBytes, MEMORY_LIMIT_ENV } from '../../src/core/memory.js';
import { readMapFile, writeMapFile } from '../../src/io/mapFile.js';
import { testMap } from '../io/fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-memory-');
const twoColumns = join(dir, 'two.fits');
writeMapFile(twoColumns, [testMap(16, { column: 'A', f64: true }), testMap(16, { column: 'B', f64: true, k: 1 })], { dtype: 'float64' });
const single = join(dir, 'single.fits');
writeMapFile(single, testMap(16, { column: 'A' }), { dtype: 'float32' });

async function cli(argv: string[]) {
  let out = '', err = '';
  const code = await runCli(argv, { out: (t) => { out += t; }, err: (t) => { err += t; } });
  return { code, out, err };
}

afterEach(() => { delete process.env[MEMORY_LIMIT_ENV]; });

describe('memory estimates (src/core/memory.ts)', () => {
  it('counts 12 Nside^2 values per plane: an Nside 4096 float32 plane is 805 306 368 bytes', () => {
    // 12 * 4096^2 * 4 = 805306368 (Gorski et al. 2005, eq. 2; arithmetic by hand).
    expect(estimateMapBytes(4096, 1, 4)).toBe(805306368);
    expect(estimateMapBytes(8, 3, 8, 2)).toBe(12 * 64 * 3 * 8 * 2);
    expect(formatBytes(805306368)).toBe('768.0 MiB');
    expect(formatBytes(3 * 2 ** 30)).toBe('3.0 GiB');
  });

  it('takes the limit from the option, then the environment, then the system', () => {
    expect(availableMemoryBytes(1234, {})).toEqual({ bytes: 1234, source: 'option' });
    expect(availableMemoryBytes(undefined, { [MEMORY_LIMIT_ENV]: '5e6' })).toEqual({ bytes: 5e6, source: 'environment' });
    const sys = availableMemoryBytes(undefined, {});
    expect(sys.source).toBe('system');
    expect(sys.bytes).toBeGreaterThan(0);
    expect(sys.bytes).toBeLessThanOrEqual(freemem() * 1.5 + 2 ** 30); // free memory moves a little between the two calls
  });

  it.each(['abc', '-5', '0', 'NaN', 'Infinity'])('refuses %s in SKYSPAN_MEMORY_LIMIT_BYTES with an InputError naming it', (v) => {
    expect(() => availableMemoryBytes(undefined, { [MEMORY_LIMIT_ENV]: v })).toThrow(InputError);
    expect(() => availableMemoryBytes(undefined, { [MEMORY_LIMIT_ENV]: v })).toThrow(/SKYSPAN_MEMORY_LIMIT_BYTES: is '.*', expected a positive number of bytes/);
  });

  it('assertFits passes under the limit and names estimate, limit and hint above it', () => {
    expect(() => assertFits(1000, 'x', 'y', 1000)).not.toThrow();
    expect(() => assertFits(3 * 2 ** 20, 'holding the job', 'use less', 2 ** 20))
      .toThrow('holding the job needs about 3.0 MiB, more than the 1.0 MiB (limit given as an option); use less');
    expect(() => assertFits(NaN, 'a', 'b', 10)).not.toThrow(); // a NaN estimate is never "more"; callers pass finite counts
  });
});

describe('reading a map refuses before decoding when it would not fit', () => {
  // Two float64 columns at Nside 16: 2 x 3072 x 8 = 49152 bytes decoded, on top of the file's bytes already held.
  const fileBytes = statSync(twoColumns).size;
  it('through the option: a ComputeError naming the estimate, the Nside and the ways to need less', () => {
    let err: unknown;
    try { readMapFile(twoColumns, { memoryLimitBytes: fileBytes + 1000 }); } catch (e) { err = e; }
    expect(err).toBeInstanceOf(ComputeError);
    const m = (err as Error).message;
    expect(m).toContain(`decoding 2 map planes of ${twoColumns} at Nside 16 needs about ${Math.ceil((fileBytes + 49152) / 1024)} KiB`);
    expect(m).toContain(`more than the ${Math.ceil((fileBytes + 1000) / 1024)} KiB (limit given as an option)`);
    expect(m).toContain('--nside 8');
    expect(m).toContain('one map column per file');
    expect(m).not.toContain('\n');
    expect(readMapFile(twoColumns, { memoryLimitBytes: fileBytes + 49152 }).maps).toHaveLength(2); // exactly the estimate fits
  });

  it('a single full-sky float column is decoded in the file buffer: the file size is all it needs', () => {
    const size = statSync(single).size;
    expect(readMapFile(single, { memoryLimitBytes: size }).maps[0].planes[0].length).toBe(3072);
    expect(() => readMapFile(single, { memoryLimitBytes: size - 1 })).toThrow(/^reading .*single\.fits needs about 20 KiB, more than the 20 KiB \(limit given as an option\); lower its Nside/);
  });

  it('through SKYSPAN_MEMORY_LIMIT_BYTES and the CLI: one line, exit 1, no stack', async () => {
    process.env[MEMORY_LIMIT_ENV] = String(fileBytes + 1000);
    const r = await cli(['remap', twoColumns, join(dir, 'never.fits'), '--nside', '8']);
    expect(r.code).toBe(1);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/^skyspan: decoding 2 map planes of .* needs about \d+ KiB, more than the \d+ KiB \(limit set by SKYSPAN_MEMORY_LIMIT_BYTES\); lower the Nside/);
    expect(existsSync(join(dir, 'never.fits'))).toBe(false);
    // The factor job reads its templates through the same check.
    const regions = join(dir, 'regions.yaml');
    writeFileSync(regions, 'frame: galactic\nregions:\n  a: { band: { absLatDeg: [0, 10] } }\n  sky: { sky: true }\n');
    process.env[MEMORY_LIMIT_ENV] = '4096';
    const f = await cli(['factors', '--regions', regions, '--measured', 'a', '--target', 'sky', '--templates', twoColumns, single]);
    expect(f.code).toBe(1);
    expect(f.err.trim().split('\n')).toHaveLength(1);
    expect(f.err).toMatch(/^skyspan: .*needs about \d+ KiB, more than the 4 KiB/);
    const bad = await (process.env[MEMORY_LIMIT_ENV] = 'lots', cli(['info', twoColumns]));
    expect(bad.code).toBe(1);
    expect(bad.err).toMatch(/^skyspan: key SKYSPAN_MEMORY_LIMIT_BYTES: is 'lots'/);
  });
});
