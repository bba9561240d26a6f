/**
 * Relative exposure per pixel for a region with a weighted site: Sommers'
 * closed form (exposure.ts) at each pixel centre's declination, normalised to
 * a maximum of 1 over declination; or a user's HEALPix exposure map, sampled
 * at the pixel centres (bilinear on the map's own pixels when its Nside or
 * frame differ) and normalised to its maximum. Pixels outside the region get 0.
 */
import { resolve } from 'node:path';
import { InputError } from '../core/errors.js';
import { rotationMatrix } from '../sphere/frameRotation.js';
import { ringTable } from '../sphere/ringTable.js';
import { isBlank } from '../maps/blank.js';
import { interpolateRing } from '../maps/interpolate.js';
import { reorder } from '../maps/reorder.js';
import { readSkyMap } from '../io/mapFile.js';
import { exposureNormalisation, relativeExposure } from './exposure.js';
import type { Program } from './program.js';

/**
 * Fills and returns the exposure array of a compiled region with a weighted
 * site; spans[2r], spans[2r+1] bound the pixels of ring r that may be inside
 * (-1: none).
 */
export function fillExposure(prog: Program, nside: number, fraction: Float32Array, spans: Int32Array, baseDir: string,
  regionFile: string | undefined, notes: string[]): Float32Array {
  const site = prog.site;
  if (!site) throw new Error('fillExposure needs a weighted site');
  const out = new Float32Array(fraction.length);
  const t = ringTable(nside);
  if (site.weight.kind === 'zenith' || site.weight.kind === 'time') {
    const w = site.weight.kind;
    const norm = exposureNormalisation(site.latRad, site.maxZenithRad, w).max;
    const m = rotationMatrix(prog.templateFrame, 'equatorial');
    const native = prog.templateFrame === 'equatorial';
    for (let r = 0; r < t.count; r++) {
      const z = t.z[r], st = t.sinTheta[r], first = t.first[r];
      if (spans[2 * r] < 0) continue;
      const ringValue = native ? relativeExposure(Math.atan2(z, st), site.latRad, site.maxZenithRad, w) / norm : 0;
      for (let j = spans[2 * r]; j <= spans[2 * r + 1]; j++) {
        const p = first + j;
        if (fraction[p] === 0) continue;
        if (native) { out[p] = ringValue; continue; }
        const phi = t.phi0[r] + j * t.dphi[r];
        const ze = m[6] * st * Math.cos(phi) + m[7] * st * Math.sin(phi) + m[8] * z;
        out[p] = relativeExposure(Math.asin(ze > 1 ? 1 : ze < -1 ? -1 : ze), site.latRad, site.maxZenithRad, w) / norm;
      }
    }
    notes.push(`exposure: ${w === 'zenith' ? 'cos(zenith)-weighted (Sommers 2001)' : 'time-weighted'} for a site at latitude `
      + `${(site.latRad * 180 / Math.PI).toFixed(4)} deg, zenith <= ${(site.maxZenithRad * 180 / Math.PI).toFixed(4)} deg, `
      + 'taken at pixel centres, normalised to a maximum of 1');
    return out;
  }
  const wm = site.weight;
  const path = resolve(baseDir, wm.file);
  let map = readSkyMap(path, { column: wm.column, frame: wm.frame });
  if (map.frame !== 'galactic' && map.frame !== 'equatorial') {
    throw new InputError('the exposure map does not say its frame (COORDSYS)', { file: regionFile, keyPath: `${site.keyPath}.site.weight.frame` },
      'add frame: galactic or equatorial to the weight');
  }
  map = reorder(map, 'RING');
  const plane = map.planes[0];
  let max = 0;
  for (let i = 0; i < plane.length; i++) { const v = plane[i]; if (!isBlank(v) && v > max) max = v; }
  if (!(max > 0)) throw new InputError('the exposure map has no positive value', { file: path });
  const same = map.nside === nside && map.frame === prog.templateFrame;
  const m = rotationMatrix(prog.templateFrame, map.frame);
  let blanks = 0;
  for (let r = 0; r < t.count; r++) {
    const z = t.z[r], st = t.sinTheta[r], first = t.first[r];
    if (spans[2 * r] < 0) continue;
    for (let j = spans[2 * r]; j <= spans[2 * r + 1]; j++) {
      const p = first + j;
      if (fraction[p] === 0) continue;
      let v: number;
      if (same) v = plane[p];
      else {
        const phi = t.phi0[r] + j * t.dphi[r];
        const x = st * Math.cos(phi), y = st * Math.sin(phi);
        const xr = m[0] * x + m[1] * y + m[2] * z, yr = m[3] * x + m[4] * y + m[5] * z, zr = m[6] * x + m[7] * y + m[8] * z;
        v = interpolateRing(plane, map.nside, Math.atan2(Math.sqrt(xr * xr + yr * yr), zr), Math.atan2(yr, xr));
      }
      if (isBlank(v) || !(v > 0)) { if (isBlank(v)) blanks++; v = 0; }
      out[p] = v / max;
    }
  }
  notes.push(`exposure: from the map ${wm.file}${same ? '' : ` (Nside ${map.nside}, ${map.frame}; interpolated bilinearly at pixel centres)`}, normalised to its maximum`);
  if (blanks > 0) notes.push(`exposure map: ${blanks} region pixels fall on blank values and get exposure 0`);
  return out;
}
