/**
 * Physical units at the edges: energies and intensities as users write them
 * ("TeV", "erg", "TeV^-1 cm^-2 s^-1 sr^-1", "erg cm^-2 s^-1 sr^-1") converted
 * to skyspan's internal units, GeV and GeV^-1 cm^-2 s^-1 sr^-1. Parsing and
 * dimensional analysis go through mathjs, on a private instance that knows the
 * steradian as its own base dimension (mathjs has none). A "ph"/"photons" token
 * (as in "ph cm^-2 s^-1 sr^-1 TeV^-1") is a count and is dropped; "**" reads as "^".
 * The common units (simpleUnits.ts) are read without mathjs, which is loaded
 * only for other unit strings and for the errors.
 * A leading numeric factor is part of the unit: "1e-8 GeV cm^-2 s^-1 sr^-1" is 1e-8 of
 * GeV cm^-2 s^-1 sr^-1 and "1000 GeV" is 1000 GeV ("10^-8" and "3x10^-8" read as 1e-8, 3e-8).
 */
import type { MathJsInstance, Unit } from 'mathjs';
import { InputError, type InputLocation } from '../core/errors.js';
import { lazyRequire } from '../core/lazyRequire.js';
import { simpleUnit } from './simpleUnits.js';

const mathjs = lazyRequire<typeof import('mathjs')>('mathjs');

/** The private mathjs instance and reference units, made at the first unit read (mathjs loads then). */
let units: { math: MathJsInstance; GEV: Unit; PER_ENERGY: Unit; ENERGY_WEIGHTED: Unit } | undefined;
function unitSystem(): NonNullable<typeof units> {
  if (units) return units;
  const { all, create } = mathjs();
  const math = create(all, {});
  math.createUnit('sr', { aliases: ['steradian', 'steradians'] });
  // mathjs defines the electronvolt as 1.602176565e-19 J (CODATA 2010), 4e-8 off the exact SI 2019 value;
  // redefine it (with its prefixes keV..PeV) so that erg and eV convert exactly.
  math.createUnit({ eV: { definition: '1.602176634e-19 J', prefixes: 'short', aliases: ['electronvolt', 'electronvolts'] } },
    { override: true });
  units = { math, GEV: math.unit(1, 'GeV'), PER_ENERGY: math.unit(1, 'GeV^-1 cm^-2 s^-1 sr^-1'), ENERGY_WEIGHTED: math.unit(1, 'GeV cm^-2 s^-1 sr^-1') };
  return units;
}

/** Which form an intensity unit has: per energy (I) or energy-squared weighted (E^2 I). */
export type IntensityForm = 'perEnergy' | 'energyWeighted';

/** The unit text as read: photon counts dropped, `**` as `^`. */
const cleaned = (unitText: string): string => unitText.trim().replace(/\bph(otons?)?\b\s*/g, '').replace(/\*\*/g, '^');

/** A simple unit (simpleUnits.ts) of exactly these powers of energy, length, time and sr, or null. */
function simpleOf(unitText: string, energy: number, length: number, time: number, solidAngle: number): number | null {
  const u = simpleUnit(cleaned(unitText));
  return u && u.energy === energy && u.length === length && u.time === time && u.solidAngle === solidAngle ? u.factor : null;
}

/**
 * Parses a unit string, keeping a leading numeric factor ("1e-8 GeV cm^-2 s^-1 sr^-1",
 * "1000 GeV", "10^-8 TeV^-1 cm^-2 s^-1 sr^-1"): mathjs reads "<number> <unit>" as a
 * quantity, which is what such a unit means. A factor that is not finite and > 0 is refused.
 */
