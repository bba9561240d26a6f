import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main.js';
import { tempDir } from '../helpers/tempDir.js';

describe('skyspan expect-gamma', () => {
  it('writes the expected gamma-ray table; K_pi column follows (P / k_I) I_nu,all(E/2) / 6 (Ahlers & Halzen 2018, inverted)', async () => {
    const dir = tempDir('skyspan-expect-');
    const nu = join(dir, 'nu.yaml'), factors = join(dir, 'f.json');
    // invented measurement and factors
    writeFileSync(nu, 'kind: normalisation\nenergyUnit: GeV\nvalueUnit: GeV^-1 cm^-2 s^-1 sr^-1\ne0: 10000\nnorm: 2.0e-15\nerr: 0.5e-15\nindex: 2.5\nenergyRange: [1000, 100000]\n');
    writeFileSync(factors, JSON.stringify({ templates: [{ name: 'a', kI: 2, survivalMean: 0.9 }] }));
    const out: string[] = [];
    const code = await runCli(['expect-gamma', '--neutrino', nu, '--factors', factors, '--samples', '1000', '-o', dir, '--json'],
      { out: (t) => { out.push(t); }, err: () => {} });
    expect(code).toBe(0);
    const doc = JSON.parse(out.join(''));
    const iE = doc.columns.indexOf('energyGeV'), iK = doc.columns.indexOf('methodKpi');
    expect(iK).toBeGreaterThan(0);
    expect(doc.rows.length).toBeGreaterThan(0);
    for (const row of doc.rows) {
      const e = row[iE];
      const expected = (0.9 / 2) * 2e-15 * Math.pow(e / 2 / 1e4, -2.5) / 6;
      expect(row[iK] / expected - 1).toBeLessThan(1e-4); // 5 significant digits in the table
      expect(row[iK] / expected - 1).toBeGreaterThan(-1e-4);
    }
    expect(readFileSync(join(dir, 'expected-gamma.md'), 'utf8')).toMatch(/hadronic/);
    // A sample count that is not an integer is a usage error (exit 2), not NaN samples.
    const err: string[] = [];
    expect(await runCli(['expect-gamma', '--neutrino', nu, '--factors', factors, '--samples', 'many'], { out: () => {}, err: (t) => { err.push(t); } })).toBe(2);
    expect(err.join('')).toMatch(/--samples is 'many', expected an integer/);
  });
});
