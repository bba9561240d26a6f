/**
 * Tabulated spectrum points read from CSV. The format (skyspan's own):
 *
 * ```
 * # energy_unit: TeV
 * # value_unit: erg cm^-2 s^-1 sr^-1
 * energy,value,err_low,err_high,ul
 * 10,2.1e-9,0.3e-9,0.4e-9,0
 * 100,1.0e-9,,,1
 * ```
 * - Lines starting with `#` are comments; `# energy_unit: U` and `# value_unit: U`
 *   set the units for the whole file. Columns `energy_unit` / `value_unit` (or
 *   `unit`) set them per row and win over the header lines.
 * - Energy: column `energy`, or band edges `e_min` and `e_max`; a band is placed
 *   at its geometric mean sqrt(e_min e_max) (common practice, no source).
 * - Value: column `value`, either I (unit energy^-1 cm^-2 s^-1 sr^-1) or E^2 I
 *   (unit energy cm^-2 s^-1 sr^-1); the unit decides. Errors `err` (symmetric)
 *   or `err_low` and `err_high`, absolute, in the value's unit (1 sigma).
 * - `ul` (1/0, true/false, yes/no): the row is an upper limit; `value` is the limit.
 * Bad rows throw InputError with the file's 1-based line number.
 */
import { readInputText } from '../io/inputFile.js';
import { didYouMean } from '../core/didYouMean.js';
import { InputError } from '../core/errors.js';
import { parseCsv } from '../io/csv.js';
import { energyUnitFactor, intensityUnit } from './units.js';

/** Points in internal units: energies GeV, intensities GeV^-1 cm^-2 s^-1 sr^-1. */
export interface SpectrumPoints {
  energyGeV: Float64Array;
  /** I(E) in GeV^-1 cm^-2 s^-1 sr^-1 (the limit for upper limits). */
  value: Float64Array;
  /** 1-sigma errors below and above, same unit as value (0 for upper limits). */
  errLow: Float64Array;
  errHigh: Float64Array;
  /** 1 where the row is an upper limit. */
  upperLimit: Uint8Array;
  /** Band edges in GeV where given (NaN otherwise). */
  eMinGeV?: Float64Array;
  eMaxGeV?: Float64Array;
  /** Where the points came from (file path). */
  source?: string;
  /**
   * One-sided confidence level of the upper limits, a fraction such as 0.95.
   * When absent, fits that use it take 0.95 (DEFAULT_UL_CONFIDENCE in logResiduals.ts).
   */
  ulConfidence?: number;
}

function parseFlag(text: string, file: string, line: number): number {
  const t = text.toLowerCase();
  if (t === '' || t === '0' || t === 'false' || t === 'no') return 0;
  if (t === '1' || t === 'true' || t === 'yes') return 1;
  throw new InputError(`ul is "${text}", expected 1/0, true/false or yes/no`, { file, line, keyword: 'ul' });
}

