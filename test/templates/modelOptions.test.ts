import { describe, expect, it } from 'vitest';
import { parseTemplateSpec } from '../../src/templates/templateSpec.js';
import { prepareIntegration, integrateToward } from '../../src/templates/lineOfSight.js';

const KPC_CM = 3.085677581491367e21;
const HALF_PI = Math.PI / 2;

function toward(yaml: string, lDeg: number, bDeg: number, energies: number[] | null = null): Float64Array {
  const s = parseTemplateSpec(`name: t\n${yaml}`);
  const k = prepareIntegration(s, energies, 0, null);
  return integrateToward(k, s, (lDeg * Math.PI) / 180, (bDeg * Math.PI) / 180).plain;
}

describe('energy axis, user expressions, observer height, source templates', () => {
  it('a radial change of the spectral index gives (1 - exp(-g L D)) / (g L) toward the anticentre', () => {
    // Uniform gas, R = R_sun + s toward l = 180 deg; plane E is weighted by (E/E0)^(-g (R - R_sun)) = exp(-g L s),
    // L = ln(E/E0): the integral from 0 to D is closed-form (common practice, no source).
    const g = 0.05, D = 10, energies = [10, 1000, 1e5];
    const v = toward(`gas: [{component: uniform, densityCm3: 1}]\ncosmicRays: {distribution: constant, indexGradientPerKpc: ${g}, pivotGeV: 1000}\nintegration: {maxDistanceKpc: ${D}}`, 180, 0, energies);
    energies.forEach((e, i) => {
      const L = Math.log(e / 1000);
      const exact = L === 0 ? D : (1 - Math.exp(-g * L * D)) / (g * L);
      expect(Math.abs(v[i] / (exact * KPC_CM) - 1)).toBeLessThan(1e-5);
    });
    // Toward the pole R stays R_sun: every plane equals the pivot plane.
    const pole = toward(`gas: [{component: uniform, densityCm3: 1}]\ncosmicRays: {distribution: constant, indexGradientPerKpc: ${g}}\nintegration: {maxDistanceKpc: ${D}}`, 0, 90, energies);
    expect(Math.abs(pole[0] / pole[1] - 1)).toBeLessThan(1e-6);
  });

  it('a user expression equal to a built-in component gives the same column', () => {
    // Same function (common practice, no source); expressions are tabulated on a grid 4x coarser in R and 2x in u,
    // so the difference is that coarser table's interpolation error (spacing 2 pc near the plane against h = 150 pc).
    const a = toward('gas: [{component: expression, expression: "0.8 * exp(-abs(z) / 0.15) * exp(-(R - 8.5) / 4)"}]\ncosmicRays: {distribution: constant}', 30, 5);
    const b = toward('gas: [{component: exponentialSlab, densityCm3: 0.8, scaleHeightKpc: 0.15}]\ncosmicRays: {distribution: expression, expression: "exp(-(R - 8.5) / 4)"}', 30, 5);
    expect(Math.abs(a[0] / b[0] - 1)).toBeLessThan(1e-4);
  });

  it('an observer at height z0 above an exponential slab sees n0 h e^(-z0/h) up and n0 h (2 - e^(-z0/h)) down', () => {
    // Integral of n0 exp(-|z0 +- s|/h) over s from 0 to infinity (common practice, no source). Looking down, the
    // mid-plane kink falls inside a quadrature segment (segments are the same for every pixel), hence 5e-4.
    const h = 0.2, z0 = 0.1;
    const yaml = `observer: {rSunKpc: 8.178, zSunKpc: ${z0}}\ngas: [{component: exponentialSlab, densityCm3: 1, scaleHeightKpc: ${h}}]\ncosmicRays: {distribution: constant}`;
    const up = toward(yaml, 0, 90)[0], down = toward(yaml, 0, -90)[0];
    expect(Math.abs(up / (h * Math.exp(-z0 / h) * KPC_CM) - 1)).toBeLessThan(1e-4);
    expect(Math.abs(down / (h * (2 - Math.exp(-z0 / h)) * KPC_CM) - 1)).toBeLessThan(5e-4);
  });

  it('a source template toward the pole is h (kpc) and follows the radial law in the plane', () => {
    // Radial law = 1 at R_sun, integral of exp(-z/h) is h; toward l = 0, b = 0 the law is sampled at R = R_sun - s.
    const v = toward('sources: {distribution: lorimer2006, scaleHeightKpc: 0.3}', 0, 90)[0];
    expect(Math.abs(v / 0.3 - 1)).toBeLessThan(1e-4);
    const centre = toward('sources: {distribution: lorimer2006, scaleHeightKpc: 0.3}', 0, 0)[0];
    const anti = toward('sources: {distribution: lorimer2006, scaleHeightKpc: 0.3}', 180, 0)[0];
    expect(centre).toBeGreaterThan(5 * anti);
  });

  it('the R_sun = 8.178 kpc option moves the cosmic-ray normalisation to the new solar circle', () => {
    // rho_CR = 1 at the Sun by construction: toward the pole a uniform gas column to D is D times the
    // halo's mean vertical factor (linear halo: 1 - D/(2H)), whatever R_sun is.
    for (const r of [8.5, 8.178]) {
      const v = toward(`observer: {rSunKpc: ${r}}\ngas: [{component: uniform, densityCm3: 1}]\ncosmicRays: {distribution: green2015, haloHeightKpc: 4}\nintegration: {maxDistanceKpc: 2}`, 0, 90)[0];
      expect(Math.abs(v / (2 * (1 - 2 / 8) * KPC_CM) - 1)).toBeLessThan(1e-5);
    }
  });

  it('an expression that goes negative within reach names its key path', () => {
    // Common practice, no source: densities are >= 0; the check runs on the tabulation grid.
    expect(() => toward('gas: [{component: expression, expression: "1 - R / 10"}]\ncosmicRays: {distribution: constant}', 0, 0))
      .toThrow(/^key gas\[0\]\.expression: expression gives -[0-9.e-]+ at R = /);
  });
});

