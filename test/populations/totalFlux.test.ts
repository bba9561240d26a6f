/**
 * The total flux of a realisation against the luminosity function times the
 * line-of-sight integral of the source density: directly, and through the
 * template builder's map of the same density.
 */
import { describe, expect, it } from 'vitest';
import { Random } from '../../src/compare/random.js';
import { summedFlux } from '../../src/populations/counts.js';
import { meanLuminosity } from '../../src/populations/luminosity.js';
import { drawRealisation, populationSampler, referenceDensityPerKpc3 } from '../../src/populations/realise.js';
import { buildTemplate } from '../../src/templates/buildTemplate.js';
import { parseTemplateSpec } from '../../src/templates/templateSpec.js';
import { radialLaw, RADIAL_LAWS } from '../../src/templates/radialLaws.js';
import { lorimerModel } from './fixtures.js';

const KPC_CM = 3.0857e21; // cm per kpc, from the IAU 2015 Resolution B2 parsec (from memory)
const ERG_GEV = 624.150907; // GeV per erg, 1 / 1.602176634e-3 (SI electronvolt, from memory)
const H = 0.2, R_SUN = 8.5, R_MAX = 30;

/** Gauss-Legendre nodes and weights on [-1, 1] by Newton on P_n (common practice, no source). */
function gaussLegendre(n: number): { x: number[]; w: number[] } {
  const x: number[] = [], w: number[] = [];
  for (let i = 1; i <= n; i++) {
    let z = Math.cos((Math.PI * (i - 0.25)) / (n + 0.5)), dp = 0;
    for (let it = 0; it < 100; it++) {
      let p0 = 1, p1 = z;
      for (let k = 2; k <= n; k++) { const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k; p0 = p1; p1 = p2; }
      dp = (n * (z * p1 - p0)) / (z * z - 1);
      const dz = p1 / dp; z -= dz;
      if (Math.abs(dz) < 1e-15) break;
    }
    x.push(z); w.push(2 / ((1 - z * z) * dp * dp));
  }
  return { x, w };
}

/**
 * int dOmega int_{dMin}^{sMax} f(R) exp(-|z|/h) ds (kpc sr) for the Lorimer et al. 2006 law cut at R_MAX,
 * Sun in the plane. Over x = |sin b| with t = s x / h (the vertical factor becomes exp(-t)), Gauss-Legendre
 * panels in s and t, periodic trapezoid in l (common practice, no source).
 */
function directIntegral(dMin: number, sMax: number): number {
  const g = gaussLegendre(8), law = RADIAL_LAWS.lorimer2006, nL = 64;
  const tEdges = [0, 1, 2.5, 5, 10, 20, 40];
  let total = 0;
  for (let s0 = dMin; s0 < sMax - 1e-12; s0 += 0.25) {
    const s1 = Math.min(sMax, s0 + 0.25);
    for (let a = 0; a < 8; a++) {
      const s = 0.5 * (s0 + s1) + 0.5 * (s1 - s0) * g.x[a], ws = 0.5 * (s1 - s0) * g.w[a];
      const tMax = s / H, shrink = Math.min(1, tMax / 40);
      let inner = 0;
      for (let p = 0; p + 1 < tEdges.length; p++) {
        const t0 = tEdges[p] * shrink, t1 = tEdges[p + 1] * shrink;
        for (let c = 0; c < 8; c++) {
          const t = 0.5 * (t0 + t1) + 0.5 * (t1 - t0) * g.x[c], wt = 0.5 * (t1 - t0) * g.w[c];
          const x = (t * H) / s, cb = Math.sqrt(1 - x * x);
          let sumL = 0;
          for (let k = 0; k < nL; k++) {
            const l = (2 * Math.PI * k) / nL;
            const R = Math.sqrt(R_SUN * R_SUN + s * s * cb * cb - 2 * R_SUN * s * cb * Math.cos(l));
            if (R <= R_MAX) sumL += radialLaw(law, R, R_SUN);
          }
          inner += wt * Math.exp(-t) * (H / s) * sumL * ((2 * Math.PI) / nL);
        }
      }
      total += ws * 2 * inner; // both hemispheres
    }
  }
  return total;
}

