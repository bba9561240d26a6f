import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main.js';
import { tempDir } from '../helpers/tempDir.js';

// Invented scenario: a power-law gamma-ray spectrum of index 2.7 measured in region A,
// three invented templates, an invented neutrino normalisation.
function fixtures(): { dir: string; gamma: string; factors: string; nu: string; nuPoints: string } {
  const dir = tempDir('skyspan-compare-');
  const gamma = join(dir, 'gamma.csv'), factors = join(dir, 'factors.json'), nu = join(dir, 'nu.yaml'), nuPoints = join(dir, 'nu-points.yaml');
  const rows = [1, 3, 10, 30, 100].map((eTeV) => {
    const v = 1e-12 * Math.pow(eTeV, -2.7); // TeV^-1 cm^-2 s^-1 sr^-1 (invented)
    return `${eTeV},${v},${0.1 * v},${0.12 * v},0`;
  });
  writeFileSync(gamma, '# invented gamma-ray points\n# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err_low,err_high,ul\n' + rows.join('\n') + '\n');
  writeFileSync(factors, JSON.stringify({ templates: [{ name: 'a', kI: 2, survivalMean: 0.9 }, { name: 'b', kI: 3, survivalMean: 0.85 }, { name: 'c', kI: 2.5, survivalMean: 0.95 }] }));
  writeFileSync(nu, '# invented neutrino measurement\nkind: normalisation\nflavour: all\nenergyUnit: TeV\nvalueUnit: TeV^-1 cm^-2 s^-1 sr^-1\ne0: 5\nnorm: 5.0e-14\nerrLow: 1.5e-14\nerrHigh: 2.0e-14\nindex: 2.7\nenergyRange: [1, 40]\n');
  writeFileSync(nuPoints, '# invented neutrino points\nkind: points\nflavour: mu\nenergyUnit: TeV\nvalueUnit: TeV^-1 cm^-2 s^-1 sr^-1\npoints:\n  - { energy: 1.5, value: 4e-13, err: 1.5e-13 }\n  - { energy: 15, value: 1e-15, err: 5e-16 }\n  - { energy: 50, value: 1e-16, ul: true }\n');
  return { dir, gamma, factors, nu, nuPoints };
}

function io() {
  const out: string[] = [], err: string[] = [];
  return { io: { out: (t: string) => { out.push(t); }, err: (t: string) => { err.push(t); } }, out, err };
}

describe('skyspan compare', () => {
  it('writes tables and plot data; same seed, same numbers', async () => {
    const f = fixtures();
    const a = io();
    const args = ['compare', '--gamma', f.gamma, '--factors', f.factors, '--neutrino', f.nu, '--samples', '4000', '--seed', '3', '-o', f.dir];
    expect(await runCli(args, a.io)).toBe(0);
    expect(a.out.join('')).toMatch(/tension/);
    for (const n of ['comparison.csv', 'comparison-spectrum.csv', 'comparison.md', 'comparison.json', 'comparison-plot.json']) expect(existsSync(join(f.dir, n))).toBe(true);
    const doc = JSON.parse(readFileSync(join(f.dir, 'comparison.json'), 'utf8'));
    expect(doc.assumptions.join(' ')).toMatch(/hadronic/);
    expect(doc.components.map((c: { name: string }) => c.name)).toEqual(['gamma', 'template', 'absorption', 'method', 'combined']);
    const plot = JSON.parse(readFileSync(join(f.dir, 'comparison-plot.json'), 'utf8'));
    expect(plot.predicted.combined.p50.length).toBe(plot.energiesGeV.length);
    expect(plot.measured.kind).toBe('normalisation');
    // existing outputs are refused without --force, replaced with it, and give the same numbers
    const b = io();
    expect(await runCli(args, b.io)).toBe(1);
    expect(b.err.join('')).toMatch(/exists already/);
    expect(await runCli([...args, '--force'], io().io)).toBe(0);
    const doc2 = JSON.parse(readFileSync(join(f.dir, 'comparison.json'), 'utf8'));
    expect(doc2.reference).toEqual(doc.reference);
  });

  it('chi2 over points, per flavour, --json', async () => {
    const f = fixtures();
    const a = io();
    expect(await runCli(['compare', '--gamma', f.gamma, '--factors', f.factors, '--neutrino', f.nuPoints, '--samples', '2000', '--methods', 'kpi', '--json'], a.io)).toBe(0);
    const doc = JSON.parse(a.out.join(''));
    expect(doc.points.dof).toBe(2);
    expect(doc.points.chi2).toBeGreaterThan(0);
    expect(doc.points.rows[2].upperLimit).toBe(true);
  });

  it('bad input gives one line and exit 1; bad options exit 2', async () => {
    const f = fixtures();
    writeFileSync(f.nu, 'kind: normalisation\nenergyUnit: TeV\nvalueUnit: TeV^-1 cm^-2 s^-1 sr^-1\ne0: 5\nnorm: -1\nerr: 1\nindex: 2\n');
    const a = io();
    expect(await runCli(['compare', '--gamma', f.gamma, '--factors', f.factors, '--neutrino', f.nu], a.io)).toBe(1);
    expect(a.err.join('')).toMatch(/nu\.yaml, key norm: /);
    expect(a.err.join('').trim().split('\n').length).toBe(1);
    expect(await runCli(['compare', '--gamma', f.gamma, '--factors', f.factors, '--methods', 'magic'], io().io)).toBe(2);
  });
});
