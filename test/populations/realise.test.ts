/**
 * Per-source quantities of a realisation: flux from luminosity and distance,
 * spectra against the physics layer's spectral models, angular sizes,
 * positions in another frame, the vertical and radial distributions.
 */
import { describe, expect, it } from 'vitest';
import { Random } from '../../src/compare/random.js';
import { evaluateSpectrum } from '../../src/physics/spectrum.js';
import { convertLonLat } from '../../src/sphere/frameRotation.js';
import { drawRealisation, populationSampler } from '../../src/populations/realise.js';
import { sourceLonLat } from '../../src/populations/sourcePixels.js';
import { radialLaw, RADIAL_LAWS } from '../../src/templates/radialLaws.js';
import { lorimerModel } from './fixtures.js';

const KPC_CM = 3.0857e21; // IAU 2015 Resolution B2 parsec x 1000 (from memory)

describe('a realisation', () => {
  const model = { ...lorimerModel(20000, 0.2), size: { kind: 'fixed' as const, radiusPc: 10 } };
  const r = drawRealisation(populationSampler(model), new Random(31));

  it('has F = L / (4 pi d^2) with d in cm, and spectra equal to the physics layer\'s cutoff power law', () => {
    // Inverse-square law (common knowledge); spectral form checked against physics/spectrum.ts.
    for (let i = 0; i < 50; i++) {
      const d = r.distanceKpc[i] * KPC_CM;
      expect(r.fluxErgCm2S[i] / (r.luminosityErgPerS[i] / (4 * Math.PI * d * d))).toBeCloseTo(1, 4);
      const m = { kind: 'cutoffPowerLaw' as const, norm: 1, index: r.index[i], e0GeV: 1e4, cutoffGeV: 2e5 };
      const at0 = (r.fluxErgCm2S[i] * 624.150907) / 1e8; // erg -> GeV (from memory), / E0^2
      for (let e = 0; e < 3; e++) {
        const expected = (at0 * evaluateSpectrum(m, model.energiesGeV[e])) / evaluateSpectrum(m, 1e4);
        expect(r.fluxAtEnergies[i * 3 + e] / expected).toBeCloseTo(1, 6);
      }
      expect(Math.tan(r.radiusRad![i]) * r.distanceKpc[i]).toBeCloseTo(0.01, 12); // 10 pc = 0.01 kpc
    }
  });

  it('gives positions in the equatorial frame that match the frame conversion of the sphere layer', () => {
    const { lon, lat } = sourceLonLat(r, 'equatorial');
    for (let i = 0; i < 50; i++) {
      const c = convertLonLat(r.lRad[i], r.bRad[i], 'galactic', 'equatorial');
      expect(lat[i]).toBeCloseTo(c.latRad, 12);
      expect(Math.cos(lon[i] - c.lonRad)).toBeCloseTo(1, 12);
    }
  });

  it('follows the radial law and the exponential vertical profile', () => {
    // Recover R and z from (l, b, d) with the builder's geometry and compare with the law (Lorimer et al. 2006
    // parameters, from memory) binned in R, and with <|z|> = h for a Laplace distribution (common knowledge).
    const nb = 15, counts = new Float64Array(nb); // 2-kpc bins out to R_max = 30 kpc
    let absZ = 0;
    for (let i = 0; i < r.count; i++) {
      const cb = Math.cos(r.bRad[i]), d = r.distanceKpc[i];
      const x = 8.5 - d * cb * Math.cos(r.lRad[i]), y = -d * cb * Math.sin(r.lRad[i]);
      absZ += Math.abs(d * Math.sin(r.bRad[i]));
      const R = Math.hypot(x, y), k = Math.floor(R / 2);
      if (k < nb) counts[k]++;
    }
    expect(Math.abs(absZ / r.count / 0.2 - 1)).toBeLessThan(0.03);
    let norm = 0;
    const expected = Array.from({ length: nb }, (_, k) => {
      let s = 0;
      for (let j = 0; j < 200; j++) { const R = 2 * k + (2 * (j + 0.5)) / 200; s += radialLaw(RADIAL_LAWS.lorimer2006, R, 8.5) * R; }
      norm += s; return s;
    });
    for (let k = 0; k < 6; k++) {
      const e = (expected[k] / norm) * r.count;
      expect(Math.abs(counts[k] - e)).toBeLessThan(4 * Math.sqrt(e) + 1);
    }
  });
});
