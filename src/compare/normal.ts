/**
 * The normal distribution: erfc, the cumulative distribution Phi, its
 * inverse, and the conversion between a two-sided probability and a number of
 * Gaussian sigmas. Written without fitted coefficients: a series and a
 * continued fraction from Abramowitz & Stegun (1964, Handbook of Mathematical
 * Functions, 7.1.6 and 7.1.14) and Newton steps for the inverse. Accuracy
 * about 1e-14 relative against scipy.special (scripts/compare_reference.py).
 */

const SQRT_PI = Math.sqrt(Math.PI);
const SQRT2 = Math.SQRT2;

/**
 * erf(x) = (2/sqrt(pi)) exp(-x^2) sum_n 2^n x^(2n+1) / (1 3 5 ... (2n+1))
 * (Abramowitz & Stegun 7.1.6): all terms positive, no cancellation; used for |x| < 2.5.
 */
function erfSeries(x: number): number {
  const x2 = x * x;
  let term = x, sum = x;
  for (let n = 1; n < 200; n++) {
    term *= (2 * x2) / (2 * n + 1);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return (2 / SQRT_PI) * Math.exp(-x2) * sum;
}

/**
 * erfc(x) for x >= 2.5 by the continued fraction of Abramowitz & Stegun 7.1.14,
 * sqrt(pi) exp(x^2) erfc(x) = 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + ...))))),
 * evaluated by the modified Lentz method (Press et al. 2007, Numerical Recipes, 3rd ed., sect. 5.2).
 */
function erfcFraction(x: number): number {
  const tiny = 1e-300;
  let f = x, c = x, d = 0;
  for (let n = 1; n < 500; n++) {
    const a = n / 2;
    d = x + a * d;
    d = d === 0 ? tiny : d;
    c = x + a / c;
    c = c === 0 ? tiny : c;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-x * x) / (SQRT_PI * f);
}

/** Complementary error function erfc(x) = 1 - erf(x), accurate in both tails. NaN gives NaN. */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x < 0) return 2 - erfc(-x);
  if (x < 2.5) return 1 - erfSeries(x);
  if (x > 27.3) return 0; // below the smallest double
  return erfcFraction(x);
}

/** Standard normal density phi(x) = exp(-x^2/2) / sqrt(2 pi). */
export function normalPdf(x: number): number {
  return Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
}

/** Standard normal cumulative distribution Phi(x) = erfc(-x / sqrt 2) / 2. */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / SQRT2);
}

/**
 * Lower-tail quantile for p <= 0.5: Newton steps on g(x) = ln Phi(x) - ln p,
 * which is concave, so the iterates approach the root from below and converge
 * monotonically from any start (common practice, no source).
 */
function lowerQuantile(p: number): number {
  let x = p > 0.3 ? 0 : -Math.sqrt(-2 * Math.log(p));
  const lnP = Math.log(p);
  for (let i = 0; i < 100; i++) {
    const cdf = normalCdf(x);
    const step = (Math.log(cdf) - lnP) * cdf / normalPdf(x);
    x -= step;
    if (Math.abs(step) < 1e-15 * Math.max(1, Math.abs(x))) break;
  }
  return x;
}

/**
 * Inverse of the standard normal cumulative distribution: x with Phi(x) = p.
 * p in (0, 1); 0 gives -Infinity, 1 gives +Infinity, outside or NaN gives NaN.
 * For p > 0.5 it uses -quantile(1 - p), so an upper-tail probability q is best
 * passed as -normalQuantile(q).
 */
export function normalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  return p <= 0.5 ? lowerQuantile(p) : -lowerQuantile(1 - p);
}

/**
 * Number of Gaussian sigmas of a two-sided probability p: the z > 0 with
 * 2 (1 - Phi(z)) = p, i.e. z = -Phi^-1(p / 2). p = 1 gives 0, p = 0 gives Infinity.
 * Check value: p = 0.0026998 gives 3.0 (common knowledge).
 */
export function sigmaFromTwoSidedP(p: number): number {
  if (!(p >= 0 && p <= 1)) return NaN;
  if (p === 0) return Infinity;
  return Math.max(0, -lowerQuantile(p / 2));
}

/** Two-sided probability of a deviation of at least z sigmas: 2 (1 - Phi(|z|)) = erfc(|z| / sqrt 2). */
export function twoSidedPFromSigma(z: number): number {
  return erfc(Math.abs(z) / SQRT2);
}
