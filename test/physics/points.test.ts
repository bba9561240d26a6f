import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { parseSpectrumPoints } from '../../src/physics/points.js';
import { fitSpectrum } from '../../src/physics/fit.js';

// The same invented points in three unit systems: I in TeV^-1 cm^-2 s^-1 sr^-1, in GeV^-1, and E^2 I in erg.
// Conversions are by the unit definitions (1 eV = 1.602176634e-19 J exactly; common practice).
const ERG_GEV = 1e-7 / 1.602176634e-19 / 1e9;
const base = [[10, 2e-12, 3e-13, 4e-13], [30, 1.5e-13, 2e-14, 2e-14], [100, 9e-15, 2e-15, 3e-15], [300, 5e-16, 1.5e-16, 1e-16]];

function csvTeV(): string {
  return '# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err_low,err_high,ul\n'
    + base.map((r) => r.join(',') + ',0').join('\n') + '\n1000,1e-16,,,1\n';
}
function csvGeV(): string {
  const rows = base.map(([e, v, l, h]) => [e * 1000, v / 1000, l / 1000, h / 1000, 0]);
  return 'energy,value,err_low,err_high,ul,energy_unit,value_unit\n'
    + rows.map((r) => r.join(',') + ',GeV,GeV^-1 cm^-2 s^-1 sr^-1').join('\n') + '\n1e6,1e-19,,,1,GeV,GeV^-1 cm^-2 s^-1 sr^-1\n';
}
function csvErg(): string {
  // E^2 I in erg: (E in GeV)^2 * I(GeV^-1) / ERG_GEV
  const conv = (e: number, x: number) => ((e * 1000) ** 2 * (x / 1000)) / ERG_GEV;
  return '# energy_unit: TeV\n# value_unit: erg cm^-2 s^-1 sr^-1\nenergy,value,err_low,err_high,ul\n'
    + base.map(([e, v, l, h]) => [e, conv(e, v), conv(e, l), conv(e, h), 0].join(',')).join('\n')
    + `\n1000,${conv(1000, 1e-16)},,,1\n`;
}

describe('parseSpectrumPoints', () => {
  it('the same points in TeV, GeV and E^2 I in erg give identical points and fits', () => {
    const a = parseSpectrumPoints(csvTeV(), 'a.csv'), b = parseSpectrumPoints(csvGeV(), 'b.csv'), c = parseSpectrumPoints(csvErg(), 'c.csv');
    for (const p of [b, c]) for (let i = 0; i < 5; i++) {
      expect(p.energyGeV[i] / a.energyGeV[i]).toBeCloseTo(1, 12);
      expect(p.value[i] / a.value[i]).toBeCloseTo(1, 12);
      if (i < 4) expect(p.errHigh[i] / a.errHigh[i]).toBeCloseTo(1, 12);
      expect(p.upperLimit[i]).toBe(a.upperLimit[i]);
    }
    expect(Math.abs(a.value[0] / 2e-15 - 1)).toBeLessThan(1e-12);
    const fa = fitSpectrum(a, 'powerLaw'), fc = fitSpectrum(c, 'powerLaw');
    expect(fc.params.index).toBeCloseTo(fa.params.index, 8);
    expect(fc.params.norm / fa.params.norm).toBeCloseTo(1, 8);
    expect(fc.chi2).toBeCloseTo(fa.chi2, 8);
  });
  it('band edges give the geometric mean energy', () => {
    const p = parseSpectrumPoints('# energy_unit: GeV\n# value_unit: GeV^-1 cm^-2 s^-1 sr^-1\ne_min,e_max,value,err\n100,400,1e-9,1e-10\n', 'x');
    expect(p.energyGeV[0]).toBeCloseTo(200, 10);
    expect(p.eMinGeV![0]).toBe(100);
  });
  it('bad rows report the file line', () => {
    const text = '# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err\n1,1e-12,1e-13\n2,abc,1e-13\n';
    expect(() => parseSpectrumPoints(text, 'pts.csv')).toThrow(/pts\.csv, line 5, keyword value/);
    expect(() => parseSpectrumPoints(text.replace('abc', '-1'), 'pts.csv')).toThrow(/line 5/);
    expect(() => parseSpectrumPoints('energy,value,err\n1,1,1\n', 'p.csv')).toThrow(/no energy unit/);
    expect(() => parseSpectrumPoints('# energy_unit: cm\n# value_unit: TeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err\n1,1,1\n', 'p.csv'))
      .toThrow(InputError);
    expect(() => parseSpectrumPoints('# energy_unit: TeV\n# value_unit: TeV^-1 cm^-2 s^-1\nenergy,value,err\n1,1,1\n', 'p.csv'))
      .toThrow(/line 4: "TeV\^-1 cm\^-2 s\^-1" is not an intensity unit/);
  });
});

// Issue 16: a unit with a number in it lost the number (results 1e8 too high), exit 0.
// Expected values from the unit definitions (SI prefixes; common practice, no source).
describe('parseSpectrumPoints with factored units', () => {
  it('"# value_unit: 1e-8 GeV cm^-2 s^-1 sr^-1" and "# energy_unit: 1000 GeV" keep their factors', () => {
    const p = parseSpectrumPoints('# energy_unit: 1000 GeV\n# value_unit: 1e-8 GeV cm^-2 s^-1 sr^-1\nenergy,value,err\n10,4,1\n', 'f.csv');
    // E = 10 x 1000 GeV = 1e4 GeV; E^2 I = 4e-8 GeV cm^-2 s^-1 sr^-1 -> I = 4e-8 / 1e8 = 4e-16 GeV^-1 cm^-2 s^-1 sr^-1
    expect(Math.abs(p.energyGeV[0] / 1e4 - 1)).toBeLessThan(1e-14);
    expect(Math.abs(p.value[0] / 4e-16 - 1)).toBeLessThan(1e-14);
    expect(Math.abs(p.errLow[0] / 1e-16 - 1)).toBeLessThan(1e-14);
  });
  it('refuses a zero factor in one line naming the file and row', () => {
    expect(() => parseSpectrumPoints('# energy_unit: 0 GeV\n# value_unit: GeV^-1 cm^-2 s^-1 sr^-1\nenergy,value,err\n10,4,1\n', 'f.csv'))
      .toThrow(/^f\.csv, line 4: the energy unit "0 GeV" has the factor 0/);
  });
});
