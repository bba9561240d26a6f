/**
 * One Monte Carlo realisation of a population, stored as a struct of typed
 * arrays (no per-source objects), so 1e5 to 1e6 sources fit in memory.
 *
 * Disc: R from the tabulated inverse CDF (radialSampler.ts), azimuth uniform,
 * z from the Laplace distribution of scale h (z = -h ln u, random sign).
 * Ball: distance d = R_b u^(1/3), direction isotropic. Direction (l, b) in the
 * Galactic frame with the template builder's convention: the Sun at
 * (R_sun, 0, z_sun), the unit vector toward (l, b) is
 * (-cos b cos l, -cos b sin l, sin b), so l = 0 points at the Galactic centre.
 *
 * Flux at the pivot: S = L / (4 pi d^2), d in cm (inverse-square law); the
 * differential flux at energy E is
 * phi(E) = S [erg -> GeV] / E0^2 (E/E0)^-Gamma exp(-(E - E0)/Ec) in
 * GeV^-1 cm^-2 s^-1. Angular radius: atan(size / d).
 */
import { InputError } from '../core/errors.js';
import { assertFits } from '../core/memory.js';
import { ERG_GEV, KPC_CM } from '../physics/constants.js';
import type { Random } from '../compare/random.js';
import { drawLuminosities } from './luminosity.js';
import type { PopulationModel } from './model.js';
import { radialTable, radiusAt, type RadialTable } from './radialSampler.js';

/** Sources of one realisation; index i of every array is source i. */
export interface SourceRealisation {
  count: number;
  /** Galactic longitude in [0, 2 pi) and latitude (rad). */
  lRad: Float64Array;
  bRad: Float64Array;
  distanceKpc: Float64Array;
  /** E0^2 dN/dE luminosity at the pivot (erg s^-1). */
  luminosityErgPerS: Float64Array;
  /** E0^2 dN/dE flux at the pivot (erg cm^-2 s^-1). */
  fluxErgCm2S: Float64Array;
  /** Photon index of each source. */
  index: Float32Array;
  /** Angular radius (rad), or null for point-like sources. */
  radiusRad: Float64Array | null;
  energiesGeV: Float64Array;
  pivotGeV: number;
  /** Differential flux (GeV^-1 cm^-2 s^-1) at [i * nE + e]. */
  fluxAtEnergies: Float64Array;
}

/** A reusable sampler (the radial table is built once per model). */
export interface PopulationSampler {
  model: PopulationModel;
  table: RadialTable | null;
}

/** Checks the model and tabulates its radial law. */
export function populationSampler(model: PopulationModel): PopulationSampler {
  if (!(model.count >= 0 && Number.isFinite(model.count))) throw new InputError(`count is ${model.count}, expected >= 0`, { keyPath: 'count' });
  const s = model.spatial;
  if (s.kind === 'disc') {
    if (!(s.scaleHeightKpc > 0)) throw new InputError(`scale height is ${s.scaleHeightKpc} kpc, expected > 0`, { keyPath: 'spatial.scaleHeightKpc' });
    if (!(s.rMaxKpc > 0)) throw new InputError(`rMaxKpc is ${s.rMaxKpc}, expected > 0`, { keyPath: 'spatial.rMaxKpc' });
    return { model, table: radialTable(s.law, s.rSunKpc, s.rMaxKpc) };
  }
  if (!(s.radiusKpc > 0)) throw new InputError(`radius is ${s.radiusKpc} kpc, expected > 0`, { keyPath: 'spatial.radiusKpc' });
  return { model, table: null };
}

/**
 * Mean number density n0 (kpc^-3) at the density's reference point: for a
 * disc n(R, z) = n0 f(R) exp(-|z|/h) with N = n0 2h int f 2 pi R dR; for a
 * ball N / (4/3 pi R_b^3).
 */
export function referenceDensityPerKpc3(s: PopulationSampler): number {
  const sp = s.model.spatial;
  if (sp.kind === 'ball') return s.model.count / ((4 / 3) * Math.PI * sp.radiusKpc ** 3);
  return s.model.count / (2 * sp.scaleHeightKpc * s.table!.areaKpc2);
}

/**
 * Bytes one realisation of `count` sources with `energies` energies holds at
 * its peak: seven per-source arrays (6 x 8 + 4 bytes), the fluxes at the
 * energies (8 per energy) and as much as 32 bytes a source of working arrays
 * (resolved flags, region weights, pixel indices). Common practice, no source.
 */
