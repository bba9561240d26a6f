/**
 * Pixel centres of the RING scheme written out directly from Gorski et al. 2005
 * (ApJ 622, 759, section 4, the polar-cap and equatorial-belt formulas),
 * independently of src/sphere, for the tests to compare against.
 */

/** Centre (z = cos theta, phi) of RING pixel p at Nside n. */
export function gorskiCentre(n: number, p: number): { z: number; phi: number; ring: number } {
  const npix = 12 * n * n;
  const ncap = 2 * n * (n - 1);
  if (p < ncap) {
    // North polar cap: p_h = (p + 1)/2, i = floor(sqrt(p_h - sqrt(floor(p_h)))) + 1, j = p + 1 - 2i(i - 1).
    const ph = (p + 1) / 2;
    const i = Math.floor(Math.sqrt(ph - Math.sqrt(Math.floor(ph)))) + 1;
    const j = p + 1 - 2 * i * (i - 1);
    return { z: 1 - (i * i) / (3 * n * n), phi: (Math.PI / (2 * i)) * (j - 0.5), ring: i };
  }
  if (p < npix - ncap) {
    // Belt: p' = p - 2N(N - 1), i = floor(p'/4N) + N, j = (p' mod 4N) + 1, s = ((i - N) mod 2) + 1.
    const pp = p - ncap;
    const i = Math.floor(pp / (4 * n)) + n;
    const j = (pp % (4 * n)) + 1;
    const s = ((i - n) % 2) + 1;
    return { z: 4 / 3 - (2 * i) / (3 * n), phi: (Math.PI / (2 * n)) * (j - s / 2), ring: i };
  }
  // South polar cap, the mirror image: p_s = npix - p, counted from the south pole.
  const ps = npix - p;
  const ph = ps / 2;
  const i = Math.floor(Math.sqrt(ph - Math.sqrt(Math.floor(ph)))) + 1;
  const j = 4 * i + 1 - (ps - 2 * i * (i - 1));
  return { z: -(1 - (i * i) / (3 * n * n)), phi: (Math.PI / (2 * i)) * (j - 0.5), ring: 4 * n - i };
}

/** RING index of the first pixel of ring i (1-based) at Nside n. */
export function ringStart(n: number, i: number): number {
  if (i < n) return 2 * i * (i - 1);
  if (i <= 3 * n) return 2 * n * (n - 1) + (i - n) * 4 * n;
  const is = 4 * n - i;
  return 12 * n * n - 2 * is * (is + 1);
}
