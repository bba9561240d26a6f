/**
 * Draws of the gamma-ray intensity measured in region A at chosen energies,
 * from its uncertainty: either tabulated points, each drawn independently
 * from the two-piece log-normal matched to "value -errLow +errHigh"
 * (logNormalPoint.ts: always positive, median = value, 15.87 and 84.13 %
 * points = value - errLow and value + errHigh) and read between points by
 * log-log interpolation, or a fitted spectral model whose internal parameters
 * are drawn from the fit's covariance (multivariate normal, by Cholesky factor:
 * theta = theta0 + L z; common practice, no source). Upper limits carry no
 * sampled value (they enter the proton fit, not the draws). No extrapolation:
 * energies outside the measured points give NaN. A draw that is not finite
 * and positive is a ComputeError naming the point; nothing is dropped.
 */
import { ComputeError, InputError } from '../core/errors.js';
import type { SpectrumPoints } from '../physics/points.js';
import type { SpectrumFit } from '../physics/fit.js';
import { modelFromInternal } from '../physics/fit.js';
import { evaluateSpectrum, type SpectralModel } from '../physics/spectrum.js';
import { cholesky } from './cholesky.js';
import { logNormalWidths, drawLogNormalPoint } from './logNormalPoint.js';
import type { Random } from './random.js';

/** The gamma-ray input: measured points, or a model (optionally with its fit for the uncertainty) over an energy range. */
export type GammaInput =
  | { kind: 'points'; points: SpectrumPoints }
  | { kind: 'model'; model: SpectralModel; fit?: SpectrumFit; energyRangeGeV: [number, number]; source?: string };

/** What the prediction needs from the gamma-ray input. */
export interface GammaSampler {
  /** Energies (GeV) covered: first and last measured point, or the model's stated range. */
  rangeGeV: [number, number];
  /** Central intensity at each energy (NaN outside the range). */
  central(energiesGeV: ArrayLike<number>): Float64Array;
  /** n draws at m energies, row-major out[s * m + j]. */
  sample(energiesGeV: ArrayLike<number>, n: number, rng: Random): Float64Array;
  /** Central values as points (measured points, or the model on a grid), for fits of the spectral shape. */
  centralPoints(): SpectrumPoints;
  /** Free parameters with their centre and one-sigma width, and the function of them, for linear propagation. */
  linear(energyGeV: number): { centre: Float64Array; sigma: Float64Array; covariance?: Float64Array; fn: (x: Float64Array) => number };
  notes: string[];
  source?: string;
}

interface Brackets { lo: Int32Array; w: Float64Array }

/** Log-log brackets of energies among sorted point energies; lo = -1 outside. */
function brackets(lnE: Float64Array, energies: ArrayLike<number>): Brackets {
  const m = energies.length, k = lnE.length;
  const lo = new Int32Array(m).fill(-1), w = new Float64Array(m);
  const tol = 1e-9;
  for (let j = 0; j < m; j++) {
    const x = Math.log(energies[j]);
    if (!(x >= lnE[0] - tol && x <= lnE[k - 1] + tol)) continue;
    let i = 0;
    while (i < k - 2 && x > lnE[i + 1]) i++;
    if (k === 1) { lo[j] = 0; w[j] = 0; continue; }
    lo[j] = i;
    w[j] = Math.min(1, Math.max(0, (x - lnE[i]) / (lnE[i + 1] - lnE[i])));
  }
  return { lo, w };
}

function interp(b: Brackets, j: number, v: ArrayLike<number>): number {
  const i = b.lo[j];
  if (i < 0) return NaN;
  const w = b.w[j];
  const a = v[i];
  if (w === 0) return a > 0 ? a : NaN;
  const c = v[i + 1];
  if (w === 1) return c > 0 ? c : NaN;
  if (!(a > 0 && c > 0)) return NaN;
  return Math.exp((1 - w) * Math.log(a) + w * Math.log(c));
}

