/**
 * Drawing Galactocentric radii from a radial law by the inverse of its
 * cumulative distribution tabulated on a grid: the density of R on a disc is
 * p(R) = f(R) 2 pi R, its running integral is built with the trapezoid rule on
 * `nodes` equally spaced radii, and a uniform u is mapped back by bisection
 * and linear interpolation inside the cell (the inverse-transform method,
 * e.g. Devroye 1986, "Non-Uniform Random Variate Generation", sect. II.2;
 * common practice). The same table gives the disc integral int f(R) 2 pi R dR.
 */
import { radialLaw, type RadialLawParams } from '../templates/radialLaws.js';

/** A tabulated radial distribution. */
export interface RadialTable {
  rKpc: Float64Array;
  /** Running integral of f(R) 2 pi R dR (kpc^2), cdf[0] = 0. */
  cdf: Float64Array;
  /** Total: int_0^rMax f(R) 2 pi R dR (kpc^2). */
  areaKpc2: number;
}

/** Tabulates f(R) 2 pi R on [0, rMaxKpc] (law null: f = 1). */
export function radialTable(law: RadialLawParams | null, rSunKpc: number, rMaxKpc: number, nodes = 8193): RadialTable {
  const r = new Float64Array(nodes), cdf = new Float64Array(nodes);
  const dr = rMaxKpc / (nodes - 1);
  let prev = 0;
  for (let k = 0; k < nodes; k++) {
    const R = k * dr;
    r[k] = R;
    const p = (law ? radialLaw(law, R, rSunKpc) : 1) * 2 * Math.PI * R;
    if (k > 0) cdf[k] = cdf[k - 1] + 0.5 * (p + prev) * dr;
    prev = p;
  }
  return { rKpc: r, cdf, areaKpc2: cdf[nodes - 1] };
}

/** Radius (kpc) whose cumulative fraction is u in [0, 1). */
export function radiusAt(t: RadialTable, u: number): number {
  const target = u * t.areaKpc2, c = t.cdf;
  let lo = 0, hi = c.length - 1;
  while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (c[mid] <= target) lo = mid; else hi = mid; }
  const span = c[hi] - c[lo];
  const w = span > 0 ? (target - c[lo]) / span : 0;
  return t.rKpc[lo] + w * (t.rKpc[hi] - t.rKpc[lo]);
}
