import { describe, expect, it } from 'vitest';
import { declinationBand, exposureNormalisation, hourAngleHalfWidth, relativeExposure } from '../../src/regions/exposure.js';
import { requirePython, runPython, skipWithoutPython } from '../helpers/python.js';

const d = (x: number): number => (x * Math.PI) / 180;

// Independent numerical integral over hour angle of cos(zenith), with
// cos(zenith) = sin(a0) sin(delta) + cos(a0) cos(delta) cos(h) (spherical
// astronomy, common knowledge). The edge of the range zenith < cut is found by
// bisection on cos(zenith(h)) - cos(cut), not from the closed form; the
// integral is Gauss-Legendre (20 points) on 64 panels. Positive nodes and their weights: Abramowitz & Stegun
// 1964, Table 25.4, n = 20 (from memory); the same as numpy.polynomial.legendre.leggauss(20) (Debian numpy,
// checked once by hand; the numeric integral below is itself checked against scripts/exposure_reference.py).
const GL_X = [0.0765265211334973, 0.2277858511416451, 0.3737060887154195, 0.5108670019508271, 0.6360536807265150,
  0.7463319064601508, 0.8391169718222188, 0.9122344282513259, 0.9639719272779138, 0.9931285991850949];
const GL_W = [0.1527533871307258, 0.1491729864726037, 0.1420961093183820, 0.1316886384491766, 0.1181945319615184,
  0.1019301198172404, 0.0832767415767048, 0.0626720483341091, 0.0406014298003869, 0.0176140071391521];

function numericExposure(dec: number, lat: number, cut: number, weighting: 'zenith' | 'time'): number {
  const cz = (h: number): number => Math.sin(lat) * Math.sin(dec) + Math.cos(lat) * Math.cos(dec) * Math.cos(h);
  const c = Math.cos(cut);
  let edge: number;
  if (cz(0) <= c) edge = 0;
  else if (cz(Math.PI) >= c) edge = Math.PI;
  else {
    let a = 0, b = Math.PI;
    for (let i = 0; i < 64; i++) { const m = (a + b) / 2; if (cz(m) > c) a = m; else b = m; }
    edge = (a + b) / 2;
  }
  if (weighting === 'time') return edge;
  const panels = 64;
  let sum = 0;
  for (let p = 0; p < panels; p++) {
    const lo = (edge * p) / panels, hi = (edge * (p + 1)) / panels, mid = (lo + hi) / 2, half = (hi - lo) / 2;
    for (let k = 0; k < 10; k++) sum += GL_W[k] * half * (cz(mid - half * GL_X[k]) + cz(mid + half * GL_X[k]));
  }
  return sum; // one half of the integral over [-edge, edge]
}