export function realisationBytes(count: number, energies: number): number {
  return count * (84 + 8 * energies);
}

/**
 * Throws a ComputeError (core/memory.ts, SKYSPAN_MEMORY_LIMIT_BYTES honoured)
 * when a realisation of `count` sources, with `tableBytes` of per-realisation
 * result tables beside it, would not fit.
 */
export function assertRealisationFits(count: number, energies: number, tableBytes = 0): void {
  assertFits(realisationBytes(count, energies) + tableBytes, `a realisation of ${count.toPrecision(3)} sources at ${energies} energies`
    + (tableBytes > 0 ? ' with its result tables' : ''),
    `lower count (a source takes about ${realisationBytes(1, energies)} bytes), the realisations or the number of energies`);
}

/** Draws one realisation of round(model.count) sources (a fixed number per realisation). */
export function drawRealisation(s: PopulationSampler, rng: Random): SourceRealisation {
  const m = s.model, n = Math.round(m.count), sp = m.spatial;
  assertRealisationFits(n, m.energiesGeV.length);
  const lRad = new Float64Array(n), bRad = new Float64Array(n), dist = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (sp.kind === 'ball') {
      dist[i] = sp.radiusKpc * Math.cbrt(rng.uniform());
      bRad[i] = Math.asin(2 * rng.uniform() - 1);
      lRad[i] = 2 * Math.PI * rng.uniform();
      continue;
    }
    const R = radiusAt(s.table!, rng.uniform()), ph = 2 * Math.PI * rng.uniform();
    const u = 1 - rng.uniform(); // in (0, 1]
    const z = (rng.uniform() < 0.5 ? -1 : 1) * sp.scaleHeightKpc * -Math.log(u);
    const dx = R * Math.cos(ph) - sp.rSunKpc, dy = R * Math.sin(ph), dz = z - sp.zSunKpc;
    const d = Math.sqrt(dx * dx + dy * dy + dz * dz);
    dist[i] = d;
    bRad[i] = d > 0 ? Math.asin(dz / d) : 0;
    let l = Math.atan2(-dy, -dx);
    if (l < 0) l += 2 * Math.PI;
    lRad[i] = l;
  }
  const lum = new Float64Array(n);
  drawLuminosities(m.luminosity, rng, lum, n);
  const flux = new Float64Array(n);
  const k = 1 / (4 * Math.PI * KPC_CM * KPC_CM);
  for (let i = 0; i < n; i++) flux[i] = (lum[i] * k) / (dist[i] * dist[i]);
  const spec = m.spectrum, index = new Float32Array(n);
  for (let i = 0; i < n; i++) index[i] = spec.indexSpread > 0 ? spec.index + spec.indexSpread * rng.normal() : spec.index;
  let radiusRad: Float64Array | null = null;
  const sz = m.size;
  if (sz.kind !== 'point') {
    radiusRad = new Float64Array(n);
    const lo = Math.log(sz.kind === 'fixed' ? sz.radiusPc : sz.minPc), hi = Math.log(sz.kind === 'fixed' ? sz.radiusPc : sz.maxPc);
    for (let i = 0; i < n; i++) radiusRad[i] = Math.atan((Math.exp(lo + (hi - lo) * rng.uniform()) * 1e-3) / dist[i]);
  }
  const energies = Float64Array.from(m.energiesGeV), nE = energies.length, e0 = spec.pivotGeV;
  const lnE = Float64Array.from(energies, (e) => Math.log(e / e0));
  const cut = Float64Array.from(energies, (e) => (spec.cutoffGeV === null ? 1 : Math.exp(-(e - e0) / spec.cutoffGeV)));
  const fluxAt = new Float64Array(n * nE), toDiff = ERG_GEV / (e0 * e0);
  for (let i = 0; i < n; i++) {
    const base = flux[i] * toDiff, g = index[i];
    for (let e = 0; e < nE; e++) fluxAt[i * nE + e] = base * Math.exp(-g * lnE[e]) * cut[e];
  }
  return { count: n, lRad, bRad, distanceKpc: dist, luminosityErgPerS: lum, fluxErgCm2S: flux, index, radiusRad, energiesGeV: energies, pivotGeV: e0, fluxAtEnergies: fluxAt };
}
