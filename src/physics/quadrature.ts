/**
 * Gauss-Legendre nodes and weights on [-1, 1] (Newton iteration on P_n from the
 * Chebyshev-like first guess cos(pi (i - 1/4) / (n + 1/2)); Abramowitz & Stegun
 * 1964, 25.4.29; common practice), cached per order, and a composite rule.
 */
const cache = new Map<number, { x: Float64Array; w: Float64Array }>();

/** Nodes x and weights w of the n-point Gauss-Legendre rule on [-1, 1]. */
export function gaussLegendre(n: number): { x: Float64Array; w: Float64Array } {
  const hit = cache.get(n);
  if (hit) return hit;
  const x = new Float64Array(n), w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let z = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5)), dp = 0;
    for (let it = 0; it < 100; it++) {
      let p0 = 1, p1 = z;
      for (let k = 2; k <= n; k++) { const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k; p0 = p1; p1 = p2; }
      if (n === 1) { p1 = z; p0 = 1; }
      dp = (n * (z * p1 - p0)) / (z * z - 1);
      const dz = p1 / dp;
      z -= dz;
      if (Math.abs(dz) < 1e-15) break;
    }
    x[i] = z; w[i] = 2 / ((1 - z * z) * dp * dp);
  }
  const r = { x, w };
  cache.set(n, r);
  return r;
}

/**
 * Composite Gauss-Legendre integral of f over [a, b] with `segments` equal
 * pieces of `order` nodes each.
 */
export function integrateGL(f: (t: number) => number, a: number, b: number, segments = 16, order = 8): number {
  const { x, w } = gaussLegendre(order);
  const h = (b - a) / segments;
  let s = 0;
  for (let k = 0; k < segments; k++) {
    const mid = a + (k + 0.5) * h;
    for (let i = 0; i < order; i++) s += w[i] * f(mid + 0.5 * h * x[i]);
  }
  return 0.5 * h * s;
}
