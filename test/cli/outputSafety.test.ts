/**
 * Nothing is lost, for every command that writes: an existing output is
 * refused without --force (and nothing of the job is written) and replaced
 * with it; an output path that is one of the job's inputs is refused even
 * with --force; an output folder that cannot be written gives one clear line
 * and leaves the earlier outputs intact. One row per command; add a row when
 * a command that writes lands.
 * Expectations: the atomic-write contract (temporary file and rename, inputs
 * never opened for writing); common practice, no source.
 */
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { testMap } from '../io/fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const root = tempDir('skyspan-output-safety-');
const inputs = join(root, 'inputs');
mkdirSync(inputs);
const mapIn = join(inputs, 'map.fits');
writeMapFile(mapIn, testMap(8, { frame: 'galactic' }));
const templates = join(inputs, 'templates');
mkdirSync(templates);
writeMapFile(join(templates, 'alpha.fits'), testMap(8, { frame: 'galactic' }), { dtype: 'float32' });
const regions = join(inputs, 'regions.yaml');
writeFileSync(regions, 'frame: galactic\nregions:\n  survey: { box: { lonDeg: [20, 110], latDeg: [-10, 10] } }\n  sky: { sky: true }\n');
// Invented gamma-ray points (power law of index 2.7) and invented factors.
const points = join(inputs, 'points.csv');
writeFileSync(points, '# invented points\n# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err_low,err_high,ul\n'
  + [1, 3, 10, 30, 100].map((e) => { const v = 1e-12 * e ** -2.7; return `${e},${v},${0.1 * v},${0.12 * v},0`; }).join('\n') + '\n');
const factors = join(inputs, 'factors.json');
writeFileSync(factors, JSON.stringify({ templates: [{ name: 'a', kI: 2, survivalMean: 0.9 }, { name: 'b', kI: 3, survivalMean: 0.85 }] }));
const neutrino = join(inputs, 'nu.yaml');
writeFileSync(neutrino, '# invented\nkind: normalisation\nenergyUnit: GeV\nvalueUnit: GeV^-1 cm^-2 s^-1 sr^-1\ne0: 10000\nnorm: 2.0e-15\nerr: 0.5e-15\nindex: 2.5\nenergyRange: [1000, 100000]\n');
const spec = join(inputs, 'slab.yaml');
writeFileSync(spec, 'name: slab\ngas: [{component: exponentialSlab, densityCm3: 1, scaleHeightKpc: 0.1}]\ncosmicRays: {distribution: constant}\nintegration: {maxDistanceKpc: 5}\n');
const population = join(inputs, 'pop.yaml');
writeFileSync(population, `# invented population
populations:
  name: invented-nebulae
  count: 200
  spatial: { distribution: green2015, scaleHeightKpc: 0.1 }
  luminosity: { alpha: 1.8, minErgPerS: 1.0e32, maxErgPerS: 1.0e35 }
  spectrum: { pivotTeV: 10, index: 2.4, indexSpread: 0.1 }
  energiesTeV: [10]
  threshold: { fluxErgCm2S: 2.0e-12, referenceDecDeg: 30, siteLatDeg: 30, maxZenithDeg: 45 }
  regions: { measured: survey, neutrino: sky, counts: [survey] }
  realisations: 2
  seed: 2
  nside: 8
`);

/** A command that writes: `argv(out)` writes into folder `out`; `sameAsInput` gives an argv whose output is an input. */
interface Row { name: string; argv: (out: string) => string[]; sameAsInput?: () => { argv: string[]; input: string } }
const rows: Row[] = [
  { name: 'remap', argv: (o) => ['remap', mapIn, join(o, 'map-4.fits'), '--nside', '4'],
    sameAsInput: () => ({ argv: ['remap', mapIn, mapIn, '--nside', '4', '--force'], input: mapIn }) },
  { name: 'convert-spectrum', argv: (o) => ['convert-spectrum', points, '--method', 'kpi', '-o', join(o, 'nu')],
    sameAsInput: () => ({ argv: ['convert-spectrum', points, '--method', 'kpi', '-o', join(inputs, 'points'), '--force'], input: points }) },
  { name: 'mask', argv: (o) => ['mask', regions, 'survey', '--nside', '4', '-o', join(o, 'survey.fits')],
    sameAsInput: () => ({ argv: ['mask', regions, 'survey', '--nside', '4', '-o', regions, '--force'], input: regions }) },
  { name: 'draw', argv: (o) => ['draw', mapIn, '-o', join(o, 'map.png'), '--width', '300'],
    sameAsInput: () => ({ argv: ['draw', mapIn, '-o', mapIn, '--width', '300', '--force'], input: mapIn }) },
  { name: 'factors', argv: (o) => ['factors', '--regions', regions, '--measured', 'survey', '--target', 'sky', '--templates', templates, '--centre', '-o', o],
    sameAsInput: () => {
      // A factors table named like an input in the output folder: the regions file is called factors.csv there.
      const d = mkdtempSync(join(root, 'factors-in-'));
      const r = join(d, 'factors.csv');
      writeFileSync(r, readFileSync(regions));
      return { argv: ['factors', '--regions', r, '--measured', 'survey', '--target', 'sky', '--templates', templates, '--centre', '--format', 'csv', '-o', d, '--force'], input: r };
    } },
  { name: 'compare', argv: (o) => ['compare', '--gamma', points, '--factors', factors, '--samples', '500', '-o', o] },
  { name: 'expect-gamma', argv: (o) => ['expect-gamma', '--neutrino', neutrino, '--factors', factors, '--samples', '500', '-o', o] },
  { name: 'build', argv: (o) => ['build', spec, '-o', join(o, 'slab.fits'), '--nside', '2', '--quiet'],
    sameAsInput: () => ({ argv: ['build', spec, '-o', spec, '--nside', '2', '--quiet', '--force'], input: spec }) },
  { name: 'sources', argv: (o) => ['sources', population, '--regions', regions, '-o', o] },
];

