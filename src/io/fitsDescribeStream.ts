/**
 * Describing a FITS file in one streamed pass (mapStream.ts): its HDUs and,
 * for a HEALPix map, each plane's statistics (maps/stats.ts) accumulated
 * window by window, so a cube of any size is described in bounded memory.
 * The figures are exactly those of the whole-file description
 * (fitsDescribe.ts + planeStats): the same values in the same order.
 */
import { finishStats, newStatsState, planeStats, statsBlock, type PlaneStats } from '../maps/stats.js';
import type { MapArray } from '../maps/skyMap.js';
import type { FrameName } from '../sphere/frames.js';
import type { Ordering } from '../sphere/nside.js';
import { describeFitsFile } from './fitsDescribe.js';
import type { HduSummary } from './hduSummary.js';
import { StreamNotPossible, streamBufferBytes, streamFitsFile, type MapStreamPlan, type StreamMapOptions } from './mapStream.js';
import { assertFits } from '../core/memory.js';

/** One map of a described file, with its planes' statistics. */
export interface DescribedMap {
  column: string; unit: string; nside: number; ordering: Ordering; frame: FrameName; pixels: number;
  energiesGeV: Float64Array | null; planes: PlaneStats[];
}

/** What {@link describeFitsFileStreamed} returns. */
export interface StreamedDescription {
  file: string;
  /** Bytes of FITS data (inflated size for gzip). */
  bytes: number;
  hdus: HduSummary[];
  mapHdu: number | null;
  maps: DescribedMap[];
}

/** Describes `path` in one streamed pass (a file the stream cannot take is read whole; same figures). */
export async function describeFitsFileStreamed(path: string, options: StreamMapOptions & { memoryLimitBytes?: number } = {}): Promise<StreamedDescription> {
  let states: Float64Array[] = [];
  const sink = {
    begin(plan: MapStreamPlan) {
      assertFits(streamBufferBytes(plan, options.blockBytes), `streaming ${path}`, 'free memory', options.memoryLimitBytes);
      states = plan.planes.map(newStatsState);
    },
    window(_p0: number, n: number, planes: MapArray[]) { for (let q = 0; q < planes.length; q++) statsBlock(planes[q], 0, n, states[q]); },
  };
  try {
    const r = await streamFitsFile(path, sink, options);
    const plan = r.plan;
    const maps = plan ? r.maps.map((m) => ({ column: m.column, unit: m.unit, nside: plan.nside, ordering: plan.ordering, frame: plan.frame,
      pixels: plan.npix, energiesGeV: r.energiesGeV, planes: m.planes.map((q) => finishStats(states[q])) })) : [];
    return { file: path, bytes: r.decodedBytes, hdus: r.hdus, mapHdu: plan ? plan.hdu.index : null, maps };
  } catch (e) {
    if (!(e instanceof StreamNotPossible)) throw e;
    const d = describeFitsFile(path, { frame: options.frame });
    return { file: d.file, bytes: d.bytes, hdus: d.hdus, mapHdu: d.mapHdu, maps: d.maps.map((m) => ({ column: m.column, unit: m.unit,
      nside: m.nside, ordering: m.ordering, frame: m.frame, pixels: m.planes[0].length, energiesGeV: m.energiesGeV, planes: m.planes.map(planeStats) })) };
  }
}
