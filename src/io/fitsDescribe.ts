/**
 * Describing any FITS file: its HDUs, and its HEALPix maps when it has one.
 * A file without a HEALPix map (an image, an ASCII table) is described, not
 * refused; a malformed file or a malformed map is an InputError.
 */
import type { SkyMap } from '../maps/skyMap.js';
import { loadFitsBytes } from './fits/source.js';
import { walkHdus } from './fits/hdu.js';
import { summariseHdu, type HduSummary } from './hduSummary.js';
import { isHealpixHdu } from './healpixKeywords.js';
import { readMapsFromHdus, type ReadMapOptions } from './mapRead.js';

/** What a FITS file holds. `maps` is empty when no HDU is a HEALPix map. */
export interface FitsDescription {
  readonly file: string;
  readonly bytes: number;
  readonly hdus: HduSummary[];
  readonly maps: SkyMap[];
  /** Index of the HDU holding the maps, or null. */
  readonly mapHdu: number | null;
}

/** Reads and describes a FITS file (gzip-compressed or not). */
export function describeFitsFile(path: string, options: ReadMapOptions = {}): FitsDescription {
  const bytes = loadFitsBytes(path);
  const hdus = walkHdus(bytes, path);
  const mapHdu = hdus.find(isHealpixHdu);
  if (!mapHdu) return { file: path, bytes: bytes.length, hdus: hdus.map(summariseHdu), maps: [], mapHdu: null };
  const contents = readMapsFromHdus(bytes, hdus, path, options);
  return { file: path, bytes: bytes.length, hdus: contents.hdus, maps: contents.maps, mapHdu: mapHdu.index };
}
