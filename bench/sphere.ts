/**
 * Benchmark of the HEALPix bulk kernels against the per-pixel reference
 * (@hscmap/healpix), both run in the same process:
 *  1. visiting every pixel centre at Nside 2048 (50.3M pixels): ringTable loop
 *     vs pix2ang_ring per pixel;
 *  2. 10M directions to RING pixels at Nside 2048: anglesToPixels vs
 *     ang2pix_ring per direction.
 * Each side folds its results into a checksum so that no work is optimised
 * away, and the checksums must agree. Not a test: nothing is asserted on time.
 * Run alone: npx tsx bench/sphere.ts
 */
import { pathToFileURL } from 'node:url';
import * as hp from '@hscmap/healpix';
import { ringTable } from '../src/sphere/ringTable.js';
import { anglesToPixels } from '../src/sphere/bulk.js';
import { nside2npix } from '../src/sphere/nside.js';

const NSIDE = 2048;
const TWO_PI = 2 * Math.PI;
const N_DIRECTIONS = 10_000_000;

function seconds(t0: bigint): number {
  return Number(process.hrtime.bigint() - t0) / 1e9;
}

function centresWithRingTable(nside: number): number {
  const t = ringTable(nside);
  let sum = 0;
  for (let r = 0; r < t.count; r++) {
    const th = t.theta[r], p0 = t.phi0[r], dp = t.dphi[r], n = t.length[r];
    for (let j = 0; j < n; j++) sum += th + (p0 + j * dp);
  }
  return sum;
}

function centresWithReference(nside: number): number {
  const npix = nside2npix(nside);
  let sum = 0;
  for (let p = 0; p < npix; p++) {
    const a = hp.pix2ang_ring(nside, p);
    // @hscmap/healpix returns phi beyond 2 pi for some pixels: wrap it.
    sum += a.theta + (a.phi >= TWO_PI ? a.phi - TWO_PI : a.phi);
  }
  return sum;
}

/** Seeded uniform directions on the sphere (xorshift32; common practice, no source). */
function randomDirections(n: number): { theta: Float64Array; phi: Float64Array } {
  const theta = new Float64Array(n), phi = new Float64Array(n);
  let s = 2463534242;
  const next = () => { s ^= s << 13; s >>>= 0; s ^= s >>> 17; s ^= s << 5; s >>>= 0; return s / 4294967296; };
  for (let i = 0; i < n; i++) { theta[i] = Math.acos(1 - 2 * next()); phi[i] = 2 * Math.PI * next(); }
  return { theta, phi };
}

/** Runs both comparisons and prints times and ratios. */
export async function benchSphere(): Promise<void> {
  const npix = nside2npix(NSIDE);
  console.log(`sphere: Nside ${NSIDE}, ${npix} pixels`);

  let t0 = process.hrtime.bigint();
  const sumFast = centresWithRingTable(NSIDE);
  const tFast = seconds(t0);
  t0 = process.hrtime.bigint();
  const sumRef = centresWithReference(NSIDE);
  const tRef = seconds(t0);
  const agree = Math.abs(sumFast - sumRef) <= 1e-9 * Math.abs(sumRef);
  console.log(`  pixel centres, ringTable loop      ${tFast.toFixed(3)} s`);
  console.log(`  pixel centres, pix2ang_ring (ref)  ${tRef.toFixed(3)} s   ratio ref/ours ${(tRef / tFast).toFixed(1)}x   checksums ${agree ? 'agree' : 'DIFFER'}`);

  const { theta, phi } = randomDirections(N_DIRECTIONS);
  const out = new Uint32Array(N_DIRECTIONS);
  t0 = process.hrtime.bigint();
  anglesToPixels(NSIDE, 'RING', theta, phi, out);
  const tBatch = seconds(t0);
  t0 = process.hrtime.bigint();
  let mismatches = 0;
  for (let i = 0; i < N_DIRECTIONS; i++) if (hp.ang2pix_ring(NSIDE, theta[i], phi[i]) !== out[i]) mismatches++;
  const tRefA = seconds(t0);
  console.log(`  ${N_DIRECTIONS / 1e6}M directions, anglesToPixels     ${tBatch.toFixed(3)} s (${((tBatch / N_DIRECTIONS) * 1e9).toFixed(1)} ns each)`);
  console.log(`  ${N_DIRECTIONS / 1e6}M directions, ang2pix_ring (ref) ${tRefA.toFixed(3)} s (${((tRefA / N_DIRECTIONS) * 1e9).toFixed(1)} ns each)   ratio ref/ours ${(tRefA / tBatch).toFixed(1)}x   mismatches ${mismatches}`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await benchSphere();
}
