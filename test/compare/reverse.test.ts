import { describe, expect, it } from 'vitest';
import { parseMeasurement } from '../../src/compare/measurement.js';
import { predictNeutrinos } from '../../src/compare/predict.js';
import { expectedGamma } from '../../src/compare/reverse.js';

const unitless = { energyUnit: 'GeV', valueUnit: 'GeV^-1 cm^-2 s^-1 sr^-1' };

describe('reverse direction: expected gamma rays in a survey footprint', () => {
  it('K_pi rule: I_gamma(E) = (P / k_I) 2^Gamma / 6 I_nu,all(E) for a power law (Ahlers & Halzen 2018, inverted)', () => {
    const G = 2.5, kI = 4, P = 0.8;
    const m = parseMeasurement({ kind: 'normalisation', ...unitless, e0: 1e4, norm: 3e-15, err: 0, index: G, energyRange: [1e3, 1e6] });
    const r = expectedGamma({ measurement: m, factors: [{ template: 't', kI, survivalMean: P }], methods: ['kpi'], energiesGammaGeV: [1e4, 1e5], samples: 200 });
    const c = r.components.find((x) => x.name === 'combined')!;
    for (const [j, e] of [1e4, 1e5].entries()) {
      const expected = (P / kI) * Math.pow(2, G) / 6 * 3e-15 * Math.pow(e / 1e4, -G);
      expect(c.atEnergies[j].median / expected - 1).toBeCloseTo(0, 12);
    }
    expect(r.assumptions.join(' ')).toMatch(/hadronic/);
  });

  it('is the inverse of the forward prediction (K_pi, one template): round trip to the input gamma rays', () => {
    const e = Float64Array.from([1e3, 1e4, 1e5]);
    const v = e.map((x) => 1e-10 * Math.pow(x, -2.6));
    const fwd = predictNeutrinos({ gamma: { kind: 'points', points: { energyGeV: e, value: v, errLow: new Float64Array(3), errHigh: new Float64Array(3), upperLimit: new Uint8Array(3) } },
      factors: [{ template: 't', kI: 3, survivalMean: 0.7 }], e0GeV: 5e3, methods: ['kpi'], samples: 100 });
    const nuPts = Array.from(fwd.energiesNuGeV, (x, j) => ({ energy: x, value: fwd.components.at(-1)!.atEnergies[j].median, err: 0 }));
    const back = expectedGamma({ measurement: parseMeasurement({ kind: 'points', ...unitless, points: nuPts }), factors: [{ template: 't', kI: 3, survivalMean: 0.7 }],
      methods: ['kpi'], energiesGammaGeV: [1e3, 1e4, 1e5], samples: 100 });
    const c = back.components.at(-1)!;
    for (let j = 0; j < 3; j++) expect(c.atEnergies[j].median / v[j] - 1).toBeCloseTo(0, 10);
  });

  it('a one-flavour measurement is scaled to all flavours (x3 at 1:1:1); both methods give a method component', () => {
    const m = parseMeasurement({ kind: 'normalisation', ...unitless, flavour: 'mu', e0: 1e4, norm: 1e-15, errLow: 2e-16, errHigh: 3e-16, index: 2.5, energyRange: [1e3, 1e6] });
    const r = expectedGamma({ measurement: m, factors: [{ template: 'a', kI: 2 }, { template: 'b', kI: 3 }], samples: 2000, seed: 4 });
    expect(r.components.map((c) => c.name)).toEqual(['neutrino', 'template', 'method', 'combined']);
    const kpi = r.methods.find((x) => x.id === 'kpi')!;
    const ePos = Array.from(r.energiesGammaGeV).findIndex((x) => x > 1e4);
    const e = r.energiesGammaGeV[ePos];
    // I_gamma(E) = (P / k_I) I_nu,all(E/2) / 6 (K_pi rule, Ahlers & Halzen 2018, inverted; from memory), k_I the
    // weighted median of {2, 3} = 2.5 (midpoint of an even count, common practice), I_nu,all = 3 x the mu flavour
    expect(kpi.atEnergies[ePos] / ((1 / 2.5) / 6 * 3e-15 * Math.pow(e / 2 / 1e4, -2.5)) - 1).toBeCloseTo(0, 10);
  });
});
