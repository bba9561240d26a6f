/**
 * The streamed factor job (src/scaling/streamFactors.ts) against the job on
 * maps read whole (src/io/mapRead.ts + src/scaling/ensembleFactors.ts, whose
 * numbers test/scaling/factors.test.ts checks against healpy through
 * scripts/factor_reference.py). Streaming only changes how the values reach
 * the same kernels, so for RING maps every number must be identical, bit for
 * bit, over every column layout and with row blocks far smaller than a map;
 * NESTED maps are summed in NESTED order, equal to rounding (relative 1e-12).
 * The SHA-256 from the streaming pass is compared with node:crypto over the
 * file. (Equivalence of two implementations: common practice, no source.)
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { bintableHdu, primaryHdu, type CardSpec, type ColumnSpec } from '../../src/io/fits/writer.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { computeFactors, regionEvaluator } from '../../src/scaling/factors.js';
import { composeFactorResult, FactorJob } from '../../src/scaling/factorJob.js';
import { reduceTemplateFiles } from '../../src/scaling/streamFactors.js';
import { reduceTemplateFilesParallel } from '../../src/scaling/templatePool.js';
import { readTemplateFiles } from '../../src/scaling/templateFiles.js';
import { nside2npix } from '../../src/sphere/nside.js';
import { analyticTemplate } from './fixtures.js';

const NSIDE = 8;
const NPIX = nside2npix(NSIDE);
const dir = mkdtempSync(join(tmpdir(), 'skyspan-stream-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const doc = parseRegionDocument(`frame: galactic
regions:
  survey:
    all:
      - site: { latDeg: 20, maxZenithDeg: 50 }
      - box: { lonDeg: [0, 120], latDeg: [-20, 20] }
    except: { disc: { atDeg: [52, -1], radiusDeg: 6 } }
  strip: { band: { absLatDeg: [0, 15] } }
  cap: { disc: { atDeg: [200, 60], radiusDeg: 30 } }
  sky: { sky: true }
`, 'regions.yaml');

/** Values of plane j: the analytic template scaled per plane, with a few negative pixels. */
function plane(j: number, ordering: 'RING' | 'NESTED' = 'RING'): Float64Array {
  const base = analyticTemplate(NSIDE, ordering).planes[0];
  return Float64Array.from(base, (v, i) => (i % 97 === 3 ? -0.01 : v * (1 + 0.3 * j) + 0.001 * j));
}

const HPX = (extra: CardSpec[] = [], ordering = 'RING'): CardSpec[] => [['PIXTYPE', 'HEALPIX'], ['ORDERING', ordering], ['COORDSYS', 'G'], ...extra];
const energiesHdu = (e: number[]) => bintableHdu([{ name: 'ENERGY', type: 'float64', repeat: 1, unit: 'GeV', values: Float64Array.from(e) }], [['EXTNAME', 'ENERGIES']]);
const write = (name: string, parts: Uint8Array[], gz = false): string => {
  const p = join(dir, name);
  const bytes = Buffer.concat(parts);
  writeFileSync(p, gz ? gzipSync(bytes) : bytes);
  return p;
};
const pixelMajor = (planes: Float64Array[]): Float64Array => {
  const out = new Float64Array(NPIX * planes.length);
  for (let i = 0; i < NPIX; i++) for (let j = 0; j < planes.length; j++) out[i * planes.length + j] = planes[j][i];
  return out;
};

function layouts(): string[] {
  const files: string[] = [];
  const cube = { nside: NSIDE, ordering: 'RING' as const, frame: 'galactic' as const, column: 'CUBE', unit: 'arb',
    planes: [plane(0), plane(1), plane(2)], energiesGeV: Float64Array.from([1, 10, 100]) };
  files.push(join(dir, 'a-single-f32.fits'));
  writeMapFile(files.at(-1)!, { ...cube, column: 'T', planes: [plane(0)], energiesGeV: null }, { dtype: 'float32' });
  files.push(join(dir, 'b-cube-columns.fits'));
  writeMapFile(files.at(-1)!, cube, { dtype: 'float32' });
  files.push(join(dir, 'c-cube-columns-f64.fits.gz'));
  writeMapFile(files.at(-1)!, cube, { dtype: 'float64' });
  const withBlanks = { ...cube, planes: cube.planes.map((p) => Float64Array.from(p, (v, i) => (i % 5 === 0 ? NaN : v))) };
  files.push(join(dir, 'd-explicit.fits'));
  writeMapFile(files.at(-1)!, withBlanks, { dtype: 'float32', layout: 'explicit' });
  files.push(write('e-vector-cube.fits', [primaryHdu(),
    ...bintableHdu([{ name: 'CUBE', type: 'float32', repeat: 3, values: pixelMajor(cube.planes) }], HPX([['NSIDE', NSIDE]])), ...energiesHdu([2, 20, 200])]));
  files.push(write('f-vector-rows.fits.gz', [primaryHdu(),
    ...bintableHdu([{ name: 'T', type: 'float32', repeat: 32, values: plane(4) }], HPX())], true));
  const scaled = Int16Array.from(plane(5).subarray(10, NPIX - 7), (v, i) => (i % 11 === 0 ? -32768 : i % 13 === 0 ? -999 : Math.round(v * 1000)));
  files.push(write('g-int16-scaled-range.fits', [primaryHdu(),
    ...bintableHdu([{ name: 'T', type: 'int16', repeat: 1, values: scaled }],
      HPX([['NSIDE', NSIDE], ['FIRSTPIX', 10], ['LASTPIX', NPIX - 8], ['TSCAL1', 0.001], ['TZERO1', 0.5], ['TNULL1', -32768], ['BAD_DATA', 0.5 - 0.999]]))]));
  const order = Int32Array.from({ length: NPIX }, (_, i) => (i * 37) % NPIX);
  const p6 = plane(6);
  files.push(write('h-explicit-unsorted.fits', [primaryHdu(),
    ...bintableHdu([{ name: 'PIXEL', type: 'int32', repeat: 1, values: order }, { name: 'T', type: 'float64', repeat: 1, values: Float64Array.from(order, (p) => p6[p]) }],
      HPX([['NSIDE', NSIDE], ['INDXSCHM', 'EXPLICIT']]))]));
  const cols: ColumnSpec[] = [{ name: 'A', type: 'float32', repeat: 1, values: plane(7) }, { name: 'B', type: 'float64', repeat: 1, values: plane(8) }];
  files.push(write('i-two-maps.fits', [primaryHdu(), ...bintableHdu(cols, HPX([['NSIDE', NSIDE]]))]));
  return files;
}

