/**
 * The common unit strings read without mathjs: a product of known units with
 * integer powers, separated by spaces or `*` ("TeV^-1 cm^-2 s^-1 sr^-1",
 * "erg cm^-2 s^-1 sr^-1", "GeV"). Anything else (fractions, brackets,
 * other units) gives null and is read by mathjs in units.ts, which also
 * words the errors. Factors from the SI prefixes and 1 eV = 1.602176634e-19 J
 * (SI 2019, exact), 1 erg = 1e-7 J.
 */

/** Powers of energy, length, time and solid angle, and the factor to GeV, cm, s, sr. */
export interface SimpleUnit {
  energy: number;
  length: number;
  time: number;
  solidAngle: number;
  factor: number;
}

const EV_J = 1.602176634e-19;
/** Each known unit: its dimension (0 energy, 1 length, 2 time, 3 solid angle) and size in GeV, cm, s or sr. */
const KNOWN: Record<string, [number, number]> = {
  eV: [0, 1e-9], keV: [0, 1e-6], MeV: [0, 1e-3], GeV: [0, 1], TeV: [0, 1e3], PeV: [0, 1e6], EeV: [0, 1e9],
  erg: [0, 1e-7 / EV_J / 1e9], J: [0, 1 / EV_J / 1e9],
  cm: [1, 1], m: [1, 100], km: [1, 1e5],
  s: [2, 1],
  sr: [3, 1],
};
const TOKEN = /^([A-Za-z]+)(?:\^(-?\d+))?$/;

/**
 * Reads `text` (already stripped of photon counts, `**` as `^`) as a product
 * of known units; null when it is not one.
 * @example simpleUnit('TeV^-1 cm^-2 s^-1 sr^-1') // { energy: -1, length: -2, time: -1, solidAngle: -1, factor: 1e-3 }
 */
export function simpleUnit(text: string): SimpleUnit | null {
  const powers = [0, 0, 0, 0];
  let factor = 1;
  const tokens = text.trim().split(/\s*\*\s*|\s+/);
  if (tokens.length === 0 || tokens[0] === '') return null;
  for (const t of tokens) {
    const m = TOKEN.exec(t);
    const known = m ? KNOWN[m[1]] : undefined;
    if (!m || !known) return null;
    const p = m[2] === undefined ? 1 : Number(m[2]);
    powers[known[0]] += p;
    factor *= known[1] ** p;
  }
  return { energy: powers[0], length: powers[1], time: powers[2], solidAngle: powers[3], factor };
}
