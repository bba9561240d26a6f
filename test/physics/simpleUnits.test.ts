/**
 * The units read without mathjs (src/physics/simpleUnits.ts) against mathjs's
 * own unit conversion (mathjs 15, a general-purpose library; eV redefined to
 * the exact SI 2019 value 1.602176634e-19 J as src/physics/units.ts does), and
 * the fall-back to mathjs for everything else.
 */
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { simpleUnit } from '../../src/physics/simpleUnits.js';
import { energyUnitFactor, intensityUnit } from '../../src/physics/units.js';

const math = create(all, {});
math.createUnit('sr', { aliases: ['steradian', 'steradians'] });
math.createUnit({ eV: { definition: '1.602176634e-19 J', prefixes: 'short' } }, { override: true });

const ENERGY = ['eV', 'keV', 'MeV', 'GeV', 'TeV', 'PeV', 'EeV', 'erg', 'J'];
const PER_ENERGY = ['TeV^-1 cm^-2 s^-1 sr^-1', 'GeV^-1 m^-2 s^-1 sr^-1', 'sr^-1 s^-1 cm^-2 MeV^-1', 'erg^-1 km^-2 s^-1 sr^-1', 'PeV^-1 * cm^-2 * s^-1 * sr^-1'];
const WEIGHTED = ['erg cm^-2 s^-1 sr^-1', 'TeV cm^-2 s^-1 sr^-1', 'GeV m^-2 s^-1 sr^-1', 'J m^-2 s^-1 sr^-1', 'eV cm^-2 s^-1 sr^-1'];

describe('simpleUnit against mathjs', () => {
  it.each(ENERGY)('energy %s: same factor to GeV (1e-14 relative)', (u) => {
    const s = simpleUnit(u)!;
    expect(s).toMatchObject({ energy: 1, length: 0, time: 0, solidAngle: 0 });
    expect(Math.abs(s.factor / math.unit(1, u).toNumber('GeV') - 1)).toBeLessThan(1e-14);
    expect(energyUnitFactor(u)).toBe(s.factor);
  });
  it.each(PER_ENERGY)('intensity %s: same factor to GeV^-1 cm^-2 s^-1 sr^-1 (1e-14 relative)', (u) => {
    const ref = math.unit(1, u.replace(/\s*\*\s*/g, ' ')).toNumber('GeV^-1 cm^-2 s^-1 sr^-1');
    expect(intensityUnit(u).form).toBe('perEnergy');
    expect(Math.abs(intensityUnit(u).factor / ref - 1)).toBeLessThan(1e-14);
  });
  it.each(WEIGHTED)('E^2 intensity %s: same factor to GeV cm^-2 s^-1 sr^-1 (1e-14 relative)', (u) => {
    const ref = math.unit(1, u).toNumber('GeV cm^-2 s^-1 sr^-1');
    expect(intensityUnit(u).form).toBe('energyWeighted');
    expect(Math.abs(intensityUnit(u).factor / ref - 1)).toBeLessThan(1e-14);
  });
  it('gives null for what it does not read (mathjs reads those)', () => {
    for (const u of ['1/(TeV cm^2 s sr)', 'furlongs', '', 'TeV^-1.5', 'TeV^ -1', 'tev']) expect(simpleUnit(u)).toBeNull();
    expect(Math.abs(intensityUnit('1/(TeV cm^2 s sr)').factor / 1e-3 - 1)).toBeLessThan(1e-14);
  });
});
