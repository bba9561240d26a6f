/**
 * Test fixtures for the factor kernels: hand-made region weights and the
 * analytic template that scripts/factor_reference.py evaluates too.
 */
import { ringTable } from '../../src/sphere/ringTable.js';
import { nside2npix, pixelAreaSr } from '../../src/sphere/nside.js';
import { ringToNest } from '../../src/sphere/pixelIndex.js';
import type { RegionWeightsLike } from '../../src/scaling/regionPixels.js';
import type { SkyMap } from '../../src/maps/skyMap.js';

/** Region weights with fraction 1 on the listed RING pixels (or as given per pixel). */
export function weightsFromPixels(
  nside: number, name: string, pixels: ArrayLike<number>, opts: { fraction?: ArrayLike<number>; exposure?: ArrayLike<number> } = {},
): RegionWeightsLike {
  const npix = nside2npix(nside);
  const fraction = new Float32Array(npix);
  const exposure = opts.exposure ? new Float32Array(npix) : null;
  let sum = 0;
  for (let k = 0; k < pixels.length; k++) {
    const f = opts.fraction ? opts.fraction[k] : 1;
    fraction[pixels[k]] = f;
    sum += f;
    if (exposure) exposure[pixels[k]] = opts.exposure![k];
  }
  return { nside, frame: 'galactic', name, mode: 'centre', fraction, exposure, solidAngleSr: sum * pixelAreaSr(nside), notes: [] };
}

/** Region weights of the pixels whose centre (theta, phi in rad) passes `inside`. */
export function weightsFromPredicate(nside: number, name: string, inside: (theta: number, phi: number) => boolean): RegionWeightsLike {
  const t = ringTable(nside);
  const pixels: number[] = [];
  for (let r = 0; r < t.count; r++) {
    for (let j = 0; j < t.length[r]; j++) {
      if (inside(t.theta[r], t.phi0[r] + j * t.dphi[r])) pixels.push(t.first[r] + j);
    }
  }
  return weightsFromPixels(nside, name, pixels);
}

/** The whole sky, fraction 1 everywhere. */
export function wholeSky(nside: number, name = 'sky'): RegionWeightsLike {
  const w = weightsFromPixels(nside, name, []);
  w.fraction.fill(1);
  return { ...w, solidAngleSr: 4 * Math.PI };
}

/**
 * T(l, b) = (1 + 0.5 cos l) exp(-b^2 / (2 (5 deg)^2)) + 0.05 + 0.02 sin(3 l) cos b,
 * the formula of scripts/factor_reference.py, at RING pixel centres; stored
 * in `ordering` (NESTED via ringToNest).
 */
export function analyticTemplate(nside: number, ordering: 'RING' | 'NESTED' = 'RING', blankStride = 0, blank = NaN): SkyMap {
  const t = ringTable(nside);
  const plane = new Float64Array(nside2npix(nside));
  const sig = (5 * Math.PI) / 180;
  for (let r = 0; r < t.count; r++) {
    const b = Math.PI / 2 - t.theta[r];
    for (let j = 0; j < t.length[r]; j++) {
      const l = t.phi0[r] + j * t.dphi[r];
      const p = t.first[r] + j;
      let v = (1 + 0.5 * Math.cos(l)) * Math.exp((-b * b) / (2 * sig * sig)) + 0.05 + 0.02 * Math.sin(3 * l) * Math.cos(b);
      if (blankStride > 0 && p % blankStride === 0) v = blank;
      plane[ordering === 'NESTED' ? ringToNest(nside, p) : p] = v;
    }
  }
  return { nside, ordering, frame: 'galactic', column: 'T', unit: 'arb', planes: [plane], energiesGeV: null };
}

/** A map of one constant value in every pixel. */
export function uniformTemplate(nside: number, value = 1, ordering: 'RING' | 'NESTED' = 'RING'): SkyMap {
  const plane = new Float32Array(nside2npix(nside)).fill(value);
  return { nside, ordering, frame: 'galactic', column: 'T', unit: 'arb', planes: [plane], energiesGeV: null };
}

/** An evaluator over a fixed set of region weights, keyed by name. */
export function fixedEvaluator(regions: RegionWeightsLike[]) {
  const byName = new Map(regions.map((r) => [r.name, r]));
  return (name: string, o: { nside: number }) => {
    const r = byName.get(name);
    if (!r) throw new Error(`no region ${name}`);
    if (r.nside !== o.nside) throw new Error(`region ${name} is at Nside ${r.nside}, asked for ${o.nside}`);
    return r;
  };
}
