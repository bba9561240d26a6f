/**
 * Region weights as HEALPix maps: the covered fraction (and, when the region
 * has a weighted site, the relative exposure) as float32 columns of a RING map
 * in the frame the region was evaluated in, written through writeMapFile.
 */
import { createSkyMap } from '../maps/create.js';
import type { SkyMap } from '../maps/skyMap.js';
import { writeMapFile } from '../io/mapFile.js';
import type { RegionWeights } from './types.js';

/**
 * The maps of a region: `FRACTION` (0..1 per pixel) and, with
 * `withExposure` and a weighted region, `EXPOSURE` (relative, maximum 1).
 * Metadata names the region, mode and solid angle (sr).
 */
export function regionMaps(w: RegionWeights, withExposure = false): SkyMap[] {
  const meta = { REGION: w.name, MASKMODE: w.mode, SOLIDANG: w.solidAngleSr };
  const maps = [createSkyMap({ nside: w.nside, ordering: 'RING', frame: w.frame, column: 'FRACTION', unit: '', planes: [w.fraction], meta })];
  if (withExposure && w.exposure) {
    maps.push(createSkyMap({ nside: w.nside, ordering: 'RING', frame: w.frame, column: 'EXPOSURE', unit: '', planes: [w.exposure], meta }));
  }
  return maps;
}

/**
 * Writes the region's maps to a HEALPix FITS file (gzip when the path ends in
 * .gz), atomically; an existing file is replaced only with force, an input
 * never.
 */
export function writeRegionMask(path: string, w: RegionWeights,
  options: { force?: boolean; inputs?: string[]; withExposure?: boolean; header?: Record<string, string | number | boolean> } = {}): void {
  writeMapFile(path, regionMaps(w, options.withExposure), {
    force: options.force, inputs: options.inputs, dtype: 'float32', header: options.header,
  });
}
