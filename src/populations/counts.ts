/**
 * Source counts N(>S) on a log-spaced flux grid, the unresolved and total
 * flux of a realisation, and the least-squares slope of log N against log S.
 */
import { ComputeError } from '../core/errors.js';
import type { SourceRealisation } from './realise.js';

/** n log-spaced fluxes from sMin to sMax (inclusive). */
export function fluxGrid(sMin: number, sMax: number, n: number): Float64Array {
  const a = Math.log(sMin), b = Math.log(sMax);
  return Float64Array.from({ length: n }, (_, k) => Math.exp(a + ((b - a) * k) / (n - 1)));
}

/**
 * N(>S_k): the weighted number of sources with flux >= S_k, for a log-spaced
 * grid S (from {@link fluxGrid}). weight null: 1 each; select null: all
 * sources, else those with select[i] equal to `selectValue`. One pass and a
 * cumulative sum from the top.
 */
export function countsAbove(flux: Float64Array, grid: Float64Array, weight: ArrayLike<number> | null,
  select: Uint8Array | null = null, selectValue = 1): Float64Array {
  const K = grid.length, bins = new Float64Array(K);
  const a = Math.log(grid[0]), step = (Math.log(grid[K - 1]) - a) / (K - 1);
  for (let i = 0; i < flux.length; i++) {
    if (select && select[i] !== selectValue) continue;
    const w = weight ? weight[i] : 1;
    if (w === 0) continue;
    let j = Math.floor((Math.log(flux[i]) - a) / step + 1e-9);
    if (j < 0) continue;
    if (j >= K) j = K - 1;
    bins[j] += w;
  }
  for (let j = K - 2; j >= 0; j--) bins[j] += bins[j + 1];
  return bins;
}

/**
 * Least-squares slope of ln N against ln S over the grid points with
 * sMin <= S <= sMax and N > 0 (common practice, no source).
 */
export function logSlope(grid: Float64Array, counts: Float64Array, sMin: number, sMax: number): number {
  let n = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
  for (let k = 0; k < grid.length; k++) {
    if (grid[k] < sMin * (1 - 1e-12) || grid[k] > sMax * (1 + 1e-12) || !(counts[k] > 0)) continue;
    const x = Math.log(grid[k]), y = Math.log(counts[k]);
    n++; sx += x; sy += y; sxx += x * x; sxy += x * y;
  }
  if (n < 2) throw new ComputeError(`a slope needs two flux points with sources between ${sMin} and ${sMax}, found ${n}`);
  return (n * sxy - sx * sy) / (n * sxx - sx * sx);
}

/**
 * Sum over sources of w_i phi_i(E_e) (GeV^-1 cm^-2 s^-1), per working energy,
 * for the sources with resolved[i] === 0 (resolved null: all of them).
 * Compensated sums (Neumaier 1974, ZAMM 54, 39).
 */
export function summedFlux(r: SourceRealisation, weight: ArrayLike<number> | null, resolved: Uint8Array | null): Float64Array {
  const nE = r.energiesGeV.length, sum = new Float64Array(nE), comp = new Float64Array(nE);
  const f = r.fluxAtEnergies;
  for (let i = 0; i < r.count; i++) {
    if (resolved && resolved[i]) continue;
    const w = weight ? weight[i] : 1;
    if (w === 0) continue;
    for (let e = 0; e < nE; e++) {
      const v = w * f[i * nE + e], s = sum[e], t = s + v;
      comp[e] += Math.abs(s) >= Math.abs(v) ? (s - t) + v : (v - t) + s;
      sum[e] = t;
    }
  }
  for (let e = 0; e < nE; e++) sum[e] += comp[e];
  return sum;
}
