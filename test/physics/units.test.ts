import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { energyFromGeV, energyToGeV, energyUnitFactor, intensityFromInternal, intensityToInternal, intensityUnit } from '../../src/physics/units.js';

// Reference: the definitions of the SI prefixes and 1 eV = 1.602176634e-19 J (SI 2019, exact);
// 1 erg = 1e-7 J. Common practice, no source beyond these definitions.
describe('energyToGeV', () => {
  it('converts eV..PeV and erg', () => {
    expect(Math.abs(energyToGeV(1, 'eV') / 1e-9 - 1)).toBeLessThan(1e-12);
    expect(energyToGeV(3, 'TeV')).toBeCloseTo(3000, 9);
    expect(energyToGeV(2, 'PeV')).toBeCloseTo(2e6, 6);
    expect(energyToGeV(1, 'erg') / (1e-7 / 1.602176634e-19 / 1e9)).toBeCloseTo(1, 12);
    expect(energyFromGeV(2e6, 'PeV')).toBeCloseTo(2, 12);
  });
  it('refuses a non-energy unit with an InputError naming the unit', () => {
    expect(() => energyToGeV(1, 'cm')).toThrow(InputError);
    expect(() => energyToGeV(1, 'cm')).toThrow(/"cm" is not an energy unit/);
    expect(() => energyToGeV(1, 'furlongs')).toThrow(InputError);
  });
});

describe('intensityToInternal', () => {
  it('per-energy units scale by the energy factor', () => {
    // 1 TeV^-1 = 1e-3 GeV^-1; 1 m^-2 = 1e-4 cm^-2
    expect(Math.abs(intensityToInternal(1e-12, 'TeV^-1 cm^-2 s^-1 sr^-1', 1000) / 1e-15 - 1)).toBeLessThan(1e-12);
    expect(intensityToInternal(1, 'GeV^-1 m^-2 s^-1 sr^-1', 5) / 1e-4).toBeCloseTo(1, 12);
    expect(intensityToInternal(1, '1/(TeV cm^2 s sr)', 5) / 1e-3).toBeCloseTo(1, 12);
  });
  it('E^2-weighted units are divided by E^2', () => {
    // E^2 I = 1 erg cm^-2 s^-1 sr^-1 at 10 TeV -> I = (1 erg in GeV) / (1e4 GeV)^2
    const ergGeV = 1e-7 / 1.602176634e-19 / 1e9;
    expect(intensityToInternal(1, 'erg cm^-2 s^-1 sr^-1', 1e4) / (ergGeV / 1e8)).toBeCloseTo(1, 12);
    expect(intensityUnit('TeV cm^-2 s^-1 sr^-1').form).toBe('energyWeighted');
  });
  it('round-trips through intensityFromInternal', () => {
    for (const u of ['TeV^-1 cm^-2 s^-1 sr^-1', 'erg cm^-2 s^-1 sr^-1', 'MeV m^-2 s^-1 sr^-1']) {
      const i = intensityToInternal(3.7e-9, u, 12345);
      expect(intensityFromInternal(i, u, 12345) / 3.7e-9).toBeCloseTo(1, 12);
    }
  });
  it('refuses dimensionally wrong units (no sr, an energy, a flux per energy squared)', () => {
    for (const u of ['TeV^-1 cm^-2 s^-1', 'TeV', 'TeV^-2 cm^-2 s^-1 sr^-1']) {
      expect(() => intensityToInternal(1, u, 1)).toThrow(/is not an intensity unit/);
    }
  });
});

// Units with a numeric factor, as published tables write them (issue 16: the factor was dropped, exit 0).
// Expected values from the unit definitions alone: SI prefixes (k = 1e3, G = 1e9, T = 1e12),
// 1 eV = 1.602176634e-19 J (SI 2019, exact), 1 erg = 1e-7 J (CGS definition); so
// 1 erg = 1e-7 / 1.602176634e-19 / 1e9 GeV = 624.150907446 GeV. Common practice, no source beyond these.
describe('units with a numeric factor', () => {
  const rel = (a: number, b: number) => Math.abs(a / b - 1);
  it('1e-8 GeV cm^-2 s^-1 sr^-1 keeps its factor 1e-8 (E^2 I form)', () => {
    const u = intensityUnit('1e-8 GeV cm^-2 s^-1 sr^-1');
    expect(u.form).toBe('energyWeighted');
    expect(rel(u.factor, 1e-8)).toBeLessThan(1e-14);
    // E^2 I = 3 (in units of 1e-8 GeV cm^-2 s^-1 sr^-1) at 100 GeV -> I = 3e-8 / 100^2 GeV^-1 cm^-2 s^-1 sr^-1
    expect(rel(intensityToInternal(3, '1e-8 GeV cm^-2 s^-1 sr^-1', 100), 3e-12)).toBeLessThan(1e-14);
    expect(rel(intensityUnit('10^-8 GeV cm^-2 s^-1 sr^-1').factor, 1e-8)).toBeLessThan(1e-14);
  });
  it('TeV^-1 cm^-2 s^-1 sr^-1 is 1e-3 GeV^-1 cm^-2 s^-1 sr^-1', () => {
    const u = intensityUnit('TeV^-1 cm^-2 s^-1 sr^-1');
    expect(u.form).toBe('perEnergy');
    expect(rel(u.factor, 1e-3)).toBeLessThan(1e-14);
    expect(rel(intensityUnit('1e-12 TeV^-1 cm^-2 s^-1 sr^-1').factor, 1e-15)).toBeLessThan(1e-14);
  });
  it('1000 GeV is 1000 GeV, not 1 GeV', () => {
    expect(rel(energyUnitFactor('1000 GeV'), 1000)).toBeLessThan(1e-15);
    expect(rel(energyToGeV(2.5, '1000 GeV'), 2500)).toBeLessThan(1e-15);
    expect(rel(energyFromGeV(2500, '1000 GeV'), 2.5)).toBeLessThan(1e-15);
  });
  it('erg cm^-2 s^-1 sr^-1 is 624.150907446 GeV cm^-2 s^-1 sr^-1', () => {
    const u = intensityUnit('erg cm^-2 s^-1 sr^-1');
    expect(u.form).toBe('energyWeighted');
    expect(rel(u.factor, 624.150907446)).toBeLessThan(1e-11);
  });
  it('refuses a factor that is not a finite number > 0, in one line naming the unit', () => {
    for (const t of ['0 GeV', '-1 GeV', '1e400 GeV']) {
      expect(() => energyUnitFactor(t, { file: 'p.csv', row: 2 })).toThrow(InputError);
      expect(() => energyUnitFactor(t, { file: 'p.csv', row: 2 })).toThrow(/^p\.csv, row 2: the energy unit ".*" has the factor [^\n]*$/);
    }
    expect(() => intensityUnit('1 2 GeV cm^-2 s^-1 sr^-1')).toThrow(/cannot read the intensity unit/);
  });
});
