/**
 * Energy-resolved k_I and survival through the comparison (issue: energy-dependent survival).
 * Survival: exp(-d / lambda(E)) with lambda from physics/absorption, itself checked against the
 * attenuation table of shared/REFERENCES.md (lambda = 8.946 kpc at 1 PeV, 7.067 kpc at 2.2 PeV;
 * computed twice independently with scipy quadrature). Power-law points and the K_pi rule
 * (Ahlers & Halzen 2018) isolate the survival; everything else is common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { buildEnsemble, ensembleAt } from '../../src/compare/ensemble.js';
import { component, predictNeutrinos } from '../../src/compare/predict.js';
import { survivalProbability } from '../../src/physics/absorption/attenuationLength.js';
import type { SpectrumPoints } from '../../src/physics/points.js';
import { summarise } from '../../src/scaling/summary.js';
import type { FactorRow } from '../../src/scaling/factorRow.js';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const D_KPC = 8.5;
const E = [2e4, 1e5, 3e5, 1e6, 2.2e6];
const pl = (e: number) => 1e-12 * Math.pow(e / 1e3, -2.7);
const points = (relErr: number, ulLast = false): SpectrumPoints => {
  const v = Float64Array.from(E, pl);
  const ul = Uint8Array.from(E, (_, i) => (ulLast && i === E.length - 1 ? 1 : 0));
  return { energyGeV: Float64Array.from(E), value: v, errLow: v.map((x, i) => (ul[i] ? 0 : relErr * x)), errHigh: v.map((x, i) => (ul[i] ? 0 : relErr * x)), upperLimit: ul };
};
const P = E.map((e) => survivalProbability(e, D_KPC));

describe('energy-dependent survival', () => {
  it('the survival used at 1 PeV and 2.2 PeV is exp(-d / lambda) with the table\'s lambda (8.946, 7.067 kpc: the lambda_kpc output of scripts/attenuation_reference.py, rounded; checked against it in test/physics/absorption), 1 %', () => {
    expect(rel(-Math.log(P[3]), D_KPC / 8.946)).toBeLessThan(0.01);
    expect(rel(-Math.log(P[4]), D_KPC / 7.067)).toBeLessThan(0.01);
  });

  it('old single-factor path and the new path agree where survival is flat and differ by P_old / P(E) where it is not', () => {
    const base = { gamma: { kind: 'points' as const, points: points(0) }, e0GeV: 1e4, energiesNuGeV: E.map((e) => e / 2), methods: ['kpi' as const], samples: 200, seed: 3 };
    const oldP = predictNeutrinos({ ...base, factors: [{ template: 't', kI: 2, survivalMean: P[0] }] });
    const newP = predictNeutrinos({ ...base, factors: [{ template: 't', kI: 2, survivalByEnergy: { energiesGeV: E, values: P } }] });
    const o = component(oldP, 'combined')!.atEnergies, n = component(newP, 'combined')!.atEnergies;
    E.forEach((e, j) => expect(rel(n[j].median / o[j].median, P[0] / P[j])).toBeLessThan(1e-12));
    expect(rel(n[0].median, o[0].median)).toBeLessThan(1e-8); // 20 TeV: the CMB is transparent
    expect(n[3].median / o[3].median).toBeGreaterThan(2); // 1 PeV: 1 / exp(-8.5 / 8.95) = 2.6
    // at 1 PeV photon energy (500 TeV neutrinos) the prediction is K_pi * k_I / P(1 PeV) * I(1 PeV)
    expect(rel(n[3].median, 6 * 2 / P[3] * pl(1e6))).toBeLessThan(1e-12);
  });

  it('the proton fit de-absorbs each point, upper limits too, by the survival at its own energy', () => {
    const f = [{ template: 't', kI: 1, survivalByEnergy: { energiesGeV: E, values: P } }];
    const a = predictNeutrinos({ gamma: { kind: 'points', points: points(0.1, true) }, factors: f, e0GeV: 5e4, methods: ['kab'], samples: 200, seed: 1 });
    const pts = points(0.1, true);
    const by = (x: Float64Array) => x.map((v, i) => v / P[i]);
    const intrinsic = { ...pts, value: by(pts.value), errLow: by(pts.errLow), errHigh: by(pts.errHigh) };
    // the same fit by hand: intrinsic points, no survival; the KAB ratio must be the same
    const b = predictNeutrinos({ gamma: { kind: 'points', points: intrinsic }, factors: [{ template: 't', kI: 1 }], e0GeV: 5e4, methods: ['kab'], samples: 200, seed: 1 });
    expect(rel(a.methods[0].atE0, b.methods[0].atE0)).toBeLessThan(1e-9);
    expect(a.notes.join(' ')).toMatch(/1 upper limit\(s\) as one-sided constraints at 95\.0 % confidence \(default/);
    const c = predictNeutrinos({ gamma: { kind: 'points', points: { ...points(0.1, true), ulConfidence: 0.9 } }, factors: f, e0GeV: 5e4, methods: ['kab'], samples: 200, seed: 1 });
    expect(c.notes.join(' ')).toMatch(/at 90\.0 % confidence:/);
    expect(c.methods[0].atE0).not.toBe(a.methods[0].atE0); // the level changes the fit
  });

  it('between tabulated energies log-log, beyond them an error naming the template and the range', () => {
    const ens = buildEnsemble([{ template: 'x', kIByEnergy: { energiesGeV: [1e4, 1e6], values: [1, 0.25] } }]);
    expect(rel(ensembleAt(ens, [1e5]).kI[0], 0.5)).toBeLessThan(1e-14); // exp(ln 0.25 / 2), log-log midpoint
    expect(() => ensembleAt(ens, [2e6])).toThrow(/template 'x': no value at 2\.00000e\+6 GeV; the table covers 10000\.0 to 1\.00000e\+6 GeV/);
  });
});

describe('one weighted quantile', () => {
  it('values [1, 2, 3], weights [1, 1, 2]: factor summary median = prediction central k_I = 13/6 (by hand from the definition in scaling/quantiles.ts: u = [0, 0.4, 1])', () => {
    const names = ['a', 'b', 'c'], kI = [1, 2, 3], w = [1, 1, 2];
    const rows = names.map((template, i) => ({ template, target: 'sky', plane: 0, energyGeV: null, kI: kI[i], kFSr: 1, fourPiFactor: 1, coveredFluxFraction: 1 })) as unknown as FactorRow[];
    const s = summarise(rows, new Map(names.map((n, i) => [n, w[i]]))).find((r) => r.quantity === 'kI')!;
    const at = ensembleAt(buildEnsemble(names.map((template, i) => ({ template, kI: kI[i], weight: w[i] }))), [1e3]);
    expect(s.median).toBe(at.kICentral[0]);
    expect(rel(s.median, 13 / 6)).toBeLessThan(1e-14);
  });
});

describe('channels', () => {
  it('p-gamma never uses the pp yields: default method is the K_pi rule with K_pi = 1, assumptions say p-gamma; kab is refused', () => {
    const p = predictNeutrinos({ gamma: { kind: 'points', points: points(0) }, factors: [{ template: 't', kI: 1 }], e0GeV: 1e4, channel: 'pgamma', samples: 200 });
    expect(p.methods.map((m) => m.id)).toEqual(['kpi']);
    expect(rel(p.methods[0].atE0, 3 * pl(2e4))).toBeLessThan(1e-12); // 3 K_pi, K_pi = 1 (Ahlers & Halzen 2018)
    expect(p.assumptions.join(' ')).toMatch(/p-gamma interactions/);
    expect(p.assumptions.join(' ')).not.toMatch(/pp collisions/);
    expect(() => predictNeutrinos({ gamma: { kind: 'points', points: points(0) }, factors: [{ template: 't', kI: 1 }], e0GeV: 1e4, channel: 'pgamma', methods: ['kab'], samples: 200 }))
      .toThrow(/kab applies to pp only, not pgamma/);
  });
});

describe('forecast with energy-resolved survival', () => {
  it('one call with tables equals single-energy calls with the survival at each energy (K_pi rule)', async () => {
    const { expectedGamma } = await import('../../src/compare/reverse.js');
    const { parseMeasurement } = await import('../../src/compare/measurement.js');
    const m = parseMeasurement({ kind: 'normalisation', energyUnit: 'GeV', valueUnit: 'GeV^-1 cm^-2 s^-1 sr^-1', e0: 1e5, norm: 1e-18, err: 2e-19, index: 2.7, energyRange: [5e3, 2e6] });
    const eg = [2e4, 3e5, 1e6];
    const table = expectedGamma({ measurement: m, factors: [{ template: 't', kI: 2, survivalByEnergy: { energiesGeV: E, values: P } }], energiesGammaGeV: eg, methods: ['kpi'], samples: 500, seed: 4 });
    eg.forEach((e, j) => {
      const one = expectedGamma({ measurement: m, factors: [{ template: 't', kI: 2, survivalMean: P[E.indexOf(e)] }], energiesGammaGeV: [e], methods: ['kpi'], samples: 500, seed: 4 });
      const a = table.components.find((c) => c.name === 'combined')!.atEnergies[j].median, b = one.components.find((c) => c.name === 'combined')!.atEnergies[0].median;
      expect(rel(a, b)).toBeLessThan(1e-12);
    });
  });
});
