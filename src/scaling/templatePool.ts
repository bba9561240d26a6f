/**
 * Template files reduced on worker threads (templateWorker.ts), one file per
 * worker at a time. The main thread keeps the factor job: it evaluates the
 * regions once per (Nside, frame) when a worker first needs them, and forms
 * the rows from the sums each worker returns; the result is the same as the
 * sequential reduction (composeFactorResult orders everything by file).
 * Workers are bounded by the cores, by the memory (a fixed allowance per
 * worker) and by the number of files.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { ComputeError, InputError } from '../core/errors.js';
import { availableMemoryBytes } from '../core/memory.js';
import type { FactorJob } from './factorJob.js';
import { templateFrame } from './ensembleFactors.js';
import { inPixelOrder } from './streamSums.js';
import { reduceTemplateFile, reduceTemplateFiles, type ReducedFile, type ReduceOptions } from './streamFactors.js';
import { templateStem } from './templateFiles.js';
import type { WorkerError, WorkerReply, WorkerTask } from './templateWorker.js';

/** Memory allowed per worker thread (bytes): its runtime, one row block and its region lists. */
export const WORKER_ALLOWANCE_BYTES = 512 * 2 ** 20;

/** Number of workers for `files` template files when `requested` (undefined: as many as the cores allow). */
export function workerCount(requested: number | undefined, files: number, limitBytes?: number): number {
  const byMemory = Math.max(1, Math.floor(availableMemoryBytes(limitBytes).bytes / WORKER_ALLOWANCE_BYTES));
  return Math.max(1, Math.min(requested ?? availableParallelism(), availableParallelism(), byMemory, files));
}

function spawn(): Worker {
  const url = new URL('./templateWorker' + (import.meta.url.endsWith('.ts') ? '.ts' : '.js'), import.meta.url).href;
  // under tsx the worker registers the TypeScript loader before importing the module
  const boot = url.endsWith('.ts')
    ? `import(${JSON.stringify(import.meta.resolve('tsx/esm/api'))}).then((m) => { m.register(); return import(${JSON.stringify(url)}); }).then((m) => m.runTemplateWorker());`
    : `import(${JSON.stringify(url)}).then((m) => m.runTemplateWorker());`;
  return new Worker(boot, { eval: true });
}

function rethrow(e: WorkerError): never {
  if (e.name === 'ComputeError') throw new ComputeError(e.message);
  if (e.name === 'InputError') throw new InputError(e.message);
  throw new Error(e.message);
}

/**
 * Reduces the selected template files into `job` on `workers` threads
 * (sequentially for one); `onFile` is told each file done.
 */
export async function reduceTemplateFilesParallel(job: FactorJob, files: string[], opts: ReduceOptions & {
  select?: (index: number) => boolean; onFile?: (done: number, total: number) => void; workers: number;
}): Promise<(ReducedFile & { index: number })[]> {
  const chosen = files.map((file, index) => ({ file, index })).filter(({ index }) => !opts.select || opts.select(index));
  const n = Math.min(opts.workers, chosen.length);
  if (n <= 1) return reduceTemplateFiles(job, files, opts);
  const out: (ReducedFile & { index: number })[] = [];
  const pool = Array.from({ length: n }, spawn);
  let next = 0;
  try {
    await new Promise<void>((resolveAll, rejectAll) => {
      let active = 0;
      const fail = (e: unknown) => { rejectAll(e); };
      const give = (w: Worker) => {
        if (next >= chosen.length) { if (active === 0) resolveAll(); return; }
        const { file, index } = chosen[next++];
        active++;
        w.postMessage({ kind: 'task', fileIndex: index, file, frame: opts.frame, blockBytes: opts.blockBytes } satisfies WorkerTask);
      };
      const finishOne = (w: Worker, r: ReducedFile & { index: number }) => {
        out.push(r);
        active--;
        opts.onFile?.(out.length, chosen.length);
        give(w);
      };
      for (const w of pool) {
        w.on('error', fail);
        w.on('message', (m: WorkerReply) => {
          try {
            const file = files[m.fileIndex];
            if (m.kind === 'need') {
              const frame = templateFrame(templateStem(file), m.frame as 'galactic', opts.frame);
              const g = job.geometry(m.fileIndex, m.nside, frame);
              w.postMessage({ kind: 'geometry', key: m.key, regions: inPixelOrder([g.a, ...g.bs], m.ordering === 'NESTED') });
            } else if (m.kind === 'done') {
              const stem = templateStem(file);
              const frame = templateFrame(stem, m.frame as 'galactic', opts.frame);
              const names = m.maps.map((x) => m.maps.length > 1 ? `${stem}:${x.column}` : stem);
              m.maps.forEach((x, j) => {
                const g = job.openTemplate(m.fileIndex, j, names[j], m.nside, frame);
                x.planes.forEach((q, p) => {
                  const s = m.sums[q];
                  job.addPlane(m.fileIndex, j, names[j], g, { nside: m.nside, frame }, p, m.energiesGeV ? m.energiesGeV[p] : null, s.sa, s.sbs, s.sky);
                });
              });
              finishOne(w, { file, sha256: m.sha256, templates: names, streamed: true, index: m.fileIndex });
            } else if (m.kind === 'whole') {
              reduceTemplateFile(job, m.fileIndex, file, { ...opts, blockBytes: opts.blockBytes })
                .then((r) => finishOne(w, { ...r, streamed: false, index: m.fileIndex }), fail);
            } else {
              rethrow(m.error);
            }
          } catch (e) {
            if (m.kind === 'need') w.postMessage({ kind: 'geometry', key: m.key, regions: null, error: { name: (e as Error).name, message: (e as Error).message } });
            fail(e);
          }
        });
        give(w);
      }
    });
  } finally {
    await Promise.all(pool.map((w) => w.terminate()));
  }
  return out.sort((a, b) => a.index - b.index);
}
