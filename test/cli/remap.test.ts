/**
 * `skyspan remap` through runCli. Degrading and reordering are checked
 * against healpy.ud_grade (pess=False) and its reordering
 * (scripts/remap_with_healpy.py, Debian python3-healpy); frame changes and
 * errors for the command-line rules.
 */
import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main.js';
import { readMapFile, readSkyMap, writeMapFile } from '../../src/io/mapFile.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { requirePython, runPython } from '../helpers/python.js';
import { testMap } from '../io/fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-remap-');
const have = requirePython();

async function cli(argv: string[]) {
  let out = '', err = '';
  const code = await runCli(argv, { out: (t) => { out += t; }, err: (t) => { err += t; } });
  return { code, out, err };
}

const input = join(dir, 'in.fits');
const plane = Float64Array.from({ length: 12 * 64 }, (_, i) => (i % 7 === 0 ? BLANK : Math.sin(0.05 * i) + 2));
writeMapFile(input, testMap(8, { planes: [plane], f64: true, frame: 'galactic' }));

describe('skyspan remap', () => {
  it.skipIf(!have)('degrades to Nside 4 and reorders to NESTED as healpy.ud_grade does', async () => {
    const out = join(dir, 'out.fits');
    const r = await cli(['remap', input, out, '--nside', '4', '--ordering', 'nested', '--json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out)).toMatchObject({ nside: 4, ordering: 'NESTED', frame: 'galactic' });
    const m = readSkyMap(out);
    const ref: (number | null)[] = JSON.parse(runPython('scripts/remap_with_healpy.py', [input, '4', 'NESTED']));
    expect(m.planes[0].length).toBe(ref.length);
    ref.forEach((v, i) => expect(m.planes[0][i]).toBeCloseTo(v!, 12));
  });

  it('changes frame, keeps every column, and gzips by suffix', async () => {
    const two = join(dir, 'two.fits');
    writeMapFile(two, [testMap(4, { column: 'A', f64: true }), testMap(4, { column: 'B', f64: true, k: 1 })]);
    const out = join(dir, 'eq.fits.gz');
    const r = await cli(['remap', two, out, '--frame', 'equatorial']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/wrote .*eq\.fits\.gz: A, B at Nside 4, RING, frame equatorial/);
    const maps = readMapFile(out).maps;
    expect(maps.map((m) => [m.column, m.frame])).toEqual([['A', 'equatorial'], ['B', 'equatorial']]);
  });

  it('asks for --input-frame when the input does not say its frame; refuses overwriting without --force', async () => {
    const unk = join(dir, 'unknown.fits');
    writeMapFile(unk, testMap(2, { frame: 'unknown' }));
    const r = await cli(['remap', unk, join(dir, 'x.fits'), '--frame', 'galactic']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/does not say its frame .*--input-frame/);
    expect((await cli(['remap', unk, join(dir, 'x.fits'), '--frame', 'galactic', '--input-frame', 'equatorial'])).code).toBe(0);
    const again = await cli(['remap', unk, join(dir, 'x.fits'), '--frame', 'galactic', '--input-frame', 'equatorial']);
    expect(again.code).toBe(1);
    expect(again.err).toMatch(/exists already.*--force/);
    expect((await cli(['remap', unk, unk, '--force'])).err).toMatch(/is an input of this job/);
  });

  it('bad options exit 2 with one line', async () => {
    for (const argv of [['--nside', '3'], ['--ordering', 'spiral'], ['--frame', 'ecliptic'], ['--quantity', 'odd']]) {
      const r = await cli(['remap', input, join(dir, 'y.fits'), ...argv]);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    }
  });
});
