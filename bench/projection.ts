/**
 * Benchmark of the template projection kernel (src/scaling/templateProjection.ts):
 * N = sum(a P T) / sum(a T^2) with compensated sums over an Nside 512 sky
 * (3.1M pixels, float64), against numpy in the same run
 * (scripts/projection_bench.py, same made-up arrays); printed: times, their
 * ratio and the relative difference of N.
 *
 * Run alone: npx tsx bench/projection.ts
 */
import { execFileSync } from 'node:child_process';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { projectionSums } from '../src/scaling/templateProjection.js';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');

export async function benchProjection(nside = 512): Promise<void> {
  const n = 12 * nside * nside;
  const t = new Float64Array(n), p = new Float64Array(n), a = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = 1 + 0.5 * Math.sin(0.001 * i);
    p[i] = 2 * t[i] + 0.1 * Math.cos(0.003 * i);
    a[i] = 0.5 + 0.5 * Math.sin(0.0007 * i) ** 2;
  }
  let best = Infinity, N = 0;
  for (let k = 0; k < 5; k++) {
    const t0 = performance.now();
    const s = projectionSums(p, t, a, n);
    N = s.numerator / s.denominator;
    best = Math.min(best, (performance.now() - t0) / 1e3);
  }
  const ref = JSON.parse(execFileSync('/usr/bin/python3', [join(ROOT, 'scripts/projection_bench.py'), String(n)], { encoding: 'utf8' }));
  console.log(`projection, Nside ${nside} (${n} pixels): skyspan ${(best * 1e3).toFixed(1)} ms, numpy ${(ref.seconds * 1e3).toFixed(1)} ms, ratio ${(best / ref.seconds).toFixed(2)}`);
  console.log(`N: skyspan ${N}, numpy ${ref.N}, relative difference ${Math.abs(N / ref.N - 1).toExponential(2)}`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await benchProjection();