describe('tables reused between builds', () => {
  it('a model grid depends only on its own spec, whatever was built before it', async () => {
    // Gas and cosmic-ray tables are kept between builds (modelGrid.ts); a grid must not pick up another
    // spec's table. The H2 factor scales the gas linearly (common practice, no source), so with the same
    // cosmic rays the difference of two H2 factors is proportional to their difference; another halo
    // height must change the grid; a repeat must be identical.
    const { buildModelGrid } = await import('../../src/templates/modelGrid.js');
    const gas = (f: number) => `gas:\n  - {component: hiDickeyLockman}\n  - {component: h2Ferriere2001, factor: ${f}}\n`;
    const cr = (h: number) => `cosmicRays: {distribution: green2015, haloHeightKpc: ${h}}`;
    const grid = (y: string) => buildModelGrid(parseTemplateSpec(`name: t\n${y}`), [1e4, 1e6], 20, { dRKpc: 0.1, nU: 129 }).values;
    const a = grid(gas(2) + cr(4)), b = grid(gas(3) + cr(4)), c = grid(gas(4) + cr(4)), h = grid(gas(2) + cr(6)), again = grid(gas(2) + cr(4));
    expect(Array.from(again)).toEqual(Array.from(a));
    let worst = 0, moved = 0;
    for (let i = 0; i < a.length; i++) {
      const d1 = b[i] - a[i], d2 = c[i] - b[i];
      if (Math.abs(d1) > 1e-2 * Math.abs(a[i])) worst = Math.max(worst, Math.abs(d2 / d1 - 1));
      if (h[i] !== a[i]) moved++;
    }
    expect(worst).toBeLessThan(1e-4); // single-precision grid: differences above 1 % of the value lose at most ~1e-5
    expect(moved).toBeGreaterThan(a.length / 4);
    // In the mid-plane (u = 0, vertical factor 1) the two halo heights differ only through the smoothed
    // radial profile, computed here directly.
    const { smoothedRadialProfile } = await import('../../src/templates/cosmicRays.js');
    const { RADIAL_LAWS } = await import('../../src/templates/radialLaws.js');
    const nR = a.length / (129 * 2), rs = Float64Array.from({ length: nR }, (_, i) => i * 0.1);
    const p4 = smoothedRadialProfile(RADIAL_LAWS.green2015, 8.5, 4, rs), p6 = smoothedRadialProfile(RADIAL_LAWS.green2015, 8.5, 6, rs);
    let worstRatio = 0;
    for (let i = 10; i < 150; i += 7) {
      const node = (i * 129 + 64) * 2;
      worstRatio = Math.max(worstRatio, Math.abs(a[node] / h[node] / (p4[i] / p6[i]) - 1));
    }
    expect(worstRatio).toBeLessThan(1e-6);
  });
});
