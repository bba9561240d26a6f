import { describe, expect, it } from 'vitest';
import { fitSpectrum } from '../../src/physics/fit.js';
import { invertMatrix } from '../../src/physics/leastSquares.js';
import type { SpectrumPoints } from '../../src/physics/points.js';
import { evaluateSpectrum, type SpectralModel } from '../../src/physics/spectrum.js';

/** Synthetic points on a model; relative errors rel (log-symmetric: e- = v(1 - 1/(1+rel)), e+ = v rel); optional deterministic shifts in units of sigma. */
function synth(model: SpectralModel, energies: number[], rel: number, shifts: number[] = []): SpectrumPoints {
  const n = energies.length, s = Math.log1p(rel);
  const p: SpectrumPoints = { energyGeV: Float64Array.from(energies), value: new Float64Array(n), errLow: new Float64Array(n),
    errHigh: new Float64Array(n), upperLimit: new Uint8Array(n) };
  energies.forEach((e, i) => {
    const v = evaluateSpectrum(model, e) * Math.exp((shifts[i] ?? 0) * s);
    p.value[i] = v; p.errHigh[i] = v * rel; p.errLow[i] = v * (1 - 1 / (1 + rel));
  });
  return p;
}
const logGrid = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => a * Math.pow(b / a, i / (n - 1)));

