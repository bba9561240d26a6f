/**
 * Worker-thread entry: runs {@link integrateRings} on the rings it is given,
 * over shared memory, and counts finished pixels in a shared Int32 counter.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { integrateRings, type KernelInput } from './losKernel.js';

interface WorkerJob { input: KernelInput; ringFrom: number; ringStride: number; progress: Int32Array }

if (parentPort) {
  const job = workerData as WorkerJob;
  try {
    integrateRings(job.input, job.ringFrom, job.ringStride, (n) => { Atomics.add(job.progress, 0, n); });
    parentPort.postMessage({ ok: true });
  } catch (e) {
    parentPort.postMessage({ ok: false, message: (e as Error).message });
  }
}
