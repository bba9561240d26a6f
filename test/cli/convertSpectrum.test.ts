import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, type CliIo } from '../../src/cli/main.js';
import { tempDir } from '../helpers/tempDir.js';

function capture(): CliIo & { stdout: string; stderr: string } {
  const io = { stdout: '', stderr: '', out: (t: string) => { io.stdout += t; }, err: (t: string) => { io.stderr += t; } };
  return io;
}

// Invented points (an E^-2.7 power law), labelled as invented.
const POINTS = '# invented example points\n# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err_low,err_high,ul\n'
  + [1, 3, 10, 30, 100, 300].map((e) => { const v = 1e-12 * Math.pow(e, -2.7); return `${e},${v},${0.1 * v},${0.12 * v},0`; }).join('\n') + '\n';

describe('skyspan convert-spectrum', () => {
  const dir = tempDir('skyspan-conv-');
  const file = join(dir, 'points.csv');
  writeFileSync(file, POINTS);

  it('rule: all-flavour neutrinos at E/2 are 6 I_gamma(E) (Ahlers & Halzen 2018), in the requested units, with the KAB value beside', async () => {
    const io = capture();
    const code = await runCli(['convert-spectrum', file, '--method', 'kpi', '--json', '--unit', 'TeV^-1 cm^-2 s^-1 sr^-1'], io);
    expect(io.stderr).toBe('');
    expect(code).toBe(0);
    const doc = JSON.parse(io.stdout);
    expect(doc.method).toBe('kpi');
    expect(doc.columns.slice(0, 2)).toEqual(['energy', 'nu_all']);
    expect(doc.rows[0][0]).toBeCloseTo(0.5, 10);
    expect(doc.rows[0][1] / 1e-12).toBeCloseTo(6, 4);
    // KAB / rule for E^-2 to E^-2.7 spectra: 0.71 to 0.81 (scipy quad of the KAB 2006 forms, eqs. 58-69 and 79, in
    // scripts/kab_reference.py; compared in test/physics/hadronic/emissivity.test.ts); the window is wide because the CLI goes through the proton fit.
    const iKab = doc.columns.indexOf('kab_over_kpi');
    expect(doc.rows[2][iKab]).toBeGreaterThan(0.6);
    expect(doc.rows[2][iKab]).toBeLessThan(1);
  });

  it('kab: writes CSV, Markdown, JSON and plot data; refuses to overwrite without --force', async () => {
    const out = join(dir, 'nu');
    const io = capture();
    expect(await runCli(['convert-spectrum', file, '-o', out], io)).toBe(0);
    for (const ext of ['.csv', '.md', '.json', '.plot.json']) expect(existsSync(out + ext)).toBe(true);
    expect(readFileSync(out + '.csv', 'utf8')).toMatch(/# method: kab /);
    expect(readFileSync(out + '.md', 'utf8')).toMatch(/\| energy \| nu_all \|/);
    const plot = JSON.parse(readFileSync(out + '.plot.json', 'utf8'));
    expect(plot.points).toHaveLength(2);
    const io2 = capture();
    expect(await runCli(['convert-spectrum', file, '-o', out], io2)).toBe(1);
    expect(io2.stderr).toMatch(/exists already/);
    expect(await runCli(['convert-spectrum', file, '-o', out, '--force'], capture())).toBe(0);
  });

  it('--help shows an example', async () => {
    const io = capture();
    expect(await runCli(['convert-spectrum', '--help'], io)).toBe(0);
    expect(io.stdout).toMatch(/Example:\n  skyspan convert-spectrum/);
  });

  it('reverse direction and bad input', async () => {
    const io = capture();
    expect(await runCli(['convert-spectrum', file, '--to', 'gamma', '--method', 'kpi', '--json'], io)).toBe(0);
    const doc = JSON.parse(io.stdout);
    expect(doc.rows[0][0]).toBeCloseTo(2, 10);
    expect(doc.rows[0][1] / 1e-15).toBeCloseTo(1 / 6, 4); // default unit GeV^-1: 1e-12 TeV^-1 = 1e-15 GeV^-1
    const bad = capture();
    expect(await runCli(['convert-spectrum', file, '--unit', 'TeV'], bad)).toBe(1);
    expect(bad.stderr).toMatch(/not an intensity unit/);
    expect(await runCli(['convert-spectrum', file, '--method', 'fancy'], capture())).toBe(2);
  });
});
