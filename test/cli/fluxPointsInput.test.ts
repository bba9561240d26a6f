/**
 * Flux-point files (.ecsv, .fits) as gamma-ray input of `compare` and
 * `convert-spectrum`, chosen by extension; the comparison's spectrum written
 * as flux points beside its CSV. Invented points (an E^-2.7 power law).
 */
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { formatFluxPointsEcsv, readFluxPointsEcsv } from '../../src/physics/fluxPoints/ecsv.js';
import { formatFluxPointsFits, readFluxPointsFits } from '../../src/physics/fluxPoints/fits.js';
import { parseSpectrumPoints } from '../../src/physics/points.js';

const CSV = '# invented gamma-ray points\n# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err_low,err_high,ul\n'
  + [1, 3, 10, 30, 100].map((e) => { const v = 1e-12 * Math.pow(e, -2.7); return `${e},${v},${0.1 * v},${0.12 * v},0`; }).join('\n') + '\n';

function io() {
  const out: string[] = [], err: string[] = [];
  return { io: { out: (t: string) => { out.push(t); }, err: (t: string) => { err.push(t); } }, out, err };
}

describe('flux-point input by extension', () => {
  const dir = mkdtempSync(join(tmpdir(), 'skyspan-fpcli-'));
  const csv = join(dir, 'g.csv'), ecsv = join(dir, 'g.ecsv'), fits = join(dir, 'g.fits'), factors = join(dir, 'f.json');
  writeFileSync(csv, CSV);
  const pts = parseSpectrumPoints(CSV, csv);
  writeFileSync(ecsv, formatFluxPointsEcsv(pts, { sedType: 'e2dnde', energyUnit: 'GeV' }));
  writeFileSync(fits, formatFluxPointsFits(pts));
  writeFileSync(factors, JSON.stringify({ templates: [{ name: 'a', kI: 2, survivalMean: 0.9 }, { name: 'b', kI: 3, survivalMean: 0.85 }] }));

  it('compare gives the same prediction from CSV, ECSV and FITS points, and writes the spectrum as flux points', async () => {
    const docs = [];
    for (const [i, g] of [csv, ecsv, fits].entries()) {
      const a = io();
      const out = join(dir, `out${i}`);
      mkdirSync(out);
      expect(await runCli(['compare', '--gamma', g, '--factors', factors, '--e0', '5', '--samples', '2000', '--seed', '4', '-o', out, '--format', 'json'], a.io)).toBe(0);
      docs.push(JSON.parse(readFileSync(join(out, 'comparison.json'), 'utf8')));
      const spec = readFluxPointsEcsv(join(out, 'comparison-spectrum.ecsv'));
      const specFits = readFluxPointsFits(join(out, 'comparison-spectrum.fits'));
      expect(Array.from(specFits.value)).toEqual(Array.from(spec.value));
      const comb = docs[i].components.find((c: { name: string }) => c.name === 'combined').atE0;
      const j = Array.from(spec.energyGeV).findIndex((e) => Math.abs(e / 5000 - 1) < 1e-12);
      // the written median and 16/84 distances are the comparison's own numbers (units through TeV and back)
      expect(Math.abs(spec.value[j] / comb.median - 1)).toBeLessThan(1e-14);
      expect(Math.abs(spec.errLow[j] / (comb.median - comb.p16) - 1)).toBeLessThan(1e-12);
    }
    const c0 = docs[0].components.find((c: { name: string }) => c.name === 'combined').atE0.median;
    for (const d of docs.slice(1)) {
      expect(Math.abs(d.components.find((c: { name: string }) => c.name === 'combined').atE0.median / c0 - 1)).toBeLessThan(1e-12);
    }
  });

  it('convert-spectrum reads a FITS flux-point table; a bad one is one line naming the file', async () => {
    const a = io();
    expect(await runCli(['convert-spectrum', fits, '--method', 'rule', '--json'], a.io)).toBe(0);
    const doc = JSON.parse(a.out.join(''));
    expect(doc.rows.length).toBe(5);
    const bad = join(dir, 'bad.ecsv');
    writeFileSync(bad, formatFluxPointsEcsv(pts).replace('SED_TYPE: dnde', 'SED_TYPE: likelihood'));
    const b = io();
    expect(await runCli(['convert-spectrum', bad], b.io)).toBe(1);
    expect(b.err.join('').trim().split('\n')).toHaveLength(1);
    expect(b.err.join('')).toMatch(/bad\.ecsv, keyword SED_TYPE/);
  });
});