const settings = { regions: doc, measured: 'survey', targets: ['strip', 'cap', 'sky'], mode: 'fraction' as const };

async function streamed(files: string[], blockBytes: number) {
  const r = regionEvaluator(settings);
  const job = new FactorJob({ ...settings, isWholeSky: r.isWholeSky }, r.evaluate);
  const read = await reduceTemplateFiles(job, files, { blockBytes });
  return { result: composeFactorResult([job.log]), read };
}

describe('the streamed factor job', () => {
  const files = layouts();

  it('gives exactly the numbers, notes and warnings of the whole-file job over every column layout (RING)', async () => {
    const whole = computeFactors({ ...settings, templates: readTemplateFiles(files) });
    expect(whole.rows.length).toBe((1 + 3 + 3 + 3 + 3 + 1 + 1 + 1 + 2) * 3);
    expect(whole.warnings.some((w) => w.includes('blank pixels in measured region'))).toBe(true);
    expect(whole.notes.some((w) => w.includes('blank pixels on the sky'))).toBe(true);
    for (const blockBytes of [1000, 1 << 22]) {
      const { result, read } = await streamed(files, blockBytes);
      expect(result).toEqual(whole);
      expect(read.map((f) => f.streamed)).toEqual(files.map((f) => !f.includes('unsorted')));
    }
  });

  it('gives the same result on two worker threads, one file per worker', async () => {
    const { result } = await streamed(files, 1 << 22);
    const r = regionEvaluator(settings);
    const job = new FactorJob({ ...settings, isWholeSky: r.isWholeSky }, r.evaluate);
    const done: number[] = [];
    const read = await reduceTemplateFilesParallel(job, files, { workers: 2, onFile: (d) => done.push(d) });
    expect(composeFactorResult([job.log])).toEqual(result);
    expect(done).toEqual(files.map((_, i) => i + 1));
    for (const f of read) expect(f.sha256).toBe(createHash('sha256').update(readFileSync(f.file)).digest('hex'));
  }, 120000);

  it('hashes each file in the same pass (SHA-256, FIPS 180-4, as node:crypto computes it)', async () => {
    const { read } = await streamed(files.slice(0, 3), 4096);
    for (const f of read) expect(f.sha256).toBe(createHash('sha256').update(readFileSync(f.file)).digest('hex'));
  });

  it('sums NESTED maps in NESTED order: equal to the whole-file job within 1e-12 relative', async () => {
    const p = join(dir, 'n-nested.fits');
    const m = { nside: NSIDE, ordering: 'NESTED' as const, frame: 'galactic' as const, column: 'CUBE', unit: 'arb',
      planes: [plane(0, 'NESTED'), plane(1, 'NESTED')], energiesGeV: Float64Array.from([1, 10]) };
    writeMapFile(p, m, { dtype: 'float64' });
    const whole = computeFactors({ ...settings, templates: readTemplateFiles([p]) });
    const { result } = await streamed([p], 2000);
    expect(result.rows.length).toBe(whole.rows.length);
    result.rows.forEach((row, i) => {
      for (const [k, v] of Object.entries(row)) {
        const w = (whole.rows[i] as unknown as Record<string, unknown>)[k];
        if (typeof v === 'number' && v !== 0) expect(Math.abs(v / (w as number) - 1)).toBeLessThan(1e-12);
        else expect(v).toEqual(w);
      }
    });
  });

  it('reports a truncated file with its name and byte offset', async () => {
    const bytes = readFileSync(files[1]);
    const p = join(dir, 'cut.fits');
    writeFileSync(p, bytes.subarray(0, 2880 * 2 + 1000));
    await expect(streamed([p], 1000)).rejects.toThrow(/cut\.fits.*ends \d+ bytes before the end of the map table/);
  });
});
