/**
 * Flux-point tables in the open, community-maintained gamma-ray data-format
 * specification ("Data formats for gamma-ray astronomy", flux points): one
 * row per energy bin, columns `e_ref` (and/or `e_min`, `e_max`), the value in
 * the form the `SED_TYPE` header names — `dnde` (dN/dE) or `e2dnde`
 * (E^2 dN/dE) — with errors `<v>_err` (symmetric) or `<v>_errn` / `<v>_errp`
 * (below / above), an upper limit `<v>_ul` and the flag `is_ul`. Units come
 * from each column's unit. `UL_CONF` (a fraction, e.g. 0.95) gives the
 * confidence level of the upper limits.
 *
 * skyspan reads intensities (per sr): a value unit without sr^-1 is an
 * InputError. Rules where the specification leaves room (skyspan's choices):
 * without `e_ref` the energy is the geometric mean sqrt(e_min e_max) (as for
 * CSV points); without `SED_TYPE` the form is taken from the value column
 * present; without `is_ul` a row is an upper limit when the value is missing
 * (NaN) and `<v>_ul` is given. The format-neutral part lives here; ecsv.ts and
 * fits.ts read and write the files.
 */
import { InputError, type InputLocation } from '../../core/errors.js';
import type { SpectrumPoints } from '../points.js';
import { energyUnitFactor, intensityUnit, type IntensityForm } from '../units.js';
import { fileUnitToMathjs } from './unitText.js';

/** A table as read from a file: numeric columns with their units, and header metadata. */
export interface FluxTable {
  file: string;
  columns: { name: string; unit: string; values: Float64Array }[];
  meta: Record<string, unknown>;
  /** Where row i (0-based) sits in the file, for messages. */
  rowAt: (i: number) => InputLocation;
}

/** SED types skyspan reads and writes. */
export type SedType = 'dnde' | 'e2dnde';

const FORM: Record<SedType, IntensityForm> = { dnde: 'perEnergy', e2dnde: 'energyWeighted' };

function metaValue(meta: Record<string, unknown>, key: string): unknown {
  const k = Object.keys(meta).find((x) => x.toUpperCase() === key);
  return k === undefined ? undefined : meta[k];
}

/** The UL_CONF metadata as a fraction in (0, 1), or undefined when absent. */
export function ulConfidenceOf(meta: Record<string, unknown>, file: string): number | undefined {
  const v = metaValue(meta, 'UL_CONF');
  if (v === undefined || v === null) return undefined;
  if (typeof v !== 'number' || !(v > 0 && v < 1)) {
    throw new InputError(`UL_CONF is ${JSON.stringify(v)}, expected a fraction between 0 and 1 (e.g. 0.95)`, { file, keyword: 'UL_CONF' });
  }
  return v;
}