function pointsSampler(p: SpectrumPoints): GammaSampler {
  const idx: number[] = [];
  for (let i = 0; i < p.value.length; i++) if (!p.upperLimit[i]) idx.push(i);
  idx.sort((a, b) => p.energyGeV[a] - p.energyGeV[b]);
  if (idx.length === 0) throw new InputError('the gamma-ray points are all upper limits', { file: p.source });
  const k = idx.length;
  const e = Float64Array.from(idx, (i) => p.energyGeV[i]);
  const v = Float64Array.from(idx, (i) => p.value[i]);
  const lo = Float64Array.from(idx, (i) => p.errLow[i]);
  const hi = Float64Array.from(idx, (i) => p.errHigh[i]);
  for (let i = 1; i < k; i++) if (!(e[i] > e[i - 1])) {
    throw new InputError(`two gamma-ray points at the same energy ${e[i]} GeV`, { file: p.source }, 'merge or drop one of them');
  }
  const lnE = e.map(Math.log);
  const w = logNormalWidths(v, lo, hi, e, p.source);
  const notes = ['gamma-ray points drawn independently from two-piece log-normals matched to each point (median = value, 15.87/84.13 % points = value - errLow / value + errHigh); read between points by log-log interpolation; no extrapolation',
    ...w.notes];
  const nUl = p.value.length - k;
  if (nUl > 0) notes.push(`${nUl} gamma-ray upper limit(s) not drawn; they enter the KAB proton fit as one-sided constraints`);
  return {
    rangeGeV: [e[0], e[k - 1]], notes, source: p.source,
    central(energies) {
      const b = brackets(lnE, energies);
      return Float64Array.from({ length: energies.length }, (_, j) => interp(b, j, v));
    },
    sample(energies, n, rng) {
      const m = energies.length, b = brackets(lnE, energies);
      const out = new Float64Array(n * m), draw = new Float64Array(k);
      for (let s = 0; s < n; s++) {
        for (let i = 0; i < k; i++) {
          draw[i] = drawLogNormalPoint(v[i], w.sLow[i], w.sHigh[i], rng);
          if (!(draw[i] > 0 && draw[i] < Infinity)) {
            throw new ComputeError(`gamma-ray point at ${e[i]} GeV (value ${v[i]}, errors -${lo[i]} +${hi[i]}) gave the draw ${draw[i]}`);
          }
        }
        for (let j = 0; j < m; j++) out[s * m + j] = interp(b, j, draw);
      }
      return out;
    },
    centralPoints() {
      return { energyGeV: e.slice(), value: v.slice(), errLow: lo.slice(), errHigh: hi.slice(), upperLimit: new Uint8Array(k), source: p.source };
    },
    linear(energyGeV) {
      const b = brackets(lnE, [energyGeV]);
      return { centre: v.slice(), sigma: Float64Array.from({ length: k }, (_, i) => 0.5 * (lo[i] + hi[i])), fn: (x) => interp(b, 0, x) };
    },
  };
}

function modelSampler(g: Extract<GammaInput, { kind: 'model' }>): GammaSampler {
  const [eLo, eHi] = g.energyRangeGeV;
  if (!(eLo > 0 && eHi > eLo)) throw new InputError(`model energy range ${eLo} to ${eHi} GeV: need 0 < min < max`, { keyPath: 'energyRange' });
  const inRange = (x: number) => x >= eLo * (1 - 1e-9) && x <= eHi * (1 + 1e-9);
  const evalAt = (model: SpectralModel, energies: ArrayLike<number>, out: Float64Array, off: number) => {
    for (let j = 0; j < energies.length; j++) out[off + j] = inRange(energies[j]) ? evaluateSpectrum(model, energies[j]) : NaN;
  };
  const fit = g.fit;
  const p = fit ? fit.internal.theta.length : 0;
  const L = fit ? cholesky(fit.internal.covariance, p) : null;
  if (fit && !L) throw new ComputeError('the spectral fit covariance is not positive definite; its uncertainty cannot be sampled');
  const e0 = 'e0GeV' in g.model ? g.model.e0GeV : 1;
  const notes = [fit ? `gamma-ray model ${g.model.kind} drawn from its fit covariance (multivariate normal in the fit parameters)`
    : `gamma-ray model ${g.model.kind} without uncertainty`, `model used from ${eLo} to ${eHi} GeV only; no extrapolation`];
  return {
    rangeGeV: [eLo, eHi], notes, source: g.source,
    central(energies) { const out = new Float64Array(energies.length); evalAt(g.model, energies, out, 0); return out; },
    sample(energies, n, rng) {
      const m = energies.length, out = new Float64Array(n * m), z = new Float64Array(p), t = new Float64Array(p);
      for (let s = 0; s < n; s++) {
        if (!fit) { evalAt(g.model, energies, out, s * m); continue; }
        for (let i = 0; i < p; i++) z[i] = rng.normal();
        for (let i = 0; i < p; i++) {
          let acc = fit.internal.theta[i];
          for (let c = 0; c <= i; c++) acc += L![i * p + c] * z[c];
          t[i] = acc;
        }
        evalAt(modelFromInternal(g.model.kind, t, e0), energies, out, s * m);
      }
      return out;
    },
    centralPoints() {
      const k = 8, e = new Float64Array(k), v = new Float64Array(k);
      for (let i = 0; i < k; i++) { e[i] = eLo * Math.pow(eHi / eLo, i / (k - 1)); v[i] = evaluateSpectrum(g.model, e[i]); }
      // pseudo-points carry 10 % errors: they only weight a shape fit
      return { energyGeV: e, value: v, errLow: v.map((x) => 0.1 * x), errHigh: v.map((x) => 0.1 * x), upperLimit: new Uint8Array(k), source: g.source };
    },
    linear(energyGeV) {
      if (!fit) return { centre: new Float64Array(0), sigma: new Float64Array(0), fn: () => inRange(energyGeV) ? evaluateSpectrum(g.model, energyGeV) : NaN };
      return { centre: Float64Array.from(fit.internal.theta), sigma: Float64Array.from({ length: p }, (_, i) => Math.sqrt(fit.internal.covariance[i * p + i])),
        covariance: Float64Array.from(fit.internal.covariance),
        fn: (x) => inRange(energyGeV) ? evaluateSpectrum(modelFromInternal(g.model.kind, x, e0), energyGeV) : NaN };
    },
  };
}

/** Builds the sampler of a gamma-ray input (validates it; throws InputError). */
export function gammaSampler(input: GammaInput): GammaSampler {
  return input.kind === 'points' ? pointsSampler(input.points) : modelSampler(input);
}
