import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { energyFromGeV, energyToGeV, intensityFromInternal, intensityToInternal, intensityUnit } from '../../src/physics/units.js';

// Reference: the definitions of the SI prefixes and 1 eV = 1.602176634e-19 J (SI 2019, exact);
// 1 erg = 1e-7 J. Common practice, no source beyond these definitions.
describe('energyToGeV', () => {
  it('converts eV..PeV and erg', () => {
    expect(energyToGeV(1, 'eV')).toBeCloseTo(1e-9, 20);
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
    expect(intensityToInternal(1e-12, 'TeV^-1 cm^-2 s^-1 sr^-1', 1000)).toBeCloseTo(1e-15, 28);
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