/** Converts a flux-point table to points in internal units (GeV; GeV^-1 cm^-2 s^-1 sr^-1). */
export function pointsFromTable(t: FluxTable): SpectrumPoints {
  const { file } = t;
  const col = (name: string) => t.columns.find((c) => c.name.toLowerCase() === name);
  const sedRaw = metaValue(t.meta, 'SED_TYPE');
  let sed: SedType;
  if (sedRaw === undefined) {
    if (col('dnde')) sed = 'dnde';
    else if (col('e2dnde')) sed = 'e2dnde';
    else throw new InputError('no SED_TYPE and no dnde or e2dnde column', { file, keyword: 'SED_TYPE' }, `columns found: ${t.columns.map((c) => c.name).join(', ')}`);
  } else if (sedRaw === 'dnde' || sedRaw === 'e2dnde') sed = sedRaw;
  else {
    throw new InputError(`SED_TYPE is ${JSON.stringify(sedRaw)}; skyspan reads dnde and e2dnde`, { file, keyword: 'SED_TYPE' },
      'write the points as dN/dE (dnde) or E^2 dN/dE (e2dnde) per sr');
  }
  const eRef = col('e_ref'), eMin = col('e_min'), eMax = col('e_max');
  if (!eRef && !(eMin && eMax)) throw new InputError('no e_ref column and no e_min/e_max pair', { file, keyword: 'e_ref' });
  const value = col(sed), err = col(`${sed}_err`), errn = col(`${sed}_errn`), errp = col(`${sed}_errp`), ul = col(`${sed}_ul`), isUl = col('is_ul');
  if (!value && !ul) throw new InputError(`SED_TYPE is ${sed} but there is no ${sed} column`, { file, keyword: sed });
  const n = (value ?? ul)!.values.length;
  if (n === 0) throw new InputError('the table has no rows', { file });
  const energyFactor = (c: { name: string; unit: string }) => {
    if (!c.unit) throw new InputError(`column ${c.name} has no unit`, { file, keyword: c.name }, 'give the energy columns a unit such as TeV');
    return energyUnitFactor(fileUnitToMathjs(c.unit), { file, keyword: c.name });
  };
  const valueFactor = (c: { name: string; unit: string } | undefined): number => {
    if (!c) return NaN;
    if (!c.unit) throw new InputError(`column ${c.name} has no unit`, { file, keyword: c.name }, 'give it a unit such as TeV-1 cm-2 s-1 sr-1');
    const u = intensityUnit(fileUnitToMathjs(c.unit), { file, keyword: c.name });
    if (u.form !== FORM[sed]) {
      throw new InputError(`column ${c.name} has unit "${c.unit}", which is not a ${sed === 'dnde' ? 'dN/dE' : 'E^2 dN/dE'} intensity`, { file, keyword: c.name },
        sed === 'dnde' ? 'expected energy^-1 cm^-2 s^-1 sr^-1' : 'expected energy cm^-2 s^-1 sr^-1');
    }
    return u.factor;
  };
  const fRef = eRef ? energyFactor(eRef) : NaN, fMin = eMin ? energyFactor(eMin) : NaN, fMax = eMax ? energyFactor(eMax) : NaN;
  const fV = valueFactor(value), fErr = valueFactor(err), fN = valueFactor(errn), fP = valueFactor(errp), fUl = valueFactor(ul);
  const out: SpectrumPoints = {
    energyGeV: new Float64Array(n), value: new Float64Array(n), errLow: new Float64Array(n), errHigh: new Float64Array(n),
    upperLimit: new Uint8Array(n), source: file,
  };
  if (eMin && eMax) { out.eMinGeV = new Float64Array(n); out.eMaxGeV = new Float64Array(n); }
  const conf = ulConfidenceOf(t.meta, file);
  if (conf !== undefined) out.ulConfidence = conf;
  for (let i = 0; i < n; i++) {
    const at = (keyword: string) => ({ ...t.rowAt(i), keyword });
    const lo = eMin ? eMin.values[i] * fMin : NaN, hi = eMax ? eMax.values[i] * fMax : NaN;
    const refGiven = eRef !== undefined && Number.isFinite(eRef.values[i]);
    if (out.eMinGeV) {
      // a row with e_ref may leave its band edges out (NaN), as CSV points with an energy column do
      if (!(refGiven && Number.isNaN(lo) && Number.isNaN(hi)) && !(lo > 0 && hi > lo)) {
        throw new InputError(`band edges ${lo} to ${hi} GeV: need 0 < e_min < e_max`, at('e_min'));
      }
      out.eMinGeV[i] = lo; out.eMaxGeV![i] = hi;
    }
    const e = refGiven ? eRef!.values[i] * fRef : Math.sqrt(lo * hi);
    if (!(e > 0 && Number.isFinite(e))) throw new InputError(`energy ${e} GeV must be > 0`, at(eRef ? 'e_ref' : 'e_min'));
    const toI = sed === 'dnde' ? 1 : 1 / (e * e);
    const v = value ? value.values[i] : NaN;
    const limit = ul ? ul.values[i] : NaN;
    const flag = isUl ? isUl.values[i] : NaN;
    const isLimit = isUl ? flag === 1 : !Number.isFinite(v) && Number.isFinite(limit);
    out.energyGeV[i] = e;
    if (isLimit) {
      if (!(limit > 0 && Number.isFinite(limit))) {
        throw new InputError(`is_ul is true but ${sed}_ul is ${limit}; expected a limit > 0`, at(ul ? ul.name : `${sed}_ul`), `give ${sed}_ul for upper-limit rows`);
      }
      out.upperLimit[i] = 1;
      out.value[i] = limit * fUl * toI;
      continue;
    }
    if (!(v > 0 && Number.isFinite(v))) {
      throw new InputError(`${sed} is ${v}, expected a finite value > 0 (a fit in log space needs positive values)`, at(sed),
        `mark the row is_ul = true with ${sed}_ul when it is not a detection`);
    }
    let eLo = errn ? errn.values[i] * fN : NaN, eHi = errp ? errp.values[i] * fP : NaN;
    if (Number.isNaN(eLo) && err) eLo = err.values[i] * fErr;
    if (Number.isNaN(eHi) && err) eHi = err.values[i] * fErr;
    if (!(eLo > 0 && Number.isFinite(eLo)) || !(eHi > 0 && Number.isFinite(eHi))) {
      throw new InputError(`errors missing or not > 0 (below ${eLo}, above ${eHi})`, at(errn ? errn.name : err ? err.name : `${sed}_err`),
        `give ${sed}_err, or ${sed}_errn and ${sed}_errp`);
    }
    out.value[i] = v * fV * toI;
    out.errLow[i] = eLo * toI; // each error column's own unit factor is applied above
    out.errHigh[i] = eHi * toI;
  }
  return out;
}

