/**
 * Detection thresholds: exposure scaling, zero exposure, threshold maps,
 * extension penalty; and the luminosity-function draws.
 */
import { describe, expect, it } from 'vitest';
import { Random } from '../../src/compare/random.js';
import { createSkyMap } from '../../src/maps/create.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { convertLonLat } from '../../src/sphere/frameRotation.js';
import { angToRing } from '../../src/sphere/pixelIndex.js';
import { drawLuminosities, meanLuminosity } from '../../src/populations/luminosity.js';
import type { SourceRealisation } from '../../src/populations/realise.js';
import { resolvedFlags, thresholdsOf, type DetectionThreshold } from '../../src/populations/threshold.js';

const deg = Math.PI / 180;

/** Sources at the given equatorial positions (rad) with fluxes, as a realisation. */
function atEquatorial(radec: [number, number][], flux: number[], radiusRad?: number[]): SourceRealisation {
  const n = radec.length, l = new Float64Array(n), b = new Float64Array(n);
  radec.forEach(([ra, dec], i) => { const g = convertLonLat(ra, dec, 'equatorial', 'galactic'); l[i] = g.lonRad; b[i] = g.latRad; });
  return {
    count: n, lRad: l, bRad: b, distanceKpc: new Float64Array(n).fill(1), luminosityErgPerS: new Float64Array(n),
    fluxErgCm2S: Float64Array.from(flux), index: new Float32Array(n), radiusRad: radiusRad ? Float64Array.from(radiusRad) : null,
    energiesGeV: new Float64Array([1e4]), pivotGeV: 1e4, fluxAtEnergies: Float64Array.from(flux),
  };
}

const site: DetectionThreshold = {
  kind: 'exposure', fluxErgCm2S: 1e-12, referenceDecRad: 30 * deg, siteLatRad: 30 * deg, maxZenithRad: 45 * deg,
  weighting: 'zenith', exposurePower: 1, psfRad: 0.2 * deg,
};

describe('detection thresholds', () => {
  it('scale with the inverse relative exposure and are infinite where the site sees nothing', () => {
    // Relative exposure of a site at +30 deg, zenith <= 45 deg, normalised to its maximum (computed
    // with scipy, scripts/exposure_reference.py; Sommers 2001 eq. 2): 0 deg -> 0.591552, 30 deg -> 0.974231,
    // 60 deg -> 0.850181, -20 deg -> 0.
    const r = atEquatorial([[1, 30 * deg], [2, 0], [3, 60 * deg], [4, -20 * deg]], [1, 1, 1, 1]);
    const t = thresholdsOf(r, { ...site, psfRad: null });
    expect(t[0] / 1e-12).toBeCloseTo(1, 5);
    expect(t[1] / 1e-12).toBeCloseTo(0.974231 / 0.591552, 4);
    expect(t[2] / 1e-12).toBeCloseTo(0.974231 / 0.850181, 4);
    expect(t[3]).toBe(Infinity);
    const half = thresholdsOf(r, { ...site, psfRad: null, exposurePower: 0.5 });
    expect(half[1] / 1e-12).toBeCloseTo(Math.sqrt(0.974231 / 0.591552), 4);
  });

  it('grow by sqrt(r^2 + psf^2) / psf for extended sources, never below the point-source value', () => {
    // Background-limited growth with the integration radius (common practice, no source).
    const r = atEquatorial([[1, 30 * deg], [1, 30 * deg], [1, 30 * deg]], [1e-12, 1.5e-12, 1.3e-12], [0.2 * deg, 0.2 * deg, 0]);
    const t = thresholdsOf(r, site);
    expect(t[0] / 1e-12).toBeCloseTo(Math.SQRT2, 5);
    expect(t[2] / 1e-12).toBeCloseTo(1, 5);
    expect(Array.from(resolvedFlags(r, site))).toEqual([0, 1, 1]);
  });

  it('come from a threshold map at the source pixel; blank pixels never resolve', () => {
    const nside = 4, plane = new Float64Array(192).fill(2e-12);
    const r = atEquatorial([[1, 0.3], [2.5, -0.4]], [3e-12, 3e-12]);
    const p1 = angToRing(nside, Math.PI / 2 - r.bRad[1], r.lRad[1]);
    plane[p1] = BLANK;
    const map = createSkyMap({ nside, ordering: 'RING', frame: 'galactic', planes: [plane] });
    const t = thresholdsOf(r, { kind: 'map', map, psfRad: null });
    expect(t[0]).toBe(2e-12);
    expect(t[1]).toBe(Infinity);
    expect(Array.from(resolvedFlags(r, { kind: 'none' }))).toEqual([0, 0]);
  });
});

describe('luminosity function', () => {
  it('draws a power law whose sample mean and median match the closed forms', () => {
    // dN/dL ~ L^-1.8 on [1e33, 1e35]: CDF (L^-0.8 - a^-0.8) / (b^-0.8 - a^-0.8) (calculus, common knowledge).
    const lf = { kind: 'powerLaw' as const, alpha: 1.8, minErgPerS: 1e33, maxErgPerS: 1e35 };
    const out = new Float64Array(200000);
    drawLuminosities(lf, new Random(8), out);
    const a = 1e33 ** -0.8, b = 1e35 ** -0.8, median = Math.pow(a + 0.5 * (b - a), -1 / 0.8);
    const below = out.filter((x) => x < median).length / out.length;
    expect(Math.abs(below - 0.5)).toBeLessThan(0.005); // binomial sigma 0.0011
    const mean = out.reduce((s, x) => s + x, 0) / out.length;
    const closed = (0.8 / 0.2) * (1e35 ** 0.2 - 1e33 ** 0.2) / (1e33 ** -0.8 - 1e35 ** -0.8);
    expect(meanLuminosity(lf) / closed).toBeCloseTo(1, 10);
    expect(Math.abs(mean / closed - 1)).toBeLessThan(0.02);
  });

  it('gives the log-normal mean 10^mu exp((sigma ln 10)^2 / 2)', () => {
    // Moment of the log-normal distribution (common knowledge).
    const lf = { kind: 'logNormal' as const, medianErgPerS: 1e34, sigmaDex: 0.3 };
    const out = new Float64Array(200000);
    drawLuminosities(lf, new Random(9), out);
    const mean = out.reduce((s, x) => s + x, 0) / out.length;
    expect(Math.abs(mean / meanLuminosity(lf) - 1)).toBeLessThan(0.01);
    expect(meanLuminosity(lf) / (1e34 * Math.exp(0.5 * (0.3 * Math.LN10) ** 2))).toBeCloseTo(1, 12);
  });
});
