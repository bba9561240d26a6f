/**
 * HEALPix map files: read (plain or .fits.gz) and write. The reading rules
 * are in mapRead.ts, the writing rules in mapWrite.ts, the energy-cube layout
 * in mapLayout.ts.
 */
import { statSync } from 'node:fs';
import { InputError } from '../core/errors.js';
import { assertFits } from '../core/memory.js';
import type { SkyMap } from '../maps/skyMap.js';
import { gunzipWithinMemory, isGzip, loadFitsBytes } from './fits/source.js';
import { walkHdus } from './fits/hdu.js';
import { readMapsFromHdus, type MapFileContents, type ReadMapOptions } from './mapRead.js';

export type { MapFileContents, ReadMapOptions } from './mapRead.js';
export type { HduSummary, ColumnSummary } from './hduSummary.js';
export { writeMapFile, type WriteMapOptions } from './mapWrite.js';
export { describeFitsFile, type FitsDescription } from './fitsDescribe.js';

/**
 * Reads every map of a HEALPix FITS file: one SkyMap per map column, an
 * energy cube as one SkyMap with a plane per energy. Partial-sky maps come
 * back full-sky with BLANK (-1.6375e30) where no value was given.
 * `options.frame` supplies the frame when COORDSYS is missing or unknown.
 */
export function readMapFile(path: string, options: ReadMapOptions = {}): MapFileContents {
  checkFileMemory(path, options.memoryLimitBytes);
  const bytes = loadFitsBytes(path, options.memoryLimitBytes);
  const hdus = walkHdus(bytes, path);
  return readMapsFromHdus(bytes, hdus, path, options);
}

/** Refuses a plain (not gzip) file larger than the memory available, before reading it. */
function checkFileMemory(path: string, limitBytes: number | undefined): void {
  let size: number;
  try { size = /\.gz$/i.test(path) ? 0 : statSync(path).size; } catch { return; } // unreadable: loadFitsBytes says why
  if (size > 0) {
    assertFits(size, `reading ${path}`, 'lower its Nside where memory allows (skyspan remap IN OUT --nside N), or split it into one map column per file', limitBytes);
  }
}

/**
 * Reads the maps of a FITS file already in memory (plain or gzip), named
 * `file` in error messages. The bytes may be changed (decoded in place).
 */
export function readMapBytes(bytes: Uint8Array, file: string, options: ReadMapOptions = {}): MapFileContents {
  const plain = isGzip(bytes) ? gunzipWithinMemory(bytes, file, options.memoryLimitBytes) : bytes;
  return readMapsFromHdus(plain, walkHdus(plain, file), file, options);
}

/** Reads one map: the first, or the column given by name or 1-based number among the maps. */
export function readSkyMap(path: string, options: ReadMapOptions & { column?: string | number } = {}): SkyMap {
  const { maps } = readMapFile(path, options);
  const which = options.column;
  if (which === undefined) return maps[0];
  const found = typeof which === 'number' ? maps[which - 1]
    : maps.find((m) => m.column.toUpperCase() === which.toUpperCase());
  if (!found) {
    throw new InputError(`has no map column ${JSON.stringify(which)}`, { file: path },
      `available: ${maps.map((m) => m.column).join(', ')}`);
  }
  return found;
}
