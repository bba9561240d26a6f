/**
 * The split normal (two-piece normal) distribution, skyspan's reading of a
 * value quoted with asymmetric errors, "mode -sigmaLow +sigmaHigh" (Wallis
 * 2014, "The two-piece normal, binormal, or double Gaussian distribution: its
 * origin and rediscoveries", Statistical Science 29, 106, eq. 1):
 *
 *   f(x) = A exp(-(x - m)^2 / (2 sL^2))  for x <= m,
 *   f(x) = A exp(-(x - m)^2 / (2 sH^2))  for x >  m,   A = sqrt(2/pi) / (sL + sH).
 *
 * The mode m is the quoted value; the probability below it is sL / (sL + sH).
 * Note that the quoted errors are not the 16 and 84 percent points unless
 * sL = sH. Sampling is {@link Random.splitNormal}; this module holds the
 * closed forms derived from the density (CDF, quantile, mean, variance).
 */
import { normalCdf, normalQuantile } from './normal.js';

/** Distribution function of the split normal at x. */
export function splitNormalCdf(x: number, mode: number, sigmaLow: number, sigmaHigh: number): number {
  const total = sigmaLow + sigmaHigh;
  if (total === 0) return x < mode ? 0 : 1;
  if (x <= mode) return sigmaLow === 0 ? 0 : (2 * sigmaLow / total) * normalCdf((x - mode) / sigmaLow);
  if (sigmaHigh === 0) return 1;
  return sigmaLow / total + (2 * sigmaHigh / total) * (normalCdf((x - mode) / sigmaHigh) - 0.5);
}

/**
 * Quantile of the split normal: for p <= sL / (sL + sH),
 * x = m + sL Phi^-1(p (sL + sH) / (2 sL)); above, x = m + sH Phi^-1((p (sL + sH) - sL + sH) / (2 sH))
 * (the inverse of {@link splitNormalCdf}). p in [0, 1].
 */
export function splitNormalQuantile(p: number, mode: number, sigmaLow: number, sigmaHigh: number): number {
  const total = sigmaLow + sigmaHigh;
  if (!(p >= 0 && p <= 1)) return NaN;
  if (total === 0) return mode;
  const pLow = sigmaLow / total;
  if (p <= pLow) return mode + sigmaLow * normalQuantile((p * total) / (2 * sigmaLow));
  return mode + sigmaHigh * normalQuantile((p * total - sigmaLow + sigmaHigh) / (2 * sigmaHigh));
}

/** Mean of the split normal: m + sqrt(2/pi) (sH - sL) (Wallis 2014, sect. 2). */
export function splitNormalMean(mode: number, sigmaLow: number, sigmaHigh: number): number {
  return mode + Math.sqrt(2 / Math.PI) * (sigmaHigh - sigmaLow);
}

/** Variance of the split normal: (1 - 2/pi) (sH - sL)^2 + sL sH (Wallis 2014, sect. 2). */
export function splitNormalVariance(sigmaLow: number, sigmaHigh: number): number {
  const d = sigmaHigh - sigmaLow;
  return (1 - 2 / Math.PI) * d * d + sigmaLow * sigmaHigh;
}
