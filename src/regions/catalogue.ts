/**
 * Source catalogues for masks: a CSV file with one source per row (name,
 * longitude, latitude, frame, optional radius, in degrees), read into radians.
 *
 * Radius of each mask disc: the row's radius if given, else the default
 * radius of the region; when the instrument's angular resolution is given,
 * the radius grows in quadrature, r = sqrt(r_src^2 + (k psf)^2) (the 1-sigma
 * extents of a source and of a Gaussian point-spread function add in
 * quadrature; common practice, no source).
 */
import { resolve, dirname } from 'node:path';
import { didYouMean } from '../core/didYouMean.js';
import { InputError } from '../core/errors.js';
import { degToRad } from '../sphere/angles.js';
import { readCsv } from '../io/csv.js';
import type { RegionNode, ShapeFrame } from './types.js';

/** Mask discs of a catalogue, one entry per row, angles in radians. */
export interface SourceList {
  file: string;
  names: string[];
  lonRad: Float64Array;
  latRad: Float64Array;
  frames: ShapeFrame[];
  radiusRad: Float64Array;
}

const FRAME_WORDS: Record<string, ShapeFrame> = { galactic: 'galactic', equatorial: 'equatorial' };

/**
 * Reads the catalogue of a `sources` region. `regionFile` and `keyPath` locate
 * the region in messages; `baseDir` resolves a relative catalogue path.
 */
export function readSourceList(
  node: RegionNode & { kind: 'sources' }, baseDir: string, regionFile: string | undefined,
): SourceList {
  const path = resolve(baseDir, node.file);
  const csv = readCsv(path);
  const col = (role: keyof typeof node.columns, required: boolean): number => {
    const name = node.columns[role];
    const i = csv.header.indexOf(name);
    if (i < 0 && required) {
      const near = didYouMean(name, csv.header);
      throw new InputError(`found no column '${name}' in the header of ${node.file} (line ${csv.headerLine}; its columns: ${csv.header.join(', ')}), expected the ${role} column`,
        { file: regionFile, keyPath: `${node.keyPath}.sources.columns.${role}` },
        `${near ? `${near} ` : ''}name the column with columns.${role}`);
    }
    return i;
  };
  const iName = col('name', false);
  const iLon = col('lon', true);
  const iLat = col('lat', true);
  const iFrame = col('frame', node.frame === null);
  const iRadius = col('radius', node.defaultRadiusRad === null);
  const n = csv.rows.length;
  const out: SourceList = {
    file: path, names: [], lonRad: new Float64Array(n), latRad: new Float64Array(n), frames: [], radiusRad: new Float64Array(n),
  };
  for (let r = 0; r < n; r++) {
    const row = csv.rows[r];
    const where = { file: path, line: csv.rowNumbers[r] };
    const num = (i: number, what: string, lo: number, hi: number, loOpen = false): number => {
      const text = (row[i] ?? '').trim();
      const v = text === '' ? NaN : Number(text);
      if (!(loOpen ? v > lo : v >= lo) || !(v <= hi)) {
        throw new InputError(`column ${csv.header[i]}: found ${JSON.stringify(text)}, expected ${what} ${loOpen ? 'above' : 'from'} ${lo} ${loOpen ? 'and at most' : 'to'} ${hi} deg`, where);
      }
      return v;
    };
    out.names.push(iName >= 0 ? (row[iName] ?? '').trim() : `row ${csv.rowNumbers[r]}`);
    out.lonRad[r] = degToRad(num(iLon, 'a longitude', -360, 360));
    out.latRad[r] = degToRad(num(iLat, 'a latitude', -90, 90));
    let frame: ShapeFrame | null = node.frame;
    const ft = iFrame >= 0 ? (row[iFrame] ?? '').trim().toLowerCase() : '';
    if (ft !== '') {
      frame = FRAME_WORDS[ft] ?? null;
      if (!frame) throw new InputError(`column ${csv.header[iFrame]}: found ${JSON.stringify(ft)}, expected galactic or equatorial`, where);
    }
    if (!frame) throw new InputError(`column ${csv.header[iFrame]}: found an empty frame, expected galactic or equatorial (or give frame on the region)`, where);
    out.frames.push(frame);
    const rt = iRadius >= 0 ? (row[iRadius] ?? '').trim() : '';
    let rad: number;
    if (rt === '') {
      if (node.defaultRadiusRad === null) {
        throw new InputError(`column ${csv.header[iRadius]}: found an empty radius, expected a radius (or give radiusDeg on the region)`, where);
      }
      rad = node.defaultRadiusRad;
    } else {
      rad = degToRad(num(iRadius, 'a radius', 0, 180, true));
    }
    if (node.growth) {
      const g = node.growth.times * node.growth.psfRad;
      rad = Math.sqrt(rad * rad + g * g);
    }
    out.radiusRad[r] = rad;
  }
  return out;
}

/** Folder against which the relative paths of a region file are resolved. */
export function regionBaseDir(file: string | undefined, baseDir: string | undefined): string {
  return baseDir ?? (file ? dirname(resolve(file)) : process.cwd());
}
