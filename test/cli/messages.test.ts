/**
 * Messages name what is wrong and where: the missing or unknown key or
 * column, and the file line (counting comment lines); commander's own errors
 * are one line with the `skyspan:` prefix. Expected texts are skyspan's own
 * wording (common practice, no source).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { closestWord } from '../../src/core/didYouMean.js';
import { parseSpectrumPoints } from '../../src/physics/points.js';

const dir = mkdtempSync(join(tmpdir(), 'skyspan-messages-'));
const HEAD = '# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\n';

async function cli(argv: string[]) {
  let out = '', err = '';
  const code = await runCli(argv, { out: (t) => { out += t; }, err: (t) => { err += t; } });
  return { code, out, err };
}

const message = (f: () => unknown): string => {
  try { f(); } catch (e) { return (e as Error).message; }
  throw new Error('expected an error');
};

describe('messages name the key, column and line', () => {
  it('a points file with err_low but no err_high column names err_high at the header line', () => {
    const m = message(() => parseSpectrumPoints(`${HEAD}energy,value,err_low\n10,1e-12,1e-13\n`, 'p.csv'));
    expect(m).toMatch(/^p\.csv, line 3: found no column 'err_high' in the header \(its columns: energy, value, err_low\)/);
  });
  it('a points row with an empty err_high names err_high and the row\'s line', () => {
    const m = message(() => parseSpectrumPoints(`${HEAD}# a comment\nenergy,value,err_low,err_high\n10,1e-12,1e-13,1e-13\n20,1e-13,1e-14,\n`, 'p.csv'));
    expect(m).toMatch(/^p\.csv, line 6, keyword err_high: err_high is empty, expected an error > 0/);
  });
  it('a missing column is reported at the header\'s line (3 here), with a did-you-mean', () => {
    const m = message(() => parseSpectrumPoints(`${HEAD}energy,valeu,err\n10,1e-12,1e-13\n`, 'p.csv'));
    expect(m).toMatch(/^p\.csv, line 3: found no column 'value' in the header/);
    expect(m).toContain("did you mean 'valeu'?");
  });
  it('the unknown key radiusdeg is named, not the missing radiusDeg, with a did-you-mean', async () => {
    const f = join(dir, 'regions.yaml');
    writeFileSync(f, 'frame: galactic\nregions:\n  d:\n    disc: { atDeg: [10, 0], radiusdeg: 2 }\n');
    const r = await cli(['mask', f, 'd', '-o', join(dir, 'd.fits'), '--nside', '4']);
    expect(r.code).toBe(1);
    expect(r.err).toBe(`skyspan: ${f}, key regions.d.disc.radiusdeg: found unknown key 'radiusdeg', expected one of: frame, atDeg, radiusDeg (did you mean 'radiusDeg'?)\n`);
  });
  it('a catalogue without its lat column names the column and the header line', async () => {
    writeFileSync(join(dir, 'cat.csv'), '# invented\nname,lon,glat,radius\na,10,1,0.5\n');
    const f = join(dir, 'cat.yaml');
    writeFileSync(f, 'frame: galactic\nregions:\n  m:\n    sources: { file: cat.csv }\n');
    const r = await cli(['mask', f, 'm', '-o', join(dir, 'm.fits'), '--nside', '4']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/key regions\.m\.sources\.columns\.lat: found no column 'lat' in the header of cat\.csv \(line 2; its columns: name, lon, glat, radius\)/);
    expect(r.err).toContain("did you mean 'glat'?");
  });
  it('option-parser errors are one line with the skyspan: prefix', async () => {
    for (const argv of [['mask', '--bogus'], ['maks'], ['mask', 'only-one-argument'], ['draw', 'x.fits']]) {
      const r = await cli(argv);
      expect(r.code).toBe(2);
      expect(r.err.endsWith('\n')).toBe(true);
      expect(r.err.trimEnd().split('\n')).toHaveLength(1);
      expect(r.err.startsWith('skyspan: ')).toBe(true);
    }
    expect((await cli(['mask', '--bogus'])).err).toContain("unknown option '--bogus'");
    expect((await cli(['maks'])).err).toContain("unknown command 'maks' (Did you mean mask?)");
  });
  it('did-you-mean accepts near words only (edit distance with transpositions, Damerau 1964)', () => {
    expect(closestWord('radiusdeg', ['frame', 'atDeg', 'radiusDeg'])).toBe('radiusDeg');
    expect(closestWord('colour', ['frame', 'atDeg'])).toBeNull();
    expect(closestWord('valeu', ['energy', 'value'])).toBe('value');
    expect(closestWord('b', ['a'])).toBeNull();
  });
});
