import { describe, expect, it } from 'vitest';
import { breitWheelerPhi, breitWheelerRatio } from '../../../src/physics/absorption/breitWheeler.js';
import {
  attenuationLengthKpc, inverseAttenuationLengthPerCm, survivalProbability,
} from '../../../src/physics/absorption/attenuationLength.js';
import { CMB, ISRF_LOCAL, energyDensityEvCm3 } from '../../../src/physics/absorption/radiationField.js';
import { deabsorbPoints } from '../../../src/physics/absorption/deabsorb.js';
import { KPC_CM } from '../../../src/physics/constants.js';
import { integrateGL } from '../../../src/physics/quadrature.js';
import { requirePython, runPython, skipWithoutPython } from '../../helpers/python.js';

const ENERGIES_GEV = [3e5, 1e6, 2.2e6, 5e6, 1e7];

describe('Breit-Wheeler cross-section (Gould & Schreder 1967, Phys. Rev. 155, 1404)', () => {
  it('maximum 0.2556 sigma_T at s = 1.968 (scipy, scripts/attenuation_reference.py)', () => {
    let best = 0, sBest = 0;
    for (let s = 1.5; s < 2.5; s += 1e-5) { const v = breitWheelerRatio(s); if (v > best) { best = v; sBest = s; } }
    expect(best).toBeCloseTo(0.2556, 4);
    expect(sBest).toBeCloseTo(1.968, 3);
    expect(breitWheelerRatio(1)).toBe(0);
    expect(breitWheelerRatio(NaN)).toBe(0);
  });
  it('the tabulated phi(s0) equals a direct integral of s sigma(s) (and its asymptote far out)', () => {
    for (const s0 of [1.001, 1.5, 3, 40, 1e4]) {
      // substitution s = 1 + u^2 removes the square-root threshold (common practice)
      const direct = integrateGL((u) => { const s = 1 + u * u; return s * breitWheelerRatio(s) * 2 * u; }, 0, Math.sqrt(s0 - 1), 200, 8);
      expect(breitWheelerPhi(s0) / direct).toBeCloseTo(1, 5);
    }
    expect(breitWheelerPhi(1)).toBe(0);
  });
});

