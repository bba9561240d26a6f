/**
 * Luminosity functions: draws by inverse transform and their mean. For a power
 * law dN/dL = A L^-alpha on [L1, L2] the cumulative distribution is
 * (L^(1-alpha) - L1^(1-alpha)) / (L2^(1-alpha) - L1^(1-alpha)) (alpha != 1) or
 * ln(L/L1) / ln(L2/L1) (alpha = 1), inverted in closed form; the mean is
 * int L^(1-alpha) dL / int L^-alpha dL. For log10 L ~ N(mu, s) the mean is
 * 10^mu exp((s ln 10)^2 / 2) (the log-normal mean). Textbook calculus, common
 * knowledge.
 */
import { InputError } from '../core/errors.js';
import type { Random } from '../compare/random.js';
import type { LuminosityFunction } from './model.js';

/** int_{a}^{b} L^p dL, stable near p = -1. */
function powerIntegral(p: number, a: number, b: number): number {
  const q = p + 1;
  if (Math.abs(q) < 1e-12) return Math.log(b / a);
  return (Math.pow(b, q) - Math.pow(a, q)) / q;
}

/** Checks a luminosity function once (InputError naming keyPath). */
export function checkLuminosity(lf: LuminosityFunction, keyPath = 'luminosity'): void {
  if (lf.kind === 'powerLaw') {
    if (!(lf.minErgPerS > 0 && Number.isFinite(lf.minErgPerS))) throw new InputError(`minimum is ${lf.minErgPerS} erg/s, expected > 0`, { keyPath: `${keyPath}.minErgPerS` });
    if (!(lf.maxErgPerS >= lf.minErgPerS && Number.isFinite(lf.maxErgPerS))) throw new InputError(`maximum ${lf.maxErgPerS} erg/s is below the minimum ${lf.minErgPerS}`, { keyPath: `${keyPath}.maxErgPerS` });
    if (!Number.isFinite(lf.alpha)) throw new InputError(`alpha is ${lf.alpha}, expected a finite number`, { keyPath: `${keyPath}.alpha` });
  } else {
    if (!(lf.medianErgPerS > 0 && Number.isFinite(lf.medianErgPerS))) throw new InputError(`median is ${lf.medianErgPerS} erg/s, expected > 0`, { keyPath: `${keyPath}.medianErgPerS` });
    if (!(lf.sigmaDex >= 0 && Number.isFinite(lf.sigmaDex))) throw new InputError(`sigmaDex is ${lf.sigmaDex}, expected >= 0`, { keyPath: `${keyPath}.sigmaDex` });
  }
}

/** Mean luminosity (erg s^-1) of the function (see module comment). */
export function meanLuminosity(lf: LuminosityFunction): number {
  if (lf.kind === 'logNormal') { const s = lf.sigmaDex * Math.LN10; return lf.medianErgPerS * Math.exp(0.5 * s * s); }
  if (lf.maxErgPerS === lf.minErgPerS) return lf.minErgPerS;
  return powerIntegral(1 - lf.alpha, lf.minErgPerS, lf.maxErgPerS) / powerIntegral(-lf.alpha, lf.minErgPerS, lf.maxErgPerS);
}

/** Fills out[0..n) with luminosities (erg s^-1) drawn from the function. */
export function drawLuminosities(lf: LuminosityFunction, rng: Random, out: Float64Array, n = out.length): void {
  if (lf.kind === 'logNormal') {
    const mu = Math.log10(lf.medianErgPerS);
    for (let i = 0; i < n; i++) out[i] = Math.pow(10, mu + lf.sigmaDex * rng.normal());
    return;
  }
  const a = lf.minErgPerS, b = lf.maxErgPerS, q = 1 - lf.alpha;
  if (a === b) { out.fill(a, 0, n); return; }
  if (Math.abs(q) < 1e-12) {
    const lr = Math.log(b / a);
    for (let i = 0; i < n; i++) out[i] = a * Math.exp(lr * rng.uniform());
    return;
  }
  const aq = Math.pow(a, q), bq = Math.pow(b, q), iq = 1 / q;
  for (let i = 0; i < n; i++) out[i] = Math.pow(aq + rng.uniform() * (bq - aq), iq);
}

/** The luminosity function with every luminosity multiplied by k > 0 (L_min and L_max, or the median). */
export function scaleLuminosity(lf: LuminosityFunction, k: number): LuminosityFunction {
  return lf.kind === 'powerLaw' ? { ...lf, minErgPerS: lf.minErgPerS * k, maxErgPerS: lf.maxErgPerS * k } : { ...lf, medianErgPerS: lf.medianErgPerS * k };
}
