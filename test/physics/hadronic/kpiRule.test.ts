import { describe, expect, it } from 'vitest';
import { splitFlavours, parseFlavourRatio } from '../../../src/physics/hadronic/flavour.js';
import { kpiGammaFromNeutrino, kpiNeutrinoFromGamma, kpiPowerLawFactor } from '../../../src/physics/hadronic/kpiRule.js';

describe('K_pi rule (Ahlers & Halzen 2018, Prog. Part. Nucl. Phys. 102, 73; from memory)', () => {
  it('for a gamma-ray power law of index Gamma the all-flavour neutrino intensity at E is 6 * 2^-Gamma times the gamma-ray one (pp)', () => {
    for (const G of [2, 2.3, 2.7, 3.1]) {
      const gamma = (e: number) => 4.2e-9 * Math.pow(e / 1e3, -G);
      for (const e of [100, 3e4, 1e6]) {
        expect(kpiNeutrinoFromGamma(gamma, e, 'pp') / gamma(e)).toBeCloseTo(6 * Math.pow(2, -G), 12);
        expect(kpiNeutrinoFromGamma(gamma, e, 'pgamma') / gamma(e)).toBeCloseTo(3 * Math.pow(2, -G), 12);
      }
      expect(kpiPowerLawFactor(G)).toBeCloseTo(6 * Math.pow(2, -G), 14);
    }
  });
  it('the flavour-averaged E^2-weighted ratio at E_gamma = 2 E_nu is K_pi/4 for any spectrum', () => {
    const gamma = (e: number) => Math.exp(-e / 5e4) / (e * e * (1 + Math.log(e)));
    for (const en of [300, 1e4, 2e5]) {
      const r = (en * en * kpiNeutrinoFromGamma(gamma, en)) / 3 / ((2 * en) ** 2 * gamma(2 * en));
      expect(r).toBeCloseTo(0.5, 12);
    }
  });
  it('the reverse conversion inverts the forward one', () => {
    const gamma = (e: number) => Math.pow(e, -2.4);
    const nu = (e: number) => kpiNeutrinoFromGamma(gamma, e, 'pp');
    expect(kpiGammaFromNeutrino(nu, 7e3, 'pp') / gamma(7e3)).toBeCloseTo(1, 12);
  });
  it('flavour split (1:1:1 default, configurable)', () => {
    const s = splitFlavours(3);
    expect([s.e, s.mu, s.tau]).toEqual([1, 1, 1]);
    const t = splitFlavours(3, parseFlavourRatio('1:2:0'));
    expect(t.mu).toBeCloseTo(2, 14);
    expect(() => parseFlavourRatio('1:x:1')).toThrow(/flavour ratio/);
  });
});