/** Options of {@link tableFromPoints}. */
export interface FluxTableOptions {
  /** SED type to write (default dnde). */
  sedType?: SedType;
  /** Energy unit of the file, a plain unit name such as TeV (default TeV). */
  energyUnit?: string;
  /** Energy unit inside the value's unit (e.g. GeV for GeV cm-2 s-1 sr-1; default energyUnit). */
  valueEnergyUnit?: string;
  /** Extra metadata (strings, numbers, booleans), written after SED_TYPE and UL_CONF. */
  meta?: Record<string, string | number | boolean>;
}

/**
 * Columns and metadata of a flux-point table for `points` (internal units):
 * e_ref, e_min/e_max (when the points have band edges), the value, its
 * errn/errp, the upper limit and is_ul; units written in the FITS form
 * (e.g. "TeV-1 cm-2 s-1 sr-1"), which both FITS and astropy read.
 */
export function tableFromPoints(points: SpectrumPoints, options: FluxTableOptions = {}):
  { columns: { name: string; unit: string; values: Float64Array; bool?: boolean }[]; meta: Record<string, string | number | boolean> } {
  const sed = options.sedType ?? 'dnde';
  const eu = options.energyUnit ?? 'TeV', vu = options.valueEnergyUnit ?? eu;
  for (const [u, key] of [[eu, 'energyUnit'], [vu, 'valueEnergyUnit']]) {
    if (!/^[A-Za-z]+$/.test(u)) throw new InputError(`energy unit "${u}" must be a plain unit name such as GeV or TeV`, { keyPath: key });
  }
  const fE = energyUnitFactor(eu, { keyPath: 'energyUnit' });
  energyUnitFactor(vu, { keyPath: 'valueEnergyUnit' });
  const vUnit = sed === 'dnde' ? `${vu}-1 cm-2 s-1 sr-1` : `${vu} cm-2 s-1 sr-1`;
  const fV = intensityUnit(fileUnitToMathjs(vUnit)).factor;
  const n = points.energyGeV.length;
  const conv = (x: number, e: number) => (sed === 'dnde' ? x / fV : (x * e * e) / fV);
  const make = (f: (i: number) => number) => Float64Array.from({ length: n }, (_, i) => f(i));
  const ul = (i: number) => points.upperLimit[i] === 1;
  const columns: { name: string; unit: string; values: Float64Array; bool?: boolean }[] = [
    { name: 'e_ref', unit: eu, values: make((i) => points.energyGeV[i] / fE) },
  ];
  if (points.eMinGeV && points.eMaxGeV) {
    const lo = points.eMinGeV, hi = points.eMaxGeV;
    columns.push({ name: 'e_min', unit: eu, values: make((i) => lo[i] / fE) }, { name: 'e_max', unit: eu, values: make((i) => hi[i] / fE) });
  }
  const e = points.energyGeV;
  columns.push(
    { name: sed, unit: vUnit, values: make((i) => (ul(i) ? NaN : conv(points.value[i], e[i]))) },
    { name: `${sed}_errn`, unit: vUnit, values: make((i) => (ul(i) ? NaN : conv(points.errLow[i], e[i]))) },
    { name: `${sed}_errp`, unit: vUnit, values: make((i) => (ul(i) ? NaN : conv(points.errHigh[i], e[i]))) },
    { name: `${sed}_ul`, unit: vUnit, values: make((i) => (ul(i) ? conv(points.value[i], e[i]) : NaN)) },
    { name: 'is_ul', unit: '', values: make((i) => (ul(i) ? 1 : 0)), bool: true },
  );
  const meta: Record<string, string | number | boolean> = { SED_TYPE: sed };
  if (points.ulConfidence !== undefined) meta.UL_CONF = points.ulConfidence;
  Object.assign(meta, options.meta ?? {});
  return { columns, meta };
}
