/**
 * Small synthetic maps for the picture tests, made in code (no files): a field
 * given as a function of Galactic (l, b) in radians, sampled at RING pixel centres.
 */
import { ringTable } from '../../src/sphere/ringTable.js';
import type { SkyMap } from '../../src/maps/skyMap.js';

/** A RING map whose pixel centres hold f(lonRad, latRad). */
export function fieldMap(nside: number, f: (lon: number, lat: number) => number, frame: 'galactic' | 'equatorial' = 'galactic', unit = 'test unit'): SkyMap {
  const t = ringTable(nside);
  const plane = new Float64Array(12 * nside * nside);
  for (let r = 0; r < t.count; r++) {
    const lat = Math.PI / 2 - t.theta[r];
    for (let j = 0; j < t.length[r]; j++) plane[t.first[r] + j] = f(t.phi0[r] + j * t.dphi[r], lat);
  }
  return { nside, ordering: 'RING', frame, column: 'TEST', unit, planes: [plane], energiesGeV: null };
}

/** cos of the angle between (lon, lat) and (lon0, lat0), all radians: a dipole field. */
export function cosAngle(lon: number, lat: number, lon0: number, lat0: number): number {
  return Math.sin(lat) * Math.sin(lat0) + Math.cos(lat) * Math.cos(lat0) * Math.cos(lon - lon0);
}
