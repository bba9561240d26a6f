/**
 * Building a {@link SkyMap} from parts, with every invariant checked once.
 */
import { InputError, type InputLocation } from '../core/errors.js';
import { assertNside, nside2npix, type Ordering } from '../sphere/nside.js';
import type { FrameName } from '../sphere/frames.js';
import type { MapArray, SkyMap } from './skyMap.js';

/** What {@link createSkyMap} needs; column defaults to 'VALUE', unit to ''. */
export interface SkyMapInit {
  nside: number;
  ordering: Ordering;
  frame: FrameName;
  column?: string;
  unit?: string;
  planes: MapArray[];
  /** One energy per plane in GeV (positive, finite), or omitted/null for no energy axis. */
  energiesGeV?: ArrayLike<number> | null;
  meta?: Record<string, string | number | boolean>;
}

const FRAMES: readonly FrameName[] = ['galactic', 'equatorial', 'unknown'];

/**
 * Validates and assembles a SkyMap. Throws {@link InputError} (with `where` as
 * location) when Nside is not a power of two up to 8192, a plane does not hold
 * 12 Nside^2 values, the ordering or frame is unknown, or the energies do not
 * match the planes. Plane arrays are used as given (not copied).
 *
 * @example
 * createSkyMap({ nside: 1, ordering: 'RING', frame: 'galactic', planes: [new Float32Array(12)] });
 */
export function createSkyMap(init: SkyMapInit, where: InputLocation = {}): SkyMap {
  assertNside(init.nside, where);
  if (init.ordering !== 'RING' && init.ordering !== 'NESTED') {
    throw new InputError(`ordering is '${String(init.ordering)}', expected RING or NESTED`, where);
  }
  if (!FRAMES.includes(init.frame)) {
    throw new InputError(`frame is '${String(init.frame)}', expected galactic, equatorial or unknown`, where);
  }
  if (!Array.isArray(init.planes) || init.planes.length === 0) {
    throw new InputError('a map needs at least one plane', where);
  }
  const npix = nside2npix(init.nside);
  init.planes.forEach((p, i) => {
    if (!(p instanceof Float32Array || p instanceof Float64Array)) {
      throw new InputError(`plane ${i} is not a Float32Array or Float64Array`, where);
    }
    if (p.length !== npix) {
      throw new InputError(`plane ${i} holds ${p.length} values, expected 12 Nside^2 = ${npix} for Nside ${init.nside}`, where);
    }
  });
  let energies: Float64Array | null = null;
  if (init.energiesGeV != null) {
    energies = Float64Array.from(init.energiesGeV);
    if (energies.length !== init.planes.length) {
      throw new InputError(`${energies.length} energies for ${init.planes.length} planes`, where, 'give one energy per plane');
    }
    energies.forEach((e, i) => {
      if (!(e > 0) || !Number.isFinite(e)) throw new InputError(`energy ${i} is ${e} GeV, expected a positive finite value`, where);
    });
  }
  const map: SkyMap = {
    nside: init.nside,
    ordering: init.ordering,
    frame: init.frame,
    column: init.column ?? 'VALUE',
    unit: init.unit ?? '',
    planes: init.planes,
    energiesGeV: energies,
    ...(init.meta ? { meta: init.meta } : {}),
  };
  return map;
}

/** A new plane of the same element type as `like`, holding n values. */
export function newPlaneLike(like: MapArray, n: number): MapArray {
  return like instanceof Float32Array ? new Float32Array(n) : new Float64Array(n);
}
