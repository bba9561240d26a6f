/**
 * Gauss-Legendre quadrature and the line-of-sight sampling plan.
 *
 * Nodes and weights on [-1, 1] come from Newton's iteration on the Legendre
 * polynomial P_n, started at cos(pi (i - 1/4) / (n + 1/2)) (Press et al.,
 * Numerical Recipes, 3rd ed. 2007, section 4.6; common practice). An n-point rule
 * integrates polynomials up to degree 2n - 1 exactly.
 */

/** Nodes x_i and weights w_i of the n-point Gauss-Legendre rule on [-1, 1]. */
export function gaussLegendre(n: number): { x: Float64Array; w: Float64Array } {
  const x = new Float64Array(n), w = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let t = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 0;
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1, p1 = t;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * t * p1 - (k - 1) * p0) / k;
        p0 = p1; p1 = p2;
      }
      const pn = n === 1 ? t : p1, pm = n === 1 ? 1 : p0;
      dp = (n * (t * pn - pm)) / (t * t - 1);
      const dt = pn / dp;
      t -= dt;
      if (Math.abs(dt) < 1e-16) break;
    }
    if (n === 1) { t = 0; dp = 1; }
    const wi = 2 / ((1 - t * t) * dp * dp);
    x[i] = -t; x[n - 1 - i] = t;
    w[i] = wi; w[n - 1 - i] = wi;
  }
  if (n === 1) { x[0] = 0; w[0] = 2; }
  return { x, w };
}

/** Distances (kpc) and weights (kpc) of every sample along a line of sight. */
export interface LosPlan {
  readonly sKpc: Float64Array;
  readonly wKpc: Float64Array;
  /** Segment edges (kpc), from 0 to the maximum distance. */
  readonly edgesKpc: Float64Array;
}

/**
 * Segments from the observer to maxDistanceKpc: lengths grow by doubling from
 * stepKpc / 32 up to stepKpc (fine near the observer, where a thin disc seen
 * at high latitude has all its column), then stay at stepKpc; the last one is
 * cut at the maximum distance. Each segment carries an nodesPerSegment-point
 * Gauss-Legendre rule. Halving stepKpc halves every segment's length.
 */
export function losPlan(maxDistanceKpc: number, stepKpc: number, nodesPerSegment: number): LosPlan {
  const edges: number[] = [0];
  let len = stepKpc / 32;
  while (edges[edges.length - 1] < maxDistanceKpc * (1 - 1e-12)) {
    const next = Math.min(edges[edges.length - 1] + len, maxDistanceKpc);
    edges.push(next);
    len = Math.min(2 * len, stepKpc);
  }
  edges[edges.length - 1] = maxDistanceKpc;
  const { x, w } = gaussLegendre(nodesPerSegment);
  const nSeg = edges.length - 1;
  const sKpc = new Float64Array(nSeg * nodesPerSegment), wKpc = new Float64Array(nSeg * nodesPerSegment);
  for (let k = 0; k < nSeg; k++) {
    const a = edges[k], b = edges[k + 1], h = (b - a) / 2, m = (a + b) / 2;
    for (let i = 0; i < nodesPerSegment; i++) {
      sKpc[k * nodesPerSegment + i] = m + h * x[i];
      wKpc[k * nodesPerSegment + i] = h * w[i];
    }
  }
  return { sKpc, wKpc, edgesKpc: Float64Array.from(edges) };
}