async function cli(argv: string[]) {
  let out = '', err = '';
  const code = await runCli(argv, { out: (t) => { out += t; }, err: (t) => { err += t; } });
  return { code, out, err };
}

/** Files of a folder (not temporaries) with their inode and content. */
function snapshot(dir: string): Map<string, { ino: number; bytes: string }> {
  const m = new Map<string, { ino: number; bytes: string }>();
  for (const f of readdirSync(dir).sort()) {
    const p = join(dir, f);
    if (statSync(p).isFile()) m.set(f, { ino: statSync(p).ino, bytes: readFileSync(p).toString('base64') });
  }
  return m;
}

/** The error is the last line, matches `pattern`; every line is a "skyspan:" line and none is a stack line. */
function expectOneLine(err: string, pattern: RegExp): void {
  const lines = err.trimEnd().split('\n');
  expect(lines[lines.length - 1]).toMatch(pattern);
  for (const l of lines) expect(l).toMatch(/^skyspan: /);
  expect(err).not.toContain('internal error');
}

const temporaries = (dir: string) => readdirSync(dir).filter((f) => f.endsWith('.tmp'));
const asRoot = typeof process.getuid === 'function' && process.getuid() === 0;

describe.each(rows)('$name writes safely', (row) => {
  const out = mkdtempSync(join(root, `${row.name}-`));
  let first: Map<string, { ino: number; bytes: string }>;

  it('writes its outputs into an empty folder', async () => {
    const r = await cli(row.argv(out));
    expect(r.err.split('\n').filter((l) => l && !l.startsWith('skyspan: warning'))).toEqual([]);
    expect(r.code).toBe(0);
    first = snapshot(out);
    expect(first.size).toBeGreaterThan(0);
    expect(temporaries(out)).toEqual([]);
  });

  it('refuses to overwrite without --force, naming the file, and changes nothing', async () => {
    const r = await cli(row.argv(out));
    expect(r.code).toBe(1);
    expectOneLine(r.err, /^skyspan: .*: exists already \(pass --force to replace it/);
    expect(snapshot(out)).toEqual(first);
  });

  it('with one of its outputs missing, still writes nothing without --force (all outputs are checked first)', async () => {
    for (const name of first.keys()) {
      const before = snapshot(out);
      const { rmSync } = await import('node:fs');
      rmSync(join(out, name));
      const r = await cli(row.argv(out));
      if (first.size === 1) {
        expect(r.code).toBe(0); // the only output was missing: nothing to refuse
      } else {
        expect(r.code, `after removing ${name}`).toBe(1);
        expect(existsSync(join(out, name)), `${name} was written although the job was refused`).toBe(false);
        // Put it back as it was for the next round.
        writeFileSync(join(out, name), Buffer.from(before.get(name)!.bytes, 'base64'));
      }
    }
    first = snapshot(out);
  });

  it('replaces every output with --force (new files renamed into place)', async () => {
    const r = await cli([...row.argv(out), '--force']);
    expect(r.code).toBe(0);
    const after = snapshot(out);
    expect([...after.keys()]).toEqual([...first.keys()]);
    for (const [name, f] of after) expect(f.ino, `${name} was not replaced`).not.toBe(first.get(name)!.ino);
    expect(temporaries(out)).toEqual([]);
  });

  it.runIf(row.sameAsInput !== undefined)('never writes over one of its inputs, even with --force', async () => {
    const { argv, input } = row.sameAsInput!();
    const before = readFileSync(input);
    const ino = statSync(input).ino;
    const r = await cli(argv);
    expect(r.code).toBe(1);
    expectOneLine(r.err, /is an input of this job and is never overwritten/);
    expect(readFileSync(input).equals(before)).toBe(true);
    expect(statSync(input).ino).toBe(ino);
  });

  it('an output folder that cannot be written: one clear line, exit 1, earlier outputs intact', async () => {
    const earlier = snapshot(out);
    // As root, chmod does not stop writes: put the output folder under a regular file instead (ENOTDIR).
    const blocker = join(root, `${row.name}-not-a-folder`);
    writeFileSync(blocker, 'a file, not a folder\n');
    const r = await cli([...row.argv(join(blocker, 'sub')), '--force']);
    expect(r.code).toBe(1);
    expectOneLine(r.err, /^skyspan: .*(cannot write here: ENOTDIR|ENOTDIR)/);
    expect(snapshot(out)).toEqual(earlier);
    if (!asRoot) {
      const locked = mkdtempSync(join(root, `${row.name}-locked-`));
      chmodSync(locked, 0o555);
      try {
        const r2 = await cli([...row.argv(locked), '--force']);
        expect(r2.code).toBe(1);
        expectOneLine(r2.err, /cannot write here: EACCES/);
        expect(readdirSync(locked)).toEqual([]);
      } finally { chmodSync(locked, 0o755); }
    }
  });
});
