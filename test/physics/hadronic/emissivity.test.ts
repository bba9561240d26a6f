import { describe, expect, it } from 'vitest';
import { SPEED_OF_LIGHT_CM_S } from '../../../src/physics/constants.js';
import { ppEmissivity, ppNeutrinoFlavours } from '../../../src/physics/hadronic/emissivity.js';
import { kpiNeutrinoFromGamma } from '../../../src/physics/hadronic/kpiRule.js';
import type { SpectralModel } from '../../../src/physics/spectrum.js';
import { requirePython, runPython, skipWithoutPython } from '../../helpers/python.js';

const pl = (index: number): SpectralModel => ({ kind: 'powerLaw', norm: 1, index, e0GeV: 1 });

describe('ppEmissivity', () => {
  it.skipIf(skipWithoutPython)('matches scipy adaptive quadrature of the same integrand (scripts/kab_reference.py) to 1e-6', () => {
    requirePython(); // under CI=true a missing reference fails here
    const req = [
      { secondary: 'gamma', E: 1e3, index: 2 }, { secondary: 'gamma', E: 1e5, index: 2.7 },
      { secondary: 'nuMuFromPion', E: 5e2, index: 2 }, { secondary: 'electronType', E: 5e4, index: 2.4 },
      { secondary: 'nuMuFromPion', E: 1e4, index: 2.5 }, { secondary: 'electronType', E: 1e4, index: 2.5 },
    ];
    const ref = JSON.parse(runPython('scripts/kab_reference.py', [], JSON.stringify(req))) as number[];
    req.forEach((r, i) => {
      const ours = ppEmissivity(r.secondary as 'gamma', r.E, pl(r.index)) / (SPEED_OF_LIGHT_CM_S * 1e-27);
      expect(ours / ref[i]).toBeCloseTo(1, 6);
    });
    // the flavour bookkeeping: nu_mu at the source = pion-decay nu_mu + electron-type, nu_e = electron-type
    const f = ppNeutrinoFlavours(1e4, pl(2.5));
    expect(f.source.mu / f.source.e).toBeCloseTo(1 + ref[4] / ref[5], 6);
  });

  it.skipIf(skipWithoutPython)('method difference: KAB flavour-averaged nu/gamma E^2 ratio at E_nu = E_gamma/2 matches scripts/kab_reference.py to 1e-6; the rule gives 0.5', () => {
    requirePython(); // under CI=true a missing reference fails here
    // KAB 2006 eqs. 58-69 and 79 evaluated by scipy quad in scripts/kab_reference.py: all-flavour nu = nu_mu(pion)
    // + 2 x electron-type, so ratio = (1/3) E_nu^2 [Q_numu1 + 2 Q_e](E_nu) / E_gamma^2 Q_gamma(E_gamma). The script's
    // output is about 0.354 (1 TeV), 0.363 (10 TeV), 0.373 (100 TeV) for E^-2 and 0.406 for E^-2.7 at 100 TeV.
    // The quantity the rule fixes at K_pi/4 = 0.5 is this flavour-averaged one (Ahlers & Halzen 2018); the
    // all-flavour sum is three times it (rule: 1.5).
    const cases: [number, number][] = [[1e3, 2], [1e4, 2], [1e5, 2], [1e5, 2.7]];
    const req = cases.flatMap(([eg, index]) => [
      { secondary: 'gamma', E: eg, index }, { secondary: 'nuMuFromPion', E: eg / 2, index }, { secondary: 'electronType', E: eg / 2, index },
    ]);
    const ref = JSON.parse(runPython('scripts/kab_reference.py', [], JSON.stringify(req))) as number[];
    cases.forEach(([eg, index], i) => {
      const en = eg / 2;
      const want = (en * en * (ref[3 * i + 1] + 2 * ref[3 * i + 2])) / (eg * eg * ref[3 * i]) / 3;
      const g = eg * eg * ppEmissivity('gamma', eg, pl(index));
      const nu = en * en * ppEmissivity('neutrinoAllFlavour', en, pl(index));
      expect(Math.abs(nu / g / 3 / want - 1)).toBeLessThan(1e-6);
      if (index === 2) {
        // loose window rounded from the script's output above (E^-2, 1-100 TeV): all-flavour 1.06..1.12
        expect(nu / g).toBeGreaterThan(1.06);
        expect(nu / g).toBeLessThan(1.12);
      }
      // the rule applied to the same gamma rays gives its own expectation, 0.5 per flavour (identity of the rule)
      const rule = en * en * kpiNeutrinoFromGamma((e) => ppEmissivity('gamma', e, pl(index)), en);
      expect(Math.abs(rule / g / 3 / 0.5 - 1)).toBeLessThan(1e-10);
    });
  });

  it('flavours: source 1:2:0 in shape, Earth split by the ratio, sums conserved', () => {
    const f = ppNeutrinoFlavours(1e4, pl(2.5));
    // values near 1e-27: relative tolerances (an absolute toBeCloseTo(x, 20) would accept any value)
    expect(Math.abs((f.source.e + f.source.mu + f.source.tau) / f.allFlavour - 1)).toBeLessThan(1e-12);
    expect(f.source.tau).toBe(0);
    // nu_mu : nu_e is 2 : 1 in number per pion chain (common practice, no source); at a fixed energy it is
    // 1 + Q(nu_mu, pion)/Q(electron-type), below 2 because the pion-decay nu_mu is softer (x < 0.427); loose bounds
    expect(f.source.mu / f.source.e).toBeGreaterThan(1.4);
    expect(f.source.mu / f.source.e).toBeLessThan(2.1);
    expect(Math.abs(f.earth.e / (f.allFlavour / 3) - 1)).toBeLessThan(1e-12);
    const g = ppNeutrinoFlavours(1e4, pl(2.5), [1, 2, 0]);
    expect(g.earth.mu / g.earth.e).toBeCloseTo(2, 12);
  });

  it('refuses energies below the KAB range', () => {
    expect(() => ppEmissivity('gamma', 50, pl(2))).toThrow(/below 100 GeV/);
  });
});
