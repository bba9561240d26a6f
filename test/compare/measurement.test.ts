import { describe, expect, it } from 'vitest';
import { parseMeasurement } from '../../src/compare/measurement.js';
import { parseFactors } from '../../src/compare/factorsFile.js';

const base = { energyUnit: 'TeV', valueUnit: 'GeV^-1 cm^-2 s^-1 sr^-1' };

describe('neutrino measurement format', () => {
  it('reads a normalisation and converts units (1 TeV = 1000 GeV; E^2 I divided by E^2)', () => {
    const m = parseMeasurement({ kind: 'normalisation', ...base, e0: 100, norm: 2e-18, errLow: 5e-19, errHigh: 7e-19, index: 2.7 });
    expect(m.kind).toBe('normalisation');
    if (m.kind !== 'normalisation') return;
    expect(m.e0GeV).toBe(1e5);
    expect(m.norm).toEqual({ value: 2e-18, errLow: 5e-19, errHigh: 7e-19 });
    expect(m.flavour).toBe('all');
    const w = parseMeasurement({ kind: 'normalisation', energyUnit: 'TeV', valueUnit: 'GeV cm^-2 s^-1 sr^-1', e0: 100, norm: 2e-8, err: 1e-8, index: 2.5, flavour: 'mu' });
    if (w.kind !== 'normalisation') throw new Error('kind');
    expect(Math.abs(w.norm.value / (2e-8 / 1e10) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(w.norm.errHigh / 1e-18 - 1)).toBeLessThan(1e-12);
    expect(w.flavour).toBe('mu');
  });

  it('reads points and a band', () => {
    const p = parseMeasurement({ kind: 'points', ...base, points: [{ energy: 10, value: 1e-16, err: 2e-17 }, { energy: 100, value: 1e-18, ul: true }] });
    if (p.kind !== 'points') throw new Error('kind');
    expect(p.points[1]).toEqual({ energyGeV: 1e5, value: 1e-18, errLow: 0, errHigh: 0, upperLimit: true });
    const b = parseMeasurement({ kind: 'band', ...base, e0: 50, norm: 1e-17, err: 2e-18, indexRange: [2.4, 2.8], energyRange: [10, 1000] });
    if (b.kind !== 'band') throw new Error('kind');
    expect(b.energyRangeGeV).toEqual([1e4, 1e6]);
  });

  it('bad input: one line with the key path', () => {
    expect(() => parseMeasurement({ kind: 'normalisation', ...base, e0: -1, norm: 1, err: 1, index: 2 }, 'nu.yaml')).toThrow(/^nu\.yaml, key e0: /);
    expect(() => parseMeasurement({ kind: 'points', ...base, points: [{ energy: 1, value: 'x', err: 1 }] }, 'nu.yaml')).toThrow(/key points\[0\]\.value/);
    expect(() => parseMeasurement({ kind: 'normalisation', ...base, e0: 1, norm: 1, index: 2 }, 'nu.yaml')).toThrow(/errors missing/);
    expect(() => parseMeasurement({ kind: 'normalisation', ...base, valueUnit: 'cm^-2 s^-1', e0: 1, norm: 1, err: 1, index: 2 }, 'nu.yaml')).toThrow(/not an intensity unit/);
    expect(() => parseMeasurement({ kind: 'normalisation', ...base, e0: 1, norm: 1, err: 1, index: 2, colour: 'red' }, 'nu.yaml')).toThrow(/nu\.yaml/);
    expect(() => parseMeasurement({ kind: 'spectrum' }, 'nu.yaml')).toThrow(/key kind/);
  });
});

describe('factors input', () => {
  it('short form and the factors table form', () => {
    expect(parseFactors({ templates: [{ name: 'a', kI: 2 }] }).factors).toEqual([{ template: 'a', kI: 2, kIByEnergy: undefined, survivalMean: undefined, survivalByEnergy: undefined, weight: undefined }]);
    const rows = [
      { template: 'a', plane: 0, energyGeV: 1000, target: 'sky', kI: 2 }, { template: 'a', plane: 1, energyGeV: 10000, target: 'sky', kI: 2.2 },
      { template: 'b', plane: 0, energyGeV: 1000, target: 'sky', kI: 3 }, { template: 'b', plane: 1, energyGeV: 10000, target: 'sky', kI: 3.3 },
    ];
    // planes with energies become per-energy tables of k_I (read log-log by compare/ensemble.ts)
    const f = parseFactors({ rows }, 'f.json');
    expect(f.factors).toEqual([{ template: 'a', kIByEnergy: { energiesGeV: [1000, 10000], values: [2, 2.2] } },
      { template: 'b', kIByEnergy: { energiesGeV: [1000, 10000], values: [3, 3.3] } }]);
    expect(() => parseFactors({ rows: [...rows, { ...rows[0], target: 'band' }] }, 'f.json')).toThrow(/2 targets/);
    expect(() => parseFactors({ templates: [{ name: 'a', k: 2 }] }, 'f.json')).toThrow(/f\.json, key templates\[0\]\.k/);
  });
});
