/**
 * The body of a template worker thread (see templatePool.ts): for each file
 * it is given, it streams the file (io/mapStream.ts), asks the main thread
 * for the region lists of the file's (Nside, frame) once the header is read
 * (kept for the next files of the same geometry), accumulates every plane's
 * sums (streamSums.ts) and sends them back with the file's SHA-256.
 */
import { parentPort } from 'node:worker_threads';
import { InputError, isSkyspanError } from '../core/errors.js';
import { StreamNotPossible, streamMapFile, type MapStreamPlan } from '../io/mapStream.js';
import type { MapArray } from '../maps/skyMap.js';
import type { RegionPixels } from './regionPixels.js';
import { StreamedPlaneSums } from './streamSums.js';

/** A file to reduce. */
export interface WorkerTask { kind: 'task'; fileIndex: number; file: string; frame?: 'galactic' | 'equatorial'; blockBytes?: number }
/** The main thread's answer to a geometry request: the regions in the file's pixel order. */
export interface WorkerGeometry { kind: 'geometry'; key: string; regions: RegionPixels[] | null; error?: WorkerError }
/** An error carried across threads. */
export interface WorkerError { name: string; message: string }
/** What the worker sends. */
export type WorkerReply =
  | { kind: 'need'; fileIndex: number; nside: number; frame: string; ordering: string; key: string }
  | { kind: 'done'; fileIndex: number; nside: number; frame: string; sums: ReturnType<StreamedPlaneSums['finish']>[];
      maps: { column: string; planes: number[] }[]; energiesGeV: Float64Array | null; sha256: string }
  | { kind: 'whole'; fileIndex: number }
  | { kind: 'error'; fileIndex: number; error: WorkerError };

/** Runs the worker loop on `port` (the worker's parentPort). */
export function runTemplateWorker(): void {
  const port = parentPort!;
  const cache = new Map<string, RegionPixels[]>();
  let waiting: ((g: WorkerGeometry) => void) | null = null;
  const send = (m: WorkerReply) => port.postMessage(m);
  port.on('message', (m: WorkerTask | WorkerGeometry) => {
    if (m.kind === 'geometry') { waiting?.(m); return; }
    void reduce(m);
  });

  async function reduce(t: WorkerTask): Promise<void> {
    let acc: StreamedPlaneSums | null = null;
    const sink = {
      async begin(plan: MapStreamPlan) {
        const key = `${plan.nside}/${plan.frame}/${plan.ordering}`;
        let regions = cache.get(key);
        if (!regions) {
          const reply = await new Promise<WorkerGeometry>((res) => {
            waiting = res;
            send({ kind: 'need', fileIndex: t.fileIndex, nside: plan.nside, frame: plan.frame, ordering: plan.ordering, key });
          });
          waiting = null;
          if (reply.error) throw new InputError(reply.error.message);
          regions = reply.regions!;
          cache.set(key, regions);
        }
        const [a, ...bs] = regions;
        acc = new StreamedPlaneSums(a, bs, plan.planes.length, plan.npix);
      },
      window(p0: number, n: number, planes: MapArray[]) { acc!.window(p0, n, planes); },
    };
    try {
      const res = await streamMapFile(t.file, sink, { frame: t.frame, blockBytes: t.blockBytes });
      send({ kind: 'done', fileIndex: t.fileIndex, nside: res.plan.nside, frame: res.plan.frame,
        sums: res.plan.planes.map((_, q) => acc!.finish(q)), maps: res.maps, energiesGeV: res.energiesGeV, sha256: res.sha256 });
    } catch (e) {
      if (e instanceof StreamNotPossible) send({ kind: 'whole', fileIndex: t.fileIndex });
      else send({ kind: 'error', fileIndex: t.fileIndex, error: { name: isSkyspanError(e) ? e.name : 'Error', message: (e as Error).message } });
    }
  }
}