describe('attenuation length on the CMB at 2.7255 K (Fixsen 2009, ApJ 707, 916)', () => {
  it.skipIf(skipWithoutPython)('matches an independent scipy double integral (scripts/attenuation_reference.py) to 1 percent, direct integral to 1e-4', () => {
    requirePython(); // under CI=true a missing reference fails here
    const ref = JSON.parse(runPython('scripts/attenuation_reference.py', [], JSON.stringify(ENERGIES_GEV)));
    ENERGIES_GEV.forEach((e, i) => {
      expect(Math.abs(attenuationLengthKpc(e) / ref.lambda_kpc[i] - 1)).toBeLessThan(0.01);
      expect(Math.abs(1 / inverseAttenuationLengthPerCm(e) / KPC_CM / ref.lambda_kpc[i] - 1)).toBeLessThan(1e-4);
    });
    expect(ref.sigma_max.ratio).toBeCloseTo(0.2556, 4);
    expect(ref.minimum.E_GeV / 2.208e6).toBeCloseTo(1, 2);
    // the direct search of the peak agrees with the script's optimiser
    let best = 0;
    for (let s = 1.9; s < 2.05; s += 1e-6) best = Math.max(best, breitWheelerRatio(s));
    expect(Math.abs(best / ref.sigma_max.ratio - 1)).toBeLessThan(1e-8);
  });
  it('reference values 72.20, 8.946, 7.067, 8.312, 11.37 kpc at 0.3, 1, 2.2, 5, 10 PeV (output of scripts/attenuation_reference.py, rounded), 1 percent', () => {
    // `echo '[3e5,1e6,2.2e6,5e6,1e7]' | /usr/bin/python3 scripts/attenuation_reference.py` prints lambda_kpc
    // 72.2039, 8.94648, 7.06665, 8.31166, 11.3693 (so this test also runs where the Python reference is missing)
    const want = [72.20, 8.946, 7.067, 8.312, 11.37];
    ENERGIES_GEV.forEach((e, i) => expect(Math.abs(attenuationLengthKpc(e) / want[i] - 1)).toBeLessThan(0.01));
  });
  it('minimum 7.0666 kpc near 2.208 PeV (the "minimum" output of scripts/attenuation_reference.py: 7.06662 kpc at 2.2082 PeV); published statements put it near 7-8 kpc around 2 PeV (15 percent)', () => {
    // "minimum near 7 to 8 kpc around 2 PeV": statement from memory of the literature on Galactic PeV absorption,
    // e.g. Vernetto & Lipari 2016, Phys. Rev. D 94, 063009 (paper found, figure value not read): 15 percent.
    let best = Infinity, eBest = 0;
    for (let l = Math.log(1e6); l < Math.log(5e6); l += 0.002) {
      const lam = 1 / (inverseAttenuationLengthPerCm(Math.exp(l)) * KPC_CM);
      if (lam < best) { best = lam; eBest = Math.exp(l); }
    }
    expect(best).toBeCloseTo(7.0666, 2);
    expect(eBest / 2.208e6).toBeCloseTo(1, 1);
    expect(Math.abs(best / 7.5 - 1)).toBeLessThan(0.15);
    expect(Math.abs(eBest / 2e6 - 1)).toBeLessThan(0.15);
  });
  it('the CMB energy density is 0.26057 eV cm^-3 (Planck law at 2.7255 K, Fixsen 2009, ApJ 707, 916)', () => {
    // by hand: u = (pi^2/15) (kT)^4 / (hbar c)^3 (blackbody energy density, common practice, no source), with
    // kT = 8.617333e-5 eV/K * 2.7255 K = 2.348654e-4 eV and hbar c = 1.973270e-5 eV cm (CODATA 2018, from memory):
    // 0.657974 * 3.042820e-15 / 7.683506e-15 = 0.260571 eV cm^-3
    expect(Math.abs(energyDensityEvCm3(CMB) / 0.260571 - 1)).toBeLessThan(1e-4);
  });
  it('the cached table agrees with the direct integral to 2e-4 from 10 TeV to 1e9 GeV (its documented accuracy)', () => {
    for (let l = Math.log(1e4); l < Math.log(1e9); l += 0.37) {
      const e = Math.exp(l), direct = 1 / (inverseAttenuationLengthPerCm(e) * KPC_CM);
      expect(Math.abs(attenuationLengthKpc(e) / direct - 1)).toBeLessThan(2e-4);
    }
  });
  it('transparent below threshold; survival exp(-d/lambda); more fields absorb more', () => {
    expect(attenuationLengthKpc(1e3)).toBe(Infinity);
    expect(survivalProbability(1e3, 10)).toBe(1);
    const lam = attenuationLengthKpc(2.2e6);
    expect(survivalProbability(2.2e6, 8.5)).toBeCloseTo(Math.exp(-8.5 / lam), 12);
    expect(survivalProbability(2.2e6, 0)).toBe(1);
    expect(() => survivalProbability(2.2e6, -1)).toThrow(/distance/);
    const withIsrf = attenuationLengthKpc(1.5e5, [CMB, ...ISRF_LOCAL]);
    expect(withIsrf).toBeLessThan(attenuationLengthKpc(1.5e5));
  });
  it('a diluted blackbody with dilution W has 1/lambda scaled by W (linearity of the Planck density)', () => {
    const f = { name: 'x', temperatureK: 30, dilution: 1e-4 };
    const a = inverseAttenuationLengthPerCm(3e5, [f]), b = inverseAttenuationLengthPerCm(3e5, [{ ...f, dilution: 2e-4 }]);
    expect(b / a).toBeCloseTo(2, 12);
  });
});

describe('deabsorbPoints', () => {
  it('intrinsic = measured / survival, with the spread over templates as a separate systematic', () => {
    const pts = { energyGeV: Float64Array.from([1e5, 1e6]), value: Float64Array.from([1, 2]), errLow: Float64Array.from([0.1, 0.2]),
      errHigh: Float64Array.from([0.1, 0.2]), upperLimit: new Uint8Array(2) };
    const d = deabsorbPoints(pts, [[0.9, 0.5], [0.8, 0.4], [1, 0.6]]);
    expect(d.survival[1]).toBeCloseTo(0.5, 14);
    expect(d.value[1]).toBeCloseTo(4, 14);
    expect(d.errHigh[1]).toBeCloseTo(0.4, 14);
    expect(d.systLow[1]).toBeLessThan(d.value[1]);
    expect(d.systHigh[1]).toBeGreaterThan(d.value[1]);
    expect(() => deabsorbPoints(pts, [0.5, 0])).toThrow(/survival probability/);
  });
});