describe('fitSpectrum: recovery of known parameters from synthetic points (common practice, no source)', () => {
  it('power law, cutoff power law, log-parabola, broken power law', () => {
    const E = logGrid(100, 1e6, 14);
    const cases: [SpectralModel, Record<string, number>][] = [
      [{ kind: 'powerLaw', norm: 3e-9, index: 2.6, e0GeV: 1e4 }, { index: 2.6 }],
      [{ kind: 'cutoffPowerLaw', norm: 3e-9, index: 2.2, e0GeV: 1e4, cutoffGeV: 2e5 }, { index: 2.2, cutoffGeV: 2e5 }],
      [{ kind: 'logParabola', norm: 3e-9, alpha: 2.4, beta: 0.05, e0GeV: 1e4 }, { alpha: 2.4, beta: 0.05 }],
      [{ kind: 'brokenPowerLaw', norm: 3e-9, index1: 2.3, index2: 3.1, breakGeV: 3e4 }, { index1: 2.3, index2: 3.1, breakGeV: 3e4 }],
    ];
    for (const [m, want] of cases) {
      const f = fitSpectrum(synth(m, E, 0.2), m.kind, m.kind === 'brokenPowerLaw' ? {} : { e0GeV: 1e4 });
      for (const [k, v] of Object.entries(want)) expect(f.params[k] / v).toBeCloseTo(1, 3);
      expect(f.params.norm / m.norm).toBeCloseTo(1, 3);
      expect(f.chi2).toBeLessThan(1e-6);
      expect(f.dof).toBe(E.length - f.names.length);
    }
  });

  it('power-law covariance equals the analytic weighted linear regression (symmetric log errors)', () => {
    // ln I = lnN - index (ln E - ln e0) is linear: cov = (X^T W X)^-1 exactly (Gauss-Markov; common practice)
    const E = logGrid(1e3, 1e5, 8), s = Math.log1p(0.15);
    const pts = synth({ kind: 'powerLaw', norm: 1e-10, index: 2.7, e0GeV: 1e4 }, E, 0.15, [0.5, -1, 0.3, 1.2, -0.4, 0, -0.8, 0.6]);
    const f = fitSpectrum(pts, 'powerLaw', { e0GeV: 1e4 });
    let a = 0, b = 0, c = 0;
    for (const e of E) { const x = -Math.log(e / 1e4); a += 1 / s ** 2; b += x / s ** 2; c += (x * x) / s ** 2; }
    const inv = invertMatrix(Float64Array.from([a, b, b, c]), 2)!;
    // synth() makes the log errors exactly symmetric, so the side switching does not matter here
    const scale = (k: number) => Math.sqrt(inv[(k >> 1) * 3] * inv[(k & 1) * 3]); // sqrt(C_ii C_jj)
    for (let k = 0; k < 4; k++) expect((f.internal.covariance[k] - inv[k]) / scale(k)).toBeCloseTo(0, 4);
    expect(inv[0]).toBeGreaterThan(0);
    // natural covariance: var(norm) = norm^2 var(lnNorm)
    expect(f.covariance[0] / (f.params.norm ** 2 * inv[0])).toBeCloseTo(1, 4);
  });

  it('cutoff power-law covariance matches the inverse of a finite-difference Hessian of chi^2/2', () => {
    const E = logGrid(300, 3e6, 12);
    const m: SpectralModel = { kind: 'cutoffPowerLaw', norm: 2e-11, index: 2.1, e0GeV: 1e4, cutoffGeV: 5e5 };
    const pts = synth(m, E, 0.1, [0.3, -0.2, 0.1, -0.3, 0.2, 0, -0.1, 0.25, -0.15, 0.05, 0.1, -0.2]);
    const f = fitSpectrum(pts, 'cutoffPowerLaw', { e0GeV: 1e4 });
    const t0 = f.internal.theta, p = 3, H = new Float64Array(9);
    const chi2 = (t: number[]) => {
      let s = 0;
      for (let i = 0; i < E.length; i++) {
        const mod = t[0] - t[1] * Math.log(E[i] / 1e4) - E[i] / Math.exp(t[2]);
        const r = mod - Math.log(pts.value[i]);
        const sg = r > 0 ? Math.log1p(pts.errHigh[i] / pts.value[i]) : -Math.log1p(-pts.errLow[i] / pts.value[i]);
        s += (r / sg) ** 2;
      }
      return s;
    };
    const h = 1e-3;
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) {
      const at = (di: number, dj: number) => { const t = Array.from(t0); t[i] += di; t[j] += dj; return chi2(t); };
      H[i * p + j] = 0.5 * (at(h, h) - at(h, -h) - at(-h, h) + at(-h, -h)) / (4 * h * h);
    }
    const cov = invertMatrix(H, p)!;
    for (let k = 0; k < 9; k += 4) expect(f.internal.covariance[k] / cov[k]).toBeCloseTo(1, 1); // diagonal to ~5 percent
  });

  it('chi^2 follows the documented asymmetric rule: the error on the side of the model', () => {
    const pts = synth({ kind: 'powerLaw', norm: 1, index: 2, e0GeV: 1 }, [1, 10, 100, 1000], 0.3, [1, -1, 1, -1]);
    pts.errHigh[0] *= 2; pts.errLow[1] *= 0.5;
    const f = fitSpectrum(pts, 'powerLaw', { e0GeV: 1 });
    let s = 0;
    for (let i = 0; i < 4; i++) {
      const d = Math.log(evaluateSpectrum(f.model, pts.energyGeV[i]) / pts.value[i]);
      const sg = d > 0 ? Math.log1p(pts.errHigh[i] / pts.value[i]) : -Math.log1p(-pts.errLow[i] / pts.value[i]);
      s += (d / sg) ** 2;
    }
    expect(f.chi2).toBeCloseTo(s, 10);
  });

  it('upper limits: above the model they change nothing, below it they pull the fit down', () => {
    const E = logGrid(1e3, 1e5, 6);
    const m: SpectralModel = { kind: 'powerLaw', norm: 1e-10, index: 2.5, e0GeV: 1e4 };
    const base = synth(m, E, 0.2);
    const withUl = (factor: number): SpectrumPoints => {
      const n = E.length + 1, add = (a: Float64Array, v: number) => { const o = new Float64Array(n); o.set(a); o[n - 1] = v; return o; };
      const ul = new Uint8Array(n); ul[n - 1] = 1;
      return { energyGeV: add(base.energyGeV, 1e6), value: add(base.value, evaluateSpectrum(m, 1e6) * factor),
        errLow: add(base.errLow, 0), errHigh: add(base.errHigh, 0), upperLimit: ul };
    };
    const hi = fitSpectrum(withUl(3), 'powerLaw', { e0GeV: 1e4 });
    expect(hi.params.index).toBeCloseTo(2.5, 6);
    expect(hi.dof).toBe(E.length - 2);
    const lo = fitSpectrum(withUl(0.1), 'powerLaw', { e0GeV: 1e4 });
    expect(lo.params.index).toBeGreaterThan(2.55);
    expect(lo.chi2).toBeGreaterThan(1);
    const ign = fitSpectrum(withUl(0.1), 'powerLaw', { e0GeV: 1e4, upperLimits: 'ignore' });
    expect(ign.params.index).toBeCloseTo(2.5, 6);
  });
});
