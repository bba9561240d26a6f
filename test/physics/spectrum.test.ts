import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { evaluateSpectrum, spectralSlope, validateSpectrum, type SpectralModel } from '../../src/physics/spectrum.js';

// The model forms are common practice, no source; the checks are identities of those forms.
describe('evaluateSpectrum', () => {
  it('power law: value at e0 is norm, halves correctly', () => {
    const m: SpectralModel = { kind: 'powerLaw', norm: 2, index: 2, e0GeV: 1000 };
    expect(evaluateSpectrum(m, 1000)).toBe(2);
    expect(evaluateSpectrum(m, 2000)).toBeCloseTo(0.5, 14);
  });
  it('cutoff power law equals the power law times exp(-E/Ec)', () => {
    const m: SpectralModel = { kind: 'cutoffPowerLaw', norm: 1, index: 2.5, e0GeV: 10, cutoffGeV: 300 };
    expect(evaluateSpectrum(m, 300)).toBeCloseTo(Math.pow(30, -2.5) * Math.exp(-1), 14);
  });
  it('log-parabola with beta = 0 is a power law; broken law is continuous at the break', () => {
    const lp: SpectralModel = { kind: 'logParabola', norm: 3, alpha: 2.2, beta: 0, e0GeV: 50 };
    expect(evaluateSpectrum(lp, 500)).toBeCloseTo(3 * Math.pow(10, -2.2), 14);
    const b: SpectralModel = { kind: 'brokenPowerLaw', norm: 1, index1: 2, index2: 3, breakGeV: 100 };
    expect(evaluateSpectrum(b, 100 * (1 - 1e-12))).toBeCloseTo(evaluateSpectrum(b, 100), 9);
    expect(evaluateSpectrum(b, 1000)).toBeCloseTo(1e-3, 14);
  });
  it('spectralSlope matches a numerical log derivative for every kind', () => {
    const models: SpectralModel[] = [
      { kind: 'powerLaw', norm: 1, index: 2.1, e0GeV: 1 },
      { kind: 'cutoffPowerLaw', norm: 1, index: 2.1, e0GeV: 1, cutoffGeV: 40 },
      { kind: 'logParabola', norm: 1, alpha: 2.1, beta: 0.13, e0GeV: 3 },
      { kind: 'brokenPowerLaw', norm: 1, index1: 2, index2: 2.7, breakGeV: 3 },
    ];
    for (const m of models) {
      const e = 17, h = 1e-6;
      const d = (Math.log(evaluateSpectrum(m, e * Math.exp(h))) - Math.log(evaluateSpectrum(m, e * Math.exp(-h)))) / (2 * h);
      expect(spectralSlope(m, e)).toBeCloseTo(d, 6);
    }
  });
  it('validateSpectrum names the bad key', () => {
    expect(() => validateSpectrum({ kind: 'powerLaw', norm: -1, index: 2, e0GeV: 1 }, 'gamma', 'f.yaml')).toThrow(/gamma\.norm/);
    expect(() => validateSpectrum({ kind: 'cutoffPowerLaw', norm: 1, index: 2, e0GeV: 1, cutoffGeV: NaN })).toThrow(InputError);
  });
});
