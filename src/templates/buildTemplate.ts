/**
 * Builds a HEALPix template (Galactic frame, RING) from a template spec by
 * line-of-sight integration of the tabulated 3D model, on worker threads.
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { InputError } from '../core/errors.js';
import { assertNside, nside2npix } from '../sphere/nside.js';
import { ringTable } from '../sphere/ringTable.js';
import { nestToRing, ringToNest } from '../sphere/pixelIndex.js';
import { createSkyMap } from '../maps/create.js';
import type { SkyMap } from '../maps/skyMap.js';
import type { TemplateSpec } from './templateSpec.js';
import type { GridOptions } from './modelGrid.js';
import { integrateRings, type KernelInput } from './losKernel.js';
import { defaultAttenuationLength, type AttenuationLengthFn } from './absorption.js';
import { prepareIntegration, unitScale } from './lineOfSight.js';

/** Options of {@link buildTemplate}. */
export interface BuildOptions {
  nside: number;
  /** Energies of the planes in GeV (default: the spec's energiesGeV, else one plane without energy). */
  energiesGeV?: number[];
  /** Weight every sample by its survival probability against pair production (needs energies). */
  absorption?: boolean;
  /** Attenuation length in kpc per energy (default: the physics layer's CMB value). */
  attenuationLengthKpc?: AttenuationLengthFn;
  /** Worker threads (default: one per core, at most 4, when the job outweighs starting them, else 1; 0 or 1 runs in this thread). */
  workers?: number;
  /** Sub-pixel factor per axis, a power of two (default: enough to reach Nside 64). */
  oversample?: number;
  /** Called with (pixels done, pixels total). */
  onProgress?: (done: number, total: number) => void;
  /** Overrides of the spec's integration step (kpc) and nodes per segment. */
  stepKpc?: number;
  nodesPerSegment?: number;
  /** Model-grid resolution (tests). */
  grid?: GridOptions;
}

/** The template and, with absorption, the emission-weighted mean survival probability per pixel and energy. */
export interface BuiltTemplate {
  map: SkyMap;
  survival: SkyMap | null;
}

/**
 * Starts the worker. Compiled code runs losWorker.js directly; under tsx or
 * vitest (a .ts module) the worker first registers tsx's loader through its
 * API, then imports losWorker.ts.
 */
