/**
 * Spectral models of a differential intensity I(E) in GeV^-1 cm^-2 s^-1 sr^-1
 * (or any linear quantity per GeV: the models do not care). Forms are the ones
 * in common use in gamma-ray astronomy (common practice, no source):
 * - power law: N (E/E0)^-index
 * - power law with exponential cutoff: N (E/E0)^-index exp(-E/Ec)
 * - log-parabola: N (E/E0)^-(alpha + beta ln(E/E0))  (natural logarithm)
 * - broken power law: N (E/Eb)^-index1 below Eb, N (E/Eb)^-index2 above (continuous at Eb)
 */
import { InputError } from '../core/errors.js';

/** A spectral model; energies in GeV, norm in the intensity unit at e0GeV (breakGeV for the broken law). */
export type SpectralModel =
  | { kind: 'powerLaw'; norm: number; index: number; e0GeV: number }
  | { kind: 'cutoffPowerLaw'; norm: number; index: number; e0GeV: number; cutoffGeV: number }
  | { kind: 'logParabola'; norm: number; alpha: number; beta: number; e0GeV: number }
  | { kind: 'brokenPowerLaw'; norm: number; index1: number; index2: number; breakGeV: number };

/** The kinds of {@link SpectralModel}. */
export type SpectralKind = SpectralModel['kind'];

/** Free parameters of each kind, in the order fits report them (norm is fitted as ln norm). */
export const MODEL_PARAMETERS: Record<SpectralKind, readonly string[]> = {
  powerLaw: ['norm', 'index'],
  cutoffPowerLaw: ['norm', 'index', 'cutoffGeV'],
  logParabola: ['norm', 'alpha', 'beta'],
  brokenPowerLaw: ['norm', 'index1', 'index2', 'breakGeV'],
};

/**
 * Evaluates a model at energyGeV (> 0). Returns the intensity in the model's unit.
 * @example evaluateSpectrum({ kind: 'powerLaw', norm: 2, index: 2, e0GeV: 1000 }, 2000) // 0.5
 */
export function evaluateSpectrum(model: SpectralModel, energyGeV: number): number {
  switch (model.kind) {
    case 'powerLaw':
      return model.norm * Math.pow(energyGeV / model.e0GeV, -model.index);
    case 'cutoffPowerLaw':
      return model.norm * Math.pow(energyGeV / model.e0GeV, -model.index) * Math.exp(-energyGeV / model.cutoffGeV);
    case 'logParabola': {
      const l = Math.log(energyGeV / model.e0GeV);
      return model.norm * Math.exp(-(model.alpha + model.beta * l) * l);
    }
    case 'brokenPowerLaw': {
      const r = energyGeV / model.breakGeV;
      return model.norm * Math.pow(r, -(r < 1 ? model.index1 : model.index2));
    }
  }
}

/** Local logarithmic slope d ln I / d ln E of a model at energyGeV (negative for falling spectra). */
export function spectralSlope(model: SpectralModel, energyGeV: number): number {
  switch (model.kind) {
    case 'powerLaw': return -model.index;
    case 'cutoffPowerLaw': return -model.index - energyGeV / model.cutoffGeV;
    case 'logParabola': return -model.alpha - 2 * model.beta * Math.log(energyGeV / model.e0GeV);
    case 'brokenPowerLaw': return energyGeV < model.breakGeV ? -model.index1 : -model.index2;
  }
}

/** Checks a model read from a user's file; throws InputError naming the key path. */
export function validateSpectrum(model: SpectralModel, keyPath = 'model', file?: string): SpectralModel {
  const bad = (key: string, need: string) => {
    throw new InputError(`${key} must be ${need}`, { file, keyPath: `${keyPath}.${key}` });
  };
  const m = model as unknown as Record<string, unknown>;
  const num = (k: string) => typeof m[k] === 'number' && Number.isFinite(m[k] as number);
  const pos = (k: string) => num(k) && (m[k] as number) > 0;
  if (!pos('norm')) bad('norm', 'a finite number > 0');
  switch (model.kind) {
    case 'powerLaw': if (!num('index')) bad('index', 'finite'); if (!pos('e0GeV')) bad('e0GeV', '> 0'); break;
    case 'cutoffPowerLaw':
      if (!num('index')) bad('index', 'finite'); if (!pos('e0GeV')) bad('e0GeV', '> 0');
      if (!pos('cutoffGeV')) bad('cutoffGeV', '> 0'); break;
    case 'logParabola':
      if (!num('alpha')) bad('alpha', 'finite'); if (!num('beta')) bad('beta', 'finite'); if (!pos('e0GeV')) bad('e0GeV', '> 0'); break;
    case 'brokenPowerLaw':
      if (!num('index1')) bad('index1', 'finite'); if (!num('index2')) bad('index2', 'finite');
      if (!pos('breakGeV')) bad('breakGeV', '> 0'); break;
    default:
      throw new InputError(`unknown spectral kind "${String(m.kind)}"`, { file, keyPath: `${keyPath}.kind` },
        'use powerLaw, cutoffPowerLaw, logParabola or brokenPowerLaw');
  }
  return model;
}
