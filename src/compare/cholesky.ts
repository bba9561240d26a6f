/**
 * Cholesky factorisation of a symmetric positive-definite matrix, A = L L^T
 * (Golub & Van Loan 2013, Matrix Computations, 4th ed., algorithm 4.2.1), and
 * the solve that goes with it. Used to draw correlated normal deviates from a
 * fit's covariance and to form chi^2 = r^T C^-1 r. Matrices are row-major.
 */

/**
 * Lower-triangular L (row-major, n x n) with A = L L^T, or null when A is not
 * positive definite (a pivot <= 0, or NaN). Zero rows/columns (fixed
 * parameters) are allowed: their pivot is taken as 0 and their column left 0.
 */
export function cholesky(a: ArrayLike<number>, n: number): Float64Array | null {
  const l = new Float64Array(n * n);
  const scale = Math.max(1e-300, ...Array.from({ length: n }, (_, i) => Math.abs(a[i * n + i])));
  for (let j = 0; j < n; j++) {
    let d = a[j * n + j];
    for (let k = 0; k < j; k++) d -= l[j * n + k] * l[j * n + k];
    if (!(d >= -1e-14 * scale)) return null;
    if (d <= 1e-300) {
      // a zero pivot: the row must be zero too, else A is not semi-definite
      for (let i = j + 1; i < n; i++) {
        let s = a[i * n + j];
        for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
        if (Math.abs(s) > 1e-12 * scale) return null;
      }
      continue;
    }
    const ljj = Math.sqrt(d);
    l[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
      l[i * n + j] = s / ljj;
    }
  }
  return l;
}

/** r^T A^-1 r from the factor L of A (forward substitution: |L^-1 r|^2). Zero pivots give Infinity unless r vanishes there. */
export function quadraticFormInverse(l: Float64Array, r: ArrayLike<number>, n: number): number {
  const y = new Float64Array(n);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    let s = r[i];
    for (let k = 0; k < i; k++) s -= l[i * n + k] * y[k];
    const d = l[i * n + i];
    y[i] = d > 0 ? s / d : (Math.abs(s) > 0 ? Infinity : 0);
    sum += y[i] * y[i];
  }
  return sum;
}