describe('relative exposure of a ground site (Sommers 2001, Astropart. Phys. 14, 271, eqs. 2-3)', () => {
  const lats = [-35, 0, 19, 33, 60];
  const cuts = [30, 45, 60, 70];

  it('equals the numerical integral of cos(zenith) over hour angle to 1e-6 (site latitudes -35..60, cuts 30..70 deg)', () => {
    let worst = 0, never = 0, always = 0;
    for (const lat of lats) for (const cut of cuts) {
      for (let k = -900; k <= 900; k += 7) {
        const dec = d(k / 10);
        const closed = relativeExposure(dec, d(lat), d(cut), 'zenith');
        const num = numericExposure(dec, d(lat), d(cut), 'zenith');
        worst = Math.max(worst, Math.abs(closed - num));
        const am = hourAngleHalfWidth(dec, d(lat), d(cut));
        if (am === 0) never++;
        if (am === Math.PI) always++;
        expect(Math.abs(relativeExposure(dec, d(lat), d(cut), 'time') - numericExposure(dec, d(lat), d(cut), 'time'))).toBeLessThan(1e-7); // acos near xi = 1 costs ~sqrt(eps)
      }
    }
    expect(worst).toBeLessThan(1e-6);
    // the grid holds declinations that never enter the cut and ones that never leave it (alpha_m = pi)
    expect(never).toBeGreaterThan(50);
    expect(always).toBeGreaterThan(10);
  });

  it('gives alpha_m = pi near the pole for a site whose cut reaches over the pole (lat 60, cut 45 deg)', () => {
    // at dec 80 deg the zenith angle stays within [20, 40] deg all day (spherical geometry)
    expect(hourAngleHalfWidth(d(80), d(60), d(45))).toBe(Math.PI);
    expect(relativeExposure(d(90), d(60), d(45), 'zenith')).toBeCloseTo(Math.PI * Math.sin(d(60)), 12);
  });

  it('spot values for a site at +30 deg with a 45 deg cut, normalised to max 1 (computed by scipy integration, scripts/exposure_reference.py)', () => {
    const { max, decRad } = exposureNormalisation(d(30), d(45), 'zenith');
    const rel = (dec: number): number => relativeExposure(d(dec), d(30), d(45), 'zenith') / max;
    expect(rel(0)).toBeCloseTo(0.591552, 6);
    expect(rel(30)).toBeCloseTo(0.974231, 6);
    expect(rel(60)).toBeCloseTo(0.850181, 6);
    expect(rel(-20)).toBe(0);
    expect(rel(75)).toBe(0);
    expect((decRad * 180) / Math.PI).toBeCloseTo(39.6097, 4);
    expect(max).toBeCloseTo(0.845234, 6);
    // the values above are the "spot" output of scripts/exposure_reference.py (rounded; checked to 1e-6 below).
    // Time-weighted maximum by hand: alpha_m = arccos[(cos t_m - sin a sin d) / (cos a cos d)] (spherical
    // astronomy, Sommers 2001, Astropart. Phys. 14, 271, eq. 2); its argument is smallest where
    // cos t_m sin d = sin a, i.e. sin d = 0.5 / 0.707107 -> d = 45 deg, argument (0.707107 - 0.353553) / 0.612372
    // = 1/sqrt(3), alpha_m = arccos(1/sqrt(3)) = 0.9553166 rad
    const t = exposureNormalisation(d(30), d(45), 'time');
    expect(Math.abs(t.max / Math.acos(1 / Math.sqrt(3)) - 1)).toBeLessThan(1e-6);
    expect((t.decRad * 180) / Math.PI).toBeCloseTo(45, 4);
  });

  it.skipIf(skipWithoutPython)('agrees with scripts/exposure_reference.py (scipy brentq + quad) to 1e-6', () => {
    requirePython(); // under CI=true a missing reference fails here
    const ref = JSON.parse(runPython('scripts/exposure_reference.py')) as {
      grid: [number, number, number, number, number][];
      spot: { values: Record<string, number>; maxDecDeg: number; maxRaw: number };
    };
    expect(ref.grid.length).toBe(5 * 4 * 61);
    for (const [lat, cut, dec, z, t] of ref.grid) {
      expect(Math.abs(relativeExposure(d(dec), d(lat), d(cut), 'zenith') - z)).toBeLessThan(1e-6);
      expect(Math.abs(relativeExposure(d(dec), d(lat), d(cut), 'time') - t)).toBeLessThan(1e-6);
    }
    const { max, decRad } = exposureNormalisation(d(30), d(45), 'zenith');
    expect(Math.abs(max - ref.spot.maxRaw)).toBeLessThan(1e-9);
    expect(Math.abs((decRad * 180) / Math.PI - ref.spot.maxDecDeg)).toBeLessThan(1e-5);
    for (const [dec, v] of Object.entries(ref.spot.values)) {
      expect(Math.abs(relativeExposure(d(Number(dec)), d(30), d(45), 'zenith') / max - v)).toBeLessThan(1e-6);
    }
  });

  it('declination band is |dec - lat| <= cut, clipped at the poles, exactly where alpha_m > 0 (spherical geometry)', () => {
    const b = declinationBand(d(33), d(45));
    expect(b.minRad).toBeCloseTo(d(-12), 14);
    expect(b.maxRad).toBeCloseTo(d(78), 14);
    expect(declinationBand(d(60), d(45)).maxRad).toBe(Math.PI / 2);
    expect(hourAngleHalfWidth(d(-12.001), d(33), d(45))).toBe(0);
    expect(hourAngleHalfWidth(d(-11.999), d(33), d(45))).toBeGreaterThan(0);
  });
});