describe('total flux of a realisation', () => {
  const model = lorimerModel(2e5, H);
  const sampler = populationSampler(model);

  it('is the sum over its sources, energy by energy', () => {
    // Identity (common practice, no source): summedFlux against a plain loop.
    const r = drawRealisation(sampler, new Random(5));
    const s = summedFlux(r, null, null);
    for (let e = 0; e < 3; e++) {
      let plain = 0;
      for (let i = 0; i < r.count; i++) plain += r.fluxAtEnergies[i * 3 + e];
      expect(Math.abs(s[e] / plain - 1)).toBeLessThan(1e-10);
    }
  });

  it('averages to n0 <L> / (4 pi) times the line-of-sight integral of the density (1 %)', () => {
    // Expected sum over sources beyond d_min = 1 kpc: n0 <L> / (4 pi kpc^2) int dOmega int_{d_min} rho ds (inverse-square
    // law and dV = s^2 ds dOmega; common knowledge). Sources nearer than d_min are left out of both
    // sides: their 1/d^2 fluxes give the sum an infinite variance (the S^-3/2 tail), so the mean would not
    // settle. Each energy also carries E[(E/E0)^-Gamma] = exp(-mu x + sigma^2 x^2 / 2), x = ln(E/E0), for a
    // normal index, and the cutoff factor exp(-(E - E0)/Ec) (log-normal moment, common knowledge).
    const dMin = 1, M = 16, nE = 3;
    const sums = new Float64Array(M * nE);
    const rng = new Random(77);
    for (let r = 0; r < M; r++) {
      const real = drawRealisation(sampler, rng);
      for (let i = 0; i < real.count; i++) {
        if (real.distanceKpc[i] <= dMin) continue;
        for (let e = 0; e < nE; e++) sums[r * nE + e] += real.fluxAtEnergies[i * nE + e];
      }
    }
    const integral = directIntegral(dMin, R_SUN + R_MAX);
    const n0 = referenceDensityPerKpc3(sampler), mean = meanLuminosity(model.luminosity);
    for (let e = 0; e < nE; e++) {
      const E = model.energiesGeV[e], x = Math.log(E / 1e4);
      const spec = Math.exp(-2.4 * x + 0.5 * 0.04 * x * x) * Math.exp(-(E - 1e4) / 2e5);
      const expected = (n0 * mean * ERG_GEV / 1e8 * spec * integral) / (4 * Math.PI * KPC_CM * KPC_CM);
      let m = 0, ss = 0;
      for (let r = 0; r < M; r++) m += sums[r * nE + e] / M;
      for (let r = 0; r < M; r++) ss += (sums[r * nE + e] - m) ** 2;
      const stdErr = Math.sqrt(ss / (M - 1) / M) / m;
      expect(stdErr).toBeLessThan(0.004); // the Monte Carlo error leaves room inside the 1 % check
      console.log(`total flux E=${E} GeV: MC/expected - 1 = ${(m / expected - 1).toExponential(2)}, MC std error ${stdErr.toExponential(2)}`);
      expect(Math.abs(m / expected - 1)).toBeLessThan(0.01);
    }
  });

  it('the template builder\'s map of the same density has the same sky integral (1 %)', async () => {
    // The template builder integrates f(R) exp(-|z|/h) along every line of sight (kpc); its sky sum times the
    // pixel area must equal the direct integral from d = 0 (both computations of one quantity; the density
    // beyond R = 30 kpc, which the template keeps, is 1e-6 of the total for this law).
    const spec = parseTemplateSpec({ name: 'lorimer-disc', sources: { distribution: 'lorimer2006', scaleHeightKpc: H },
      observer: { rSunKpc: R_SUN, zSunKpc: 0 }, integration: { maxDistanceKpc: R_SUN + R_MAX, stepKpc: 0.25, nodesPerSegment: 6 } });
    const { map } = await buildTemplate(spec, { nside: 16, oversample: 4, workers: 1 });
    let sky = 0;
    for (const v of map.planes[0]) sky += v;
    sky *= (4 * Math.PI) / map.planes[0].length;
    const direct = directIntegral(0, R_SUN + R_MAX);
    console.log(`template sky integral / direct - 1 = ${(sky / direct - 1).toExponential(2)}`);
    expect(Math.abs(sky / direct - 1)).toBeLessThan(0.01);
  });
});
