/**
 * Slopes of log N - log S for the two textbook geometries, from large seeded
 * realisations (three of 1e6 sources each, pooled).
 */
import { describe, expect, it } from 'vitest';
import { Random } from '../../src/compare/random.js';
import { countsAbove, fluxGrid, logSlope } from '../../src/populations/counts.js';
import { drawRealisation, populationSampler } from '../../src/populations/realise.js';
import type { PopulationModel } from '../../src/populations/model.js';
import { ballModel, S_1E34_AT_1KPC, thinDiscModel } from './fixtures.js';

function pooledCounts(model: PopulationModel, grid: Float64Array, seeds: number[]): Float64Array {
  const s = populationSampler(model), sum = new Float64Array(grid.length);
  for (const seed of seeds) {
    const c = countsAbove(drawRealisation(s, new Random(seed)).fluxErgCm2S, grid, null);
    for (let k = 0; k < grid.length; k++) sum[k] += c[k];
  }
  return sum;
}

describe('source counts', () => {
  it('a population uniform in a Euclidean ball gives N(>S) proportional to S^-3/2', () => {
    // Textbook (common knowledge): N(>S) = n (4/3) pi d_lim^3 with d_lim = sqrt(L / (4 pi S)).
    // Ball of 10 kpc; the flux range keeps d_lim(L_max = 2e34 erg/s) between 0.8 and 8 kpc, inside the ball.
    const model = ballModel(1e6, 10);
    const sMax = (2 * S_1E34_AT_1KPC) / 0.8 ** 2, sMin = sMax / 100;
    const grid = fluxGrid(sMin, sMax, 21);
    const c = pooledCounts(model, grid, [11, 12, 13]);
    const slope = logSlope(grid, c, sMin, sMax);
    expect(Math.abs(slope + 1.5)).toBeLessThan(0.03);
    // Amplitude at the faint end, same textbook law: N(>S) = N_tot E[(d_lim / R_b)^3] with
    // E[L^1.5] = int L^-0.5 dL / int L^-2 dL over [L1, 2 L1] for dN/dL ~ L^-2 (calculus).
    const L1 = 1e34, eL15 = (Math.pow(2 * L1, 0.5) - Math.pow(L1, 0.5)) / 0.5 / (1 / L1 - 1 / (2 * L1));
    const dl3 = eL15 / Math.pow(4 * Math.PI * sMin, 1.5) / 3.0857e21 ** 3;
    const expected = 3e6 * dl3 / 1000;
    expect(Math.abs(c[0] / expected - 1)).toBeLessThan(0.01); // about 520000 sources: Poisson 0.14 %
  });

  it('a thin disc seen from inside gives slope -1 where the distance limit exceeds the scale height', () => {
    // Common knowledge: for d_lim >> h, N(>S) = Sigma pi d_lim^2, proportional to S^-1 (the correction for a
    // Laplace slab is 2 h^2 / d^2, 2e-4 here). h = 3 pc; d_lim from 0.3 to 3 kpc, the disc edge >= 5.5 kpc away.
    const model = thinDiscModel(1e6, 0.003, 14);
    const sMax = (2 * S_1E34_AT_1KPC) / 0.3 ** 2 / 2, sMin = sMax / 100;
    const grid = fluxGrid(sMin, sMax, 21);
    const c = pooledCounts(model, grid, [21, 22, 23]);
    expect(Math.abs(logSlope(grid, c, sMin, sMax) + 1)).toBeLessThan(0.03);
  });
});
