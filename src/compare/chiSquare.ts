/**
 * The chi-square distribution's survival function, for the goodness of a
 * prediction over measured points. P(chi2 >= x; k) = Q(k/2, x/2), the
 * regularised upper incomplete gamma function, by its series for x < a + 1 and
 * its continued fraction otherwise (Press et al. 2007, Numerical Recipes, 3rd
 * ed., sect. 6.2, eqs. 6.2.5 and 6.2.7). ln Gamma(k/2) is exact for the integer
 * and half-integer arguments that occur here (sum of logarithms), so no fitted
 * coefficients are needed. Checked against scipy.stats.chi2.sf.
 */

/** ln Gamma(k / 2) for a positive integer k, from Gamma(1) = 1, Gamma(1/2) = sqrt(pi), Gamma(a + 1) = a Gamma(a). */
function lnGammaHalfInteger(k: number): number {
  let a = k % 2 === 0 ? 1 : 0.5;
  let s = k % 2 === 0 ? 0 : 0.5 * Math.log(Math.PI);
  while (a < k / 2) { s += Math.log(a); a += 1; }
  return s;
}

/** Lower regularised P(a, x) by the series e^-x x^a / Gamma(a) sum x^n / (a (a+1) ... (a+n)). */
function lowerSeries(a: number, x: number, lnGa: number): number {
  let ap = a, del = 1 / a, sum = del;
  for (let n = 0; n < 10000; n++) {
    ap += 1;
    del *= x / ap;
    sum += del;
    if (Math.abs(del) < Math.abs(sum) * 1e-16) break;
  }
  return sum * Math.exp(-x + a * Math.log(x) - lnGa);
}

/** Upper regularised Q(a, x) by the continued fraction (modified Lentz). */
function upperFraction(a: number, x: number, lnGa: number): number {
  const tiny = 1e-300;
  let b = x + 1 - a, c = 1 / tiny, d = 1 / b, h = d;
  for (let i = 1; i < 10000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return Math.exp(-x + a * Math.log(x) - lnGa) * h;
}

/**
 * Probability that a chi-square variable with `dof` degrees of freedom (a
 * positive integer) is at least `chi2` (>= 0). NaN for invalid arguments.
 * Check value: chi2 = dof = 1 gives 0.3173 (the one-sigma two-sided probability).
 */
export function chiSquareSurvival(chi2: number, dof: number): number {
  if (!(chi2 >= 0) || !(Number.isInteger(dof) && dof >= 1)) return NaN;
  if (chi2 === 0) return 1;
  if (chi2 === Infinity) return 0;
  const a = dof / 2, x = chi2 / 2, lnGa = lnGammaHalfInteger(dof);
  return x < a + 1 ? 1 - lowerSeries(a, x, lnGa) : upperFraction(a, x, lnGa);
}

/**
 * x with P(chi^2_dof >= x) = alpha (0 < alpha < 1), by bisection on
 * {@link chiSquareSurvival} to 1e-12 relative. Check value: alpha 0.05,
 * dof 2 gives -2 ln 0.05 = 5.9915 (the chi^2_2 survival is exp(-x/2)).
 */
export function chiSquareUpperQuantile(alpha: number, dof: number): number {
  if (!(alpha > 0 && alpha < 1)) return NaN;
  let lo = 0, hi = 1;
  while (chiSquareSurvival(hi, dof) > alpha) hi *= 2;
  while (hi - lo > 1e-12 * hi) {
    const mid = 0.5 * (lo + hi);
    if (chiSquareSurvival(mid, dof) > alpha) lo = mid; else hi = mid;
  }
  return 0.5 * (lo + hi);
}