/** Parses points from CSV text; `file` names the source in error messages. */
export function parseSpectrumPoints(text: string, file = '<text>'): SpectrumPoints {
  let energyUnit: string | undefined, valueUnit: string | undefined;
  for (const raw of text.split(/\r?\n/)) {
    const m = /^\s*#\s*(energy_unit|value_unit)\s*:\s*(.+?)\s*$/i.exec(raw);
    if (m) { if (m[1].toLowerCase() === 'energy_unit') energyUnit = m[2]; else valueUnit = m[2]; }
  }
  const table = parseCsv(text, file);
  const header = table.header.map((h) => h.toLowerCase());
  const rows = table.rows.map((cells, k) => ({ cells, line: table.rowNumbers[k] }));
  const col = (name: string) => header.indexOf(name);
  const iE = col('energy'), iLo = col('e_min'), iHi = col('e_max'), iV = col('value');
  const iErr = col('err'), iEl = col('err_low'), iEh = col('err_high'), iUl = col('ul');
  const iEu = col('energy_unit'), iVu = col('value_unit') >= 0 ? col('value_unit') : col('unit');
  const atHeader = { file, line: table.headerLine };
  const missing = (name: string, what: string) => new InputError(`found no column '${name}' in the header (its columns: ${header.join(', ')}), expected ${what}`,
    atHeader, didYouMean(name, header) || undefined);
  if (iV < 0) throw missing('value', 'the measured values');
  if (iE < 0 && (iLo < 0 || iHi < 0)) {
    throw iLo >= 0 ? missing('e_max', 'e_max beside e_min (or an energy column)') : iHi >= 0 ? missing('e_min', 'e_min beside e_max (or an energy column)')
      : missing('energy', 'an energy column or an e_min, e_max pair');
  }
  // err_low and err_high come as a pair (or err alone).
  if (iEl >= 0 && iEh < 0 && iErr < 0) throw missing('err_high', 'err_high beside err_low (or a symmetric err column)');
  if (iEh >= 0 && iEl < 0 && iErr < 0) throw missing('err_low', 'err_low beside err_high (or a symmetric err column)');
  if (rows.length === 0) throw new InputError('no data rows', { file });
  const n = rows.length;
  const out: SpectrumPoints = {
    energyGeV: new Float64Array(n), value: new Float64Array(n), errLow: new Float64Array(n),
    errHigh: new Float64Array(n), upperLimit: new Uint8Array(n), source: file,
  };
  if (iLo >= 0 && iHi >= 0) { out.eMinGeV = new Float64Array(n).fill(NaN); out.eMaxGeV = new Float64Array(n).fill(NaN); }
  rows.forEach(({ cells, line }, k) => {
    const where = { file, line };
    const num = (i: number, name: string, allowEmpty: boolean): number => {
      const t = i >= 0 ? (cells[i] ?? '') : '';
      if (t === '' && allowEmpty) return NaN;
      const v = Number(t);
      if (t === '' || !Number.isFinite(v)) throw new InputError(`${name} is "${t}", expected a finite number`, { ...where, keyword: name });
      return v;
    };
    const eu = (iEu >= 0 && cells[iEu]) ? cells[iEu] : energyUnit;
    const vu = (iVu >= 0 && cells[iVu]) ? cells[iVu] : valueUnit;
    if (!eu) throw new InputError('no energy unit', where, 'add a line "# energy_unit: TeV" or an energy_unit column');
    if (!vu) throw new InputError('no value unit', where, 'add a line "# value_unit: TeV^-1 cm^-2 s^-1 sr^-1" or a value_unit column');
    const ef = energyUnitFactor(eu, where);
    let e: number;
    if (iE >= 0 && (cells[iE] ?? '') !== '') e = num(iE, 'energy', false) * ef;
    else {
      const lo = num(iLo, 'e_min', false) * ef, hi = num(iHi, 'e_max', false) * ef;
      if (!(lo > 0 && hi > lo)) throw new InputError(`band edges ${lo} to ${hi} GeV: need 0 < e_min < e_max`, where);
      out.eMinGeV![k] = lo; out.eMaxGeV![k] = hi;
      e = Math.sqrt(lo * hi);
    }
    if (!(e > 0)) throw new InputError(`energy ${e} GeV must be > 0`, { ...where, keyword: 'energy' });
    const { form, factor } = intensityUnit(vu, where);
    const toI = form === 'perEnergy' ? factor : factor / (e * e);
    const v = num(iV, 'value', false);
    const ul = iUl >= 0 ? parseFlag(cells[iUl] ?? '', file, line) : 0;
    let lo = num(iEl, 'err_low', true), hi = num(iEh, 'err_high', true);
    const sym = num(iErr, 'err', true);
    if (Number.isNaN(lo)) lo = sym;
    if (Number.isNaN(hi)) hi = sym;
    if (!ul) {
      if (!(v > 0)) throw new InputError(`value ${v} must be > 0 (a fit in log space needs positive values)`, { ...where, keyword: 'value' },
        'give a non-positive measurement as an upper limit (ul = 1)');
      const bad = !(lo > 0) ? (iEl >= 0 ? 'err_low' : 'err') : (iEh >= 0 ? 'err_high' : 'err');
      const t = (iEl >= 0 && bad === 'err_low' ? cells[iEl] : iEh >= 0 && bad === 'err_high' ? cells[iEh] : iErr >= 0 ? cells[iErr] : '') ?? '';
      if (!(lo > 0) || !(hi > 0)) throw new InputError(`${bad} is ${t === '' ? 'empty' : `"${t}"`}, expected an error > 0`, { ...where, keyword: bad },
        iEl < 0 && iEh < 0 && iErr < 0 ? 'add an err column, or err_low and err_high, or mark the row ul = 1' : 'give the error, or mark the row ul = 1');
    } else if (!(v > 0)) throw new InputError(`upper limit ${v} must be > 0`, { ...where, keyword: 'value' });
    out.energyGeV[k] = e; out.value[k] = v * toI; out.upperLimit[k] = ul;
    out.errLow[k] = ul ? 0 : lo * toI; out.errHigh[k] = ul ? 0 : hi * toI;
  });
  return out;
}

/** Reads points from a CSV file (see the module comment for the format). */
export function readSpectrumPoints(path: string): SpectrumPoints {
  return parseSpectrumPoints(readInputText(path), path);
}
