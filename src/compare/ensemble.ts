/**
 * The template ensemble as the comparison sees it: per template, the intensity
 * extrapolation factor k_I from the measured region A to the neutrino region,
 * optionally the template's mean gamma-ray survival probability in A (for the
 * de-absorption, intrinsic = measured / survival), and a weight. Each Monte
 * Carlo sample picks one template with probability proportional to its weight,
 * so k_I and survival of one template always go together.
 *
 * Both k_I and the survival may depend on the gamma-ray energy: a template
 * with energy planes has one k_I per plane, and the survival falls with energy
 * above about 100 TeV (pair production on the CMB). Either is given as one
 * number (energy-independent) or as a table over gamma-ray energies
 * ({@link EnergyTable}); {@link ensembleAt} reads the tables at the energies a
 * prediction needs, by log-log interpolation between the tabulated energies
 * (common practice, no source) and never beyond them: an energy outside a
 * table is an InputError naming the template and the table's range.
 */
import { InputError } from '../core/errors.js';
import { quantile } from '../scaling/quantiles.js';
import type { Random } from './random.js';

/** Values at increasing gamma-ray energies (GeV); values > 0. */
export interface EnergyTable { energiesGeV: ArrayLike<number>; values: ArrayLike<number> }

/**
 * One template's numbers: k_I (dimensionless, > 0) as `kI` or `kIByEnergy`
 * (one of the two), the survival probability in (0, 1] as `survivalMean` or
 * `survivalByEnergy` (optional, for all templates or none), weight >= 0 (default 1).
 */
export interface TemplateFactor {
  template: string;
  kI?: number;
  kIByEnergy?: EnergyTable;
  survivalMean?: number;
  survivalByEnergy?: EnergyTable;
  weight?: number;
}

/** A validated table; an empty energy list means one energy-independent value. */
interface Table { lnE: Float64Array; lnV: Float64Array; key: string }

/** Validated ensemble with cumulative weights for sampling. */
export interface Ensemble {
  names: string[];
  kI: Table[];
  survival: Table[];
  hasSurvival: boolean;
  weight: Float64Array;
  cumulative: Float64Array;
  /** True when some k_I or survival is given per energy. */
  energyResolved: boolean;
  file?: string;
}

/** The ensemble read at m gamma-ray energies: per template t and energy j, index t * m + j. */
export interface EnsembleAt {
  energiesGeV: Float64Array;
  kI: Float64Array;
  survival: Float64Array;
  /** Weighted medians over the templates at each energy (scaling/quantiles.ts): the centre when the template is not varied. */
  kICentral: Float64Array;
  survivalCentral: Float64Array;
}

/** Weighted median by the one quantile definition of scaling/quantiles.ts. */
export function ensembleMedian(values: ArrayLike<number>, weights: ArrayLike<number>): number {
  return quantile(values, weights, 0.5);
}

function table(v: number | undefined, t: EnergyTable | undefined, what: string, kp: string, file: string | undefined,
  ok: (x: number) => boolean, expected: string): Table {
  if (t === undefined) {
    if (!(v !== undefined && ok(v))) throw new InputError(`${what} is ${v}, expected ${expected}`, { file, keyPath: kp });
    return { lnE: new Float64Array(0), lnV: Float64Array.of(Math.log(v)), key: kp };
  }
  const n = t.energiesGeV.length, key = `${kp}ByEnergy`;
  if (n === 0 || t.values.length !== n) throw new InputError(`${n} energies and ${t.values.length} values`, { file, keyPath: key }, 'give one value per energy, at least one');
  const lnE = new Float64Array(n), lnV = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const e = t.energiesGeV[i], x = t.values[i];
    if (!(e > 0 && Number.isFinite(e)) || (i > 0 && !(e > t.energiesGeV[i - 1]))) {
      throw new InputError(`energy ${e} GeV at entry ${i}`, { file, keyPath: `${key}.energiesGeV[${i}]` }, 'energies must be finite, > 0 and increasing');
    }
    if (!ok(x)) throw new InputError(`${what} is ${x} at ${e} GeV, expected ${expected}`, { file, keyPath: `${key}.values[${i}]` });
    lnE[i] = Math.log(e); lnV[i] = Math.log(x);
  }
  return { lnE, lnV, key };
}

/** Log-log reading of a table at energyGeV; throws InputError outside the tabulated energies. */
function readTable(t: Table, energyGeV: number, name: string, file?: string): number {
  const n = t.lnE.length;
  if (n === 0) return Math.exp(t.lnV[0]);
  const x = Math.log(energyGeV), tol = 1e-9;
  if (!(x >= t.lnE[0] - tol && x <= t.lnE[n - 1] + tol)) {
    throw new InputError(`template '${name}': no value at ${energyGeV.toPrecision(6)} GeV; the table covers ${Math.exp(t.lnE[0]).toPrecision(6)} to ${Math.exp(t.lnE[n - 1]).toPrecision(6)} GeV`,
      { file, keyPath: t.key }, 'give energy planes that bracket every gamma-ray energy used (no extrapolation beyond the planes)');
  }
  if (n === 1) return Math.exp(t.lnV[0]);
  let i = 0;
  while (i < n - 2 && x > t.lnE[i + 1]) i++;
  const w = Math.min(1, Math.max(0, (x - t.lnE[i]) / (t.lnE[i + 1] - t.lnE[i])));
  return Math.exp((1 - w) * t.lnV[i] + w * t.lnV[i + 1]);
}