function startWorker(workerData: unknown): Worker {
  if (!import.meta.url.endsWith('.ts')) return new Worker(new URL('./losWorker.js', import.meta.url), { workerData });
  const api = pathToFileURL(createRequire(import.meta.url).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
  const target = new URL('./losWorker.ts', import.meta.url).href;
  const code = `import(${JSON.stringify(api)}).then((m) => { m.register(); return import(${JSON.stringify(target)}); })
  .catch((e) => require('node:worker_threads').parentPort.postMessage({ ok: false, message: String(e) }));`;
  return new Worker(code, { eval: true, workerData });
}

/** Worker threads for a big build: one per core, at most 4. */
function defaultWorkerCount(): number {
  return Math.max(1, Math.min(4, availableParallelism()));
}

async function runWorkers(input: KernelInput, count: number, total: number, onProgress?: (d: number, t: number) => void): Promise<void> {
  const progress = new Int32Array(new SharedArrayBuffer(4));
  const timer = onProgress ? setInterval(() => onProgress(Atomics.load(progress, 0), total), 200) : null;
  try {
    await Promise.all(Array.from({ length: count }, (_, w) => new Promise<void>((resolve, reject) => {
      const worker = startWorker({ input, ringFrom: w, ringStride: count, progress });
      let settled = false;
      worker.on('message', (m: { ok: boolean; message?: string }) => {
        settled = true;
        if (m.ok) resolve(); else reject(new Error(`template worker failed: ${m.message}`));
      });
      worker.on('error', (e) => { settled = true; reject(e); });
      worker.on('exit', (code) => { if (!settled) reject(new Error(`template worker exited with code ${code}`)); });
    })));
  } finally {
    if (timer) clearInterval(timer);
  }
  onProgress?.(total, total);
}

/** Averages the 4^m sub-pixels of each pixel (fine RING -> coarse RING, through NESTED indices). */
function degrade(fine: Float64Array, nsideFine: number, nside: number, out: Float64Array, off: number): void {
  const npixF = nside2npix(nsideFine), shift = 2 * Math.log2(nsideFine / nside), n = 1 << shift;
  for (let p = 0; p < npixF; p++) {
    const parent = nestToRing(nside, Math.floor(ringToNest(nsideFine, p) / n));
    out[parent] += fine[off + p] / n;
  }
}

/**
 * Integrates the spec's model along every line of sight. Values are in
 * cm^-2 (gas column x cosmic-ray density relative to the Sun's) for gas
 * templates and in kpc (relative source density x path) for source templates;
 * planes differ only through the spectral-index gradient and absorption.
 */
export async function buildTemplate(spec: TemplateSpec, opts: BuildOptions): Promise<BuiltTemplate> {
  assertNside(opts.nside, { keyPath: 'nside' });
  const energies = opts.energiesGeV ?? spec.energiesGeV ?? null;
  if (opts.absorption && !energies) throw new InputError('absorption needs energies', { keyPath: 'energiesGeV' }, 'give energies with --energies or energiesGeV');
  const oversample = opts.oversample ?? Math.max(1, 64 / opts.nside);
  if (!(oversample >= 1) || (oversample & (oversample - 1)) !== 0) throw new InputError(`oversample is ${oversample}, expected a power of two`, { keyPath: 'oversample' });
  const nsideEff = opts.nside * oversample;
  const integ = spec.integration;
  const lambda = opts.absorption ? (opts.attenuationLengthKpc ?? (await defaultAttenuationLength())) : null;
  const input = prepareIntegration(spec, energies, nsideEff, lambda, {
    stepKpc: opts.stepKpc, nodesPerSegment: opts.nodesPerSegment, grid: opts.grid, shared: true,
  });
  const nE = input.nE, npixEff = nside2npix(nsideEff), npix = nside2npix(opts.nside);
  const survivalW = input.survival;
  // Threads pay off once the work outweighs starting them: a compiled worker
  // starts in a few tens of ms (about 2e6 samples of the kernel, half of them
  // mirrored), one under tsx in about a second (2e7).
  const samples = (npixEff * input.sKpc.length) / 2;
  const workers = opts.workers ?? (samples > (import.meta.url.endsWith('.ts') ? 2e7 : 2e6) ? defaultWorkerCount() : 1);
  if (workers <= 1) {
    let done = 0;
    integrateRings(input, 0, 1, opts.onProgress ? (n) => { done += n; if ((done & 0x3fff) < n) opts.onProgress!(done, npixEff); } : undefined);
    opts.onProgress?.(npixEff, npixEff);
  } else {
    ringTable(nsideEff);
    await runWorkers(input, workers, npixEff, opts.onProgress);
  }
  const scale = unitScale(spec);
  const planes: Float64Array[] = [], survPlanes: Float64Array[] = [];
  const tmp = new Float64Array(npix), tmpPlain = new Float64Array(npix);
  for (let e = 0; e < nE; e++) {
    tmp.fill(0); tmpPlain.fill(0);
    if (oversample === 1) { tmp.set(input.out.subarray(e * npix, (e + 1) * npix)); if (input.outPlain) tmpPlain.set(input.outPlain.subarray(e * npix, (e + 1) * npix)); }
    else { degrade(input.out, nsideEff, opts.nside, tmp, e * npixEff); if (input.outPlain) degrade(input.outPlain, nsideEff, opts.nside, tmpPlain, e * npixEff); }
    planes.push(Float64Array.from(tmp, (v) => v * scale));
    if (input.outPlain) survPlanes.push(Float64Array.from(tmp, (v, i) => (tmpPlain[i] > 0 ? v / tmpPlain[i] : 1)));
  }
  const meta: Record<string, string | number | boolean> = {
    TEMPLATE: spec.name, OVERSAMP: oversample, MAXDIST: integ.maxDistanceKpc,
    LOSSTEP: opts.stepKpc ?? integ.stepKpc, LOSNODES: opts.nodesPerSegment ?? integ.nodesPerSegment,
    LOSSAMP: input.sKpc.length, ABSORB: !!opts.absorption, SPEC: JSON.stringify(spec),
  };
  const unit = spec.sources ? 'kpc' : 'cm^-2';
  const map = createSkyMap({ nside: opts.nside, ordering: 'RING', frame: 'galactic', column: 'TEMPLATE', unit, planes, energiesGeV: energies, meta });
  const survival = survivalW ? createSkyMap({ nside: opts.nside, ordering: 'RING', frame: 'galactic', column: 'SURVIVAL', unit: '', planes: survPlanes, energiesGeV: energies, meta }) : null;
  return { map, survival };
}