function parse(unitText: string, where: InputLocation, what: string): Unit {
  const text = cleaned(unitText)
    .replace(/^(?:([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*[x*\u00d7]\s*)?10\^\(?([+-]?\d+)\)?/, (_m, a, n) => `${a ?? 1}e${n}`);
  const { math } = unitSystem();
  let u: Unit;
  try {
    u = math.unit(text === '' ? '1' : text) as Unit;
  } catch (e) {
    throw new InputError(`cannot read the ${what} unit "${unitText}": ${(e as Error).message}`, where,
      'write units like TeV, 1e-8 GeV cm^-2 s^-1 sr^-1, TeV^-1 cm^-2 s^-1 sr^-1 or erg cm^-2 s^-1 sr^-1');
  }
  const factor = u.value === null ? 1 : (u.toJSON() as { value: number }).value;
  if (!(Number.isFinite(factor) && factor > 0)) {
    throw new InputError(`the ${what} unit "${unitText}" has the factor ${factor}, expected a finite number > 0`, where,
      'write the factor as a plain number before the unit, e.g. 1e-8 GeV cm^-2 s^-1 sr^-1');
  }
  return u.value === null ? math.unit(1, text === '' ? '1' : text) as Unit : u;
}

/** Factor that turns one `unitText` of energy into GeV; throws InputError unless it is an energy. */
export function energyUnitFactor(unitText: string, where: InputLocation = {}): number {
  const simple = simpleOf(unitText, 1, 0, 0, 0);
  if (simple !== null) return simple;
  const u = parse(unitText, where, 'energy');
  if (!u.equalBase(unitSystem().GEV)) {
    throw new InputError(`"${unitText}" is not an energy unit`, where, 'use eV, keV, MeV, GeV, TeV, PeV or erg');
  }
  return u.toNumber('GeV');
}

/**
 * Converts an energy to GeV. Accepts any mathjs energy unit (eV to PeV, erg, J).
 * @example energyToGeV(2, 'TeV') // 2000
 */
export function energyToGeV(value: number, unit: string, where: InputLocation = {}): number {
  return value * energyUnitFactor(unit, where);
}

/**
 * Reads an intensity unit: its form and the factor to internal units of that form
 * (GeV^-1 cm^-2 s^-1 sr^-1 for I, GeV cm^-2 s^-1 sr^-1 for E^2 I). A unit of any
 * other dimension (a flux without sr, a bare energy) is an InputError.
 */
export function intensityUnit(unitText: string, where: InputLocation = {}): { form: IntensityForm; factor: number } {
  const perEnergy = simpleOf(unitText, -1, -2, -1, -1);
  if (perEnergy !== null) return { form: 'perEnergy', factor: perEnergy };
  const energyWeighted = simpleOf(unitText, 1, -2, -1, -1);
  if (energyWeighted !== null) return { form: 'energyWeighted', factor: energyWeighted };
  const u = parse(unitText, where, 'intensity');
  if (u.equalBase(unitSystem().PER_ENERGY)) return { form: 'perEnergy', factor: u.toNumber('GeV^-1 cm^-2 s^-1 sr^-1') };
  if (u.equalBase(unitSystem().ENERGY_WEIGHTED)) return { form: 'energyWeighted', factor: u.toNumber('GeV cm^-2 s^-1 sr^-1') };
  throw new InputError(`"${unitText}" is not an intensity unit`, where,
    'expected energy^-1 area^-1 time^-1 sr^-1 (I) or energy area^-1 time^-1 sr^-1 (E^2 I), e.g. TeV^-1 cm^-2 s^-1 sr^-1');
}

/**
 * Converts an intensity value to GeV^-1 cm^-2 s^-1 sr^-1. For an E^2-weighted unit
 * the value is divided by energyGeV^2 (the energy at which it was given, in GeV).
 * @example intensityToInternal(1e-12, 'TeV^-1 cm^-2 s^-1 sr^-1', 1000) // 1e-15
 */
export function intensityToInternal(value: number, unit: string, energyGeV: number, where: InputLocation = {}): number {
  const { form, factor } = intensityUnit(unit, where);
  return form === 'perEnergy' ? value * factor : (value * factor) / (energyGeV * energyGeV);
}

/** Converts an internal intensity (GeV^-1 cm^-2 s^-1 sr^-1) to `unit` at energyGeV (inverse of {@link intensityToInternal}). */
export function intensityFromInternal(valueInternal: number, unit: string, energyGeV: number): number {
  const { form, factor } = intensityUnit(unit);
  return form === 'perEnergy' ? valueInternal / factor : (valueInternal * energyGeV * energyGeV) / factor;
}

/** Converts an energy in GeV to `unit`. */
export function energyFromGeV(energyGeV: number, unit: string): number {
  return energyGeV / energyUnitFactor(unit);
}
