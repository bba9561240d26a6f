/**
 * The factor job over template files as a streaming reduction: each file is
 * read once, front to back (io/mapStream.ts), the regions are evaluated once
 * per (Nside, frame) before its data arrives, and every plane's sums for
 * every region accumulate as the row blocks stream past (streamSums.ts), so
 * the peak memory is the region weights plus a fixed block, whatever the
 * number of planes. The file's SHA-256 comes from the same pass. A file the
 * stream reader cannot take (an EXPLICIT table not in pixel order, an
 * ambiguous vector column without NSIDE) is read whole instead.
 */
import { StreamNotPossible, streamBufferBytes, streamMapFile, type MapStreamPlan } from '../io/mapStream.js';
import { addTemplateInMemory, templateFrame } from './ensembleFactors.js';
import type { FactorJob, Geometry } from './factorJob.js';
import { inPixelOrder, StreamedPlaneSums } from './streamSums.js';
import { readTemplateFiles, templateStem } from './templateFiles.js';
import { estimateMapBytes } from '../core/memory.js';
import { assertFits } from '../core/memory.js';

/** What reducing one template file gave besides the job's rows. */
export interface ReducedFile {
  file: string;
  /** SHA-256 of the file's bytes (FIPS 180-4), from the reading pass. */
  sha256: string;
  /** Template names, in order. */
  templates: string[];
  /** True when the file was streamed; false when it had to be read whole. */
  streamed: boolean;
}

/** Options of {@link reduceTemplateFile}. */
export interface ReduceOptions {
  /** Frame of a file that does not state it. */
  frame?: 'galactic' | 'equatorial';
  /** Bytes of table rows decoded at a time. */
  blockBytes?: number;
  memoryLimitBytes?: number;
}

/**
 * Adds the rows of every template of `file` (source number `fileIndex`) to
 * `job`, streaming the file (see module doc). Templates are named as in
 * templateFiles.ts: the file name without extension, plus `:COLUMN` when
 * the file holds several maps.
 */
export async function reduceTemplateFile(job: FactorJob, fileIndex: number, file: string, opts: ReduceOptions = {}): Promise<ReducedFile> {
  const stem = templateStem(file);
  let acc: StreamedPlaneSums | null = null;
  let g: Geometry | null = null;
  let frame: 'galactic' | 'equatorial' = 'galactic';
  const sink = {
    begin(plan: MapStreamPlan) {
      checkStreamMemory(file, plan, opts);
      frame = templateFrame(stem, plan.frame, opts.frame);
      g = job.geometry(fileIndex, plan.nside, frame);
      const [a, ...bs] = inPixelOrder([g.a, ...g.bs], plan.ordering === 'NESTED');
      acc = new StreamedPlaneSums(a, bs, plan.planes.length, plan.npix);
    },
    window(p0: number, n: number, planes: Parameters<StreamedPlaneSums['window']>[2]) { acc!.window(p0, n, planes); },
  };
  let res;
  try {
    res = await streamMapFile(file, sink, { frame: opts.frame, blockBytes: opts.blockBytes });
  } catch (e) {
    if (!(e instanceof StreamNotPossible)) throw e;
    return reduceWhole(job, fileIndex, file, opts);
  }
  const { plan, maps, energiesGeV } = res;
  const names = maps.map((m) => maps.length > 1 ? `${stem}:${m.column}` : stem);
  maps.forEach((m, j) => {
    const geom = job.openTemplate(fileIndex, j, names[j], plan.nside, frame);
    m.planes.forEach((q, p) => {
      const s = acc!.finish(q);
      job.addPlane(fileIndex, j, names[j], geom, { nside: plan.nside, frame }, p, energiesGeV ? energiesGeV[p] : null, s.sa, s.sbs, s.sky);
    });
  });
  return { file, sha256: res.sha256, templates: names, streamed: true };
}

/**
 * Refuses, before the data streams, a job whose region weights (evaluated at
 * the file's Nside, see memory.ts) and row blocks would not fit in memory
 * (core/memory.ts: the limit, SKYSPAN_MEMORY_LIMIT_BYTES or the free memory).
 */
export function checkStreamMemory(file: string, plan: MapStreamPlan, opts: ReduceOptions): void {
  const needed = estimateMapBytes(plan.nside, 1, 16) /* region evaluation at its peak */ + streamBufferBytes(plan, opts.blockBytes);
  assertFits(needed, `streaming template ${file} (region weights at Nside ${plan.nside} and row blocks)`,
    `free memory, or evaluate the regions at a lower Nside (skyspan remap IN OUT --nside ${Math.max(1, plan.nside / 2)})`, opts.memoryLimitBytes);
}

/** The fallback of {@link reduceTemplateFile}: the file read whole (memory checked first) and hashed from the same bytes. */
function reduceWhole(job: FactorJob, fileIndex: number, file: string, opts: ReduceOptions): ReducedFile {
  const ts = readTemplateFiles([file], opts);
  ts.forEach((t, j) => addTemplateInMemory(job, fileIndex, j, { name: t.name, map: t.map }, opts.frame));
  return { file, sha256: ts[0].sha256, templates: ts.map((t) => t.name), streamed: false };
}

/**
 * Reduces the template files `files[i]` with `select(i)` true (all by
 * default), one after the other, into `job`; `onFile` is told each file done.
 */
export async function reduceTemplateFiles(job: FactorJob, files: string[], opts: ReduceOptions & {
  select?: (index: number) => boolean; onFile?: (done: number, total: number) => void;
} = {}): Promise<(ReducedFile & { index: number })[]> {
  const chosen = files.map((file, index) => ({ file, index })).filter(({ index }) => !opts.select || opts.select(index));
  const out: (ReducedFile & { index: number })[] = [];
  for (const { file, index } of chosen) {
    out.push({ ...(await reduceTemplateFile(job, index, file, opts)), index });
    opts.onFile?.(out.length, chosen.length);
  }
  return out;
}