/** Checks the factors (throws InputError naming the entry) and prepares sampling. */
export function buildEnsemble(factors: readonly TemplateFactor[], file?: string): Ensemble {
  if (factors.length === 0) throw new InputError('no templates in the factors', { file, keyPath: 'templates' });
  const n = factors.length;
  const hasS = (f: TemplateFactor) => f.survivalMean !== undefined || f.survivalByEnergy !== undefined;
  const withS = factors.filter(hasS).length;
  if (withS !== 0 && withS !== n) {
    throw new InputError(`survival given for ${withS} of ${n} templates`, { file, keyPath: 'templates' }, 'give it for all templates or none');
  }
  const withW = factors.filter((f) => f.weight !== undefined).length;
  if (withW !== 0 && withW !== n) throw new InputError(`weight given for ${withW} of ${n} templates`, { file, keyPath: 'templates' }, 'give it for all or none');
  const e: Ensemble = { names: [], kI: [], survival: [], hasSurvival: withS === n, weight: new Float64Array(n).fill(1),
    cumulative: new Float64Array(n), energyResolved: false, file };
  const seen = new Set<string>();
  factors.forEach((f, i) => {
    const kp = `templates[${i}]`;
    if (typeof f.template !== 'string' || f.template === '') throw new InputError('template name missing', { file, keyPath: `${kp}.name` });
    if (seen.has(f.template)) throw new InputError(`template '${f.template}' appears twice`, { file, keyPath: `${kp}.name` });
    seen.add(f.template);
    if (f.kI !== undefined && f.kIByEnergy !== undefined) throw new InputError('both kI and kIByEnergy given', { file, keyPath: `${kp}.kI` }, 'give one of them');
    if (f.survivalMean !== undefined && f.survivalByEnergy !== undefined) {
      throw new InputError('both survivalMean and survivalByEnergy given', { file, keyPath: `${kp}.survivalMean` }, 'give one of them');
    }
    e.kI.push(table(f.kI, f.kIByEnergy, 'kI', `${kp}.kI`, file, (x) => x > 0 && Number.isFinite(x), 'a finite number > 0'));
    e.survival.push(hasS(f) ? table(f.survivalMean, f.survivalByEnergy, 'survival', `${kp}.survival`, file, (x) => x > 0 && x <= 1, 'a probability in (0, 1]')
      : { lnE: new Float64Array(0), lnV: new Float64Array(1), key: `${kp}.survival` });
    if (f.kIByEnergy !== undefined || f.survivalByEnergy !== undefined) e.energyResolved = true;
    if (f.weight !== undefined && !(f.weight >= 0 && Number.isFinite(f.weight))) {
      throw new InputError(`weight is ${f.weight}, expected a finite number >= 0`, { file, keyPath: `${kp}.weight` });
    }
    e.names.push(f.template);
    if (f.weight !== undefined) e.weight[i] = f.weight;
  });
  let acc = 0;
  for (let i = 0; i < n; i++) { acc += e.weight[i]; e.cumulative[i] = acc; }
  if (!(acc > 0)) throw new InputError('all template weights are zero', { file, keyPath: 'templates' });
  return e;
}

/** Reads every template's k_I and survival at the gamma-ray energies (see the module comment). */
export function ensembleAt(e: Ensemble, energiesGammaGeV: ArrayLike<number>): EnsembleAt {
  const nT = e.names.length, m = energiesGammaGeV.length;
  const out: EnsembleAt = { energiesGeV: Float64Array.from(energiesGammaGeV), kI: new Float64Array(nT * m), survival: new Float64Array(nT * m),
    kICentral: new Float64Array(m), survivalCentral: new Float64Array(m) };
  const colK = new Float64Array(nT), colS = new Float64Array(nT);
  for (let j = 0; j < m; j++) {
    for (let t = 0; t < nT; t++) {
      colK[t] = out.kI[t * m + j] = readTable(e.kI[t], energiesGammaGeV[j], e.names[t], e.file);
      colS[t] = out.survival[t * m + j] = readTable(e.survival[t], energiesGammaGeV[j], e.names[t], e.file);
    }
    out.kICentral[j] = ensembleMedian(colK, e.weight);
    out.survivalCentral[j] = ensembleMedian(colS, e.weight);
  }
  return out;
}

/** The weighted-median survival at each energy, reading the survival tables only (for de-absorbing points before a fit). */
export function centralSurvivalAt(e: Ensemble, energiesGammaGeV: ArrayLike<number>): Float64Array {
  const nT = e.names.length, col = new Float64Array(nT);
  return Float64Array.from(energiesGammaGeV, (x) => {
    for (let t = 0; t < nT; t++) col[t] = readTable(e.survival[t], x, e.names[t], e.file);
    return ensembleMedian(col, e.weight);
  });
}

/** Index of a template drawn with probability proportional to its weight. */
export function drawTemplate(e: Ensemble, rng: Random): number {
  const n = e.cumulative.length;
  const u = rng.uniform() * e.cumulative[n - 1];
  let i = 0;
  while (i < n - 1 && u >= e.cumulative[i]) i++;
  return i;
}
