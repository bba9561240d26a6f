/**
 * Projection of a predicted sky onto the neutrino analysis's own spatial
 * template: the normalisation N that analysis would quote if the sky were
 * the predicted one.
 *
 * The neutrino analysis describes the sky as N T(i) (T its template, i the
 * pixel) and weighs each pixel by its acceptance a(i) >= 0 (effective area
 * times exposure time: where it is sensitive). The acceptance-weighted
 * least-squares normalisation of a predicted sky P minimises
 *
 *   chi2(N) = sum_i a_i (P_i - N T_i)^2.
 *
 * Setting the derivative to zero,
 *
 *   d chi2 / dN = -2 sum_i a_i T_i (P_i - N T_i) = 0
 *   =>  N sum_i a_i T_i^2 = sum_i a_i P_i T_i
 *   =>  N = sum(a P T) / sum(a T^2),
 *
 * and d2 chi2 / dN2 = 2 sum a T^2 > 0, so it is the minimum whenever some
 * a_i T_i is non-zero (a standard weighted projection; common practice, no
 * source). Two properties the tests check: P = c T gives N = c for any a
 * (the numerator is c times the denominator), and a constant a cancels
 * (the unweighted least-squares normalisation). Without an acceptance map,
 * a = 1. Pixel area cancels (HEALPix pixels have equal area, Gorski et al.
 * 2005). Pixels where P, T or a is blank (NaN or the HEALPix sentinel) are
 * skipped and counted.
 */
import { ComputeError, InputError } from '../core/errors.js';
import { BLANK } from '../maps/skyMap.js';

/** The two sums of the projection and the pixels that entered them. */
export interface ProjectionSums {
  /** sum(a P T). */
  numerator: number;
  /** sum(a T^2). */
  denominator: number;
  /** Pixels used (all three values present); pixels skipped as blank. */
  pixels: number;
  blank: number;
}

const BLANK_TOL = 1e-5 * Math.abs(BLANK);

/**
 * Kernel: the sums of {@link projectNormalisation} over n pixels, with
 * Neumaier-compensated accumulation (Neumaier 1974, ZAMM 54, 39; as in
 * core/math.ts, inlined). `a` null means a = 1. Trusts its inputs
 * (lengths >= n, a >= 0 where present).
 */
export function projectionSums(p: ArrayLike<number>, t: ArrayLike<number>, a: ArrayLike<number> | null, n: number): ProjectionSums {
  let num = 0, numC = 0, den = 0, denC = 0, pixels = 0, blank = 0;
  for (let i = 0; i < n; i++) {
    const pv = p[i], tv = t[i], av = a === null ? 1 : a[i];
    if (pv !== pv || tv !== tv || av !== av || Math.abs(pv - BLANK) <= BLANK_TOL || Math.abs(tv - BLANK) <= BLANK_TOL
      || Math.abs(av - BLANK) <= BLANK_TOL) { blank++; continue; }
    pixels++;
    const at = av * tv;
    const x = at * pv, y = at * tv;
    let s = num + x;
    numC += Math.abs(num) >= Math.abs(x) ? (num - s) + x : (x - s) + num;
    num = s;
    s = den + y;
    denC += Math.abs(den) >= Math.abs(y) ? (den - s) + y : (y - s) + den;
    den = s;
  }
  return { numerator: num + numC, denominator: den + denC, pixels, blank };
}

/**
 * The acceptance-weighted least-squares normalisation N = sum(a P T) / sum(a T^2)
 * of a predicted sky `p` on the template `t` (see module comment), all on the
 * same pixel grid; N is in units of P per unit of T. `a` (optional) must be
 * >= 0 wherever it is not blank. Throws InputError for mismatched lengths or
 * a negative acceptance, ComputeError when sum(a T^2) is not positive.
 *
 * @example projectNormalisation(Float64Array.of(2, 4), Float64Array.of(1, 2), null) // 2
 */
export function projectNormalisation(p: ArrayLike<number>, t: ArrayLike<number>, a: ArrayLike<number> | null = null): number {
  const n = t.length;
  if (p.length !== n || (a !== null && a.length !== n)) {
    throw new InputError(`the predicted sky (${p.length}), template (${n}) and acceptance (${a?.length ?? n}) have different pixel counts`, { keyPath: 'acceptance' },
      'bring them to one grid first');
  }
  if (a !== null) {
    for (let i = 0; i < n; i++) {
      const v = a[i];
      if (v < 0 && Math.abs(v - BLANK) > BLANK_TOL) throw new InputError(`acceptance is ${v} at pixel ${i}, expected >= 0`, { keyPath: 'acceptance' });
    }
  }
  const s = projectionSums(p, t, a, n);
  if (!(s.denominator > 0)) {
    throw new ComputeError(`sum(a T^2) over the neutrino template is ${s.denominator} (${s.pixels} pixels used); the template and acceptance do not overlap`);
  }
  return s.numerator / s.denominator;
}
