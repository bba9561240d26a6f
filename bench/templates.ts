/**
 * Benchmark of template building: Nside 256, 4 energy planes, pair absorption
 * on the CMB, against a numpy-vectorised implementation of the same integrand
 * (scripts/templates_numpy_bench.py: same model grid, same samples per line of
 * sight, same bilinear interpolation and absorption weights) in the same run.
 * Prints both times, their ratio (target: skyspan <= 0.5 x numpy) and the
 * largest relative difference between the two maps.
 * Run alone: npx tsx bench/templates.ts
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseTemplateSpec } from '../src/templates/templateSpec.js';
import { buildTemplate } from '../src/templates/buildTemplate.js';
import { prepareIntegration } from '../src/templates/lineOfSight.js';
import { defaultAttenuationLength } from '../src/templates/absorption.js';
import { KPC_CM } from '../src/physics/constants.js';

const SPEC = parseTemplateSpec(`name: bench
gas:
  - {component: hiDickeyLockman}
  - {component: h2NakanishiSofue2006, factor: 2}
cosmicRays: {distribution: lorimer2006, haloHeightKpc: 4, indexGradientPerKpc: 0.02}`);
const ENERGIES_GEV = [1e5, 3e5, 1e6, 3e6];
const NSIDE = 256;

/** Runs the benchmark and returns the figures (also printed). */
export async function benchTemplates(): Promise<{ skyspanSeconds: number; numpySeconds: number; ratio: number; maxRelDiff: number }> {
  const t0 = performance.now();
  const built = await buildTemplate(SPEC, { nside: NSIDE, energiesGeV: ENERGIES_GEV, absorption: true, workers: 2 });
  const skyspanSeconds = (performance.now() - t0) / 1000;

  // The same grid and samples for the numpy run.
  const lambda = await defaultAttenuationLength();
  const k = prepareIntegration(SPEC, ENERGIES_GEV, 0, lambda);
  const dir = mkdtempSync(join(tmpdir(), 'skyspan-bench-templates-'));
  try {
    writeFileSync(join(dir, 'params.json'), JSON.stringify({ nR: k.nR, nU: k.nU, nE: k.nE, nside: NSIDE, dRKpc: k.dRKpc,
      zScaleKpc: k.zScaleKpc, rSunKpc: k.rSunKpc, zSunKpc: k.zSunKpc }));
    writeFileSync(join(dir, 'grid.f32'), new Uint8Array(k.values.buffer, k.values.byteOffset, k.values.byteLength));
    writeFileSync(join(dir, 's.f64'), new Uint8Array(k.sKpc.buffer));
    writeFileSync(join(dir, 'w.f64'), new Uint8Array(k.wKpc.buffer));
    writeFileSync(join(dir, 'surv.f64'), new Uint8Array(k.survival!.buffer));
    const res = JSON.parse(execFileSync('/usr/bin/python3', ['scripts/templates_numpy_bench.py', dir], { encoding: 'utf8' })) as { seconds: number };
    const buf = readFileSync(join(dir, 'out.f64'));
    const ref = new Float64Array(buf.buffer, buf.byteOffset, buf.byteLength / 8);
    const npix = 12 * NSIDE * NSIDE;
    let maxRelDiff = 0;
    for (let e = 0; e < ENERGIES_GEV.length; e++) {
      const plane = built.map.planes[e];
      for (let p = 0; p < npix; p++) {
        const r = ref[e * npix + p] * KPC_CM;
        if (r > 0) maxRelDiff = Math.max(maxRelDiff, Math.abs(plane[p] / r - 1));
      }
    }
    const ratio = skyspanSeconds / res.seconds;
    const samples = k.sKpc.length;
    console.log(`templates: Nside ${NSIDE}, ${ENERGIES_GEV.length} planes, absorption on, ${samples} samples per line of sight`);
    console.log(`  skyspan (grid + 2 worker threads): ${skyspanSeconds.toFixed(2)} s`);
    console.log(`  numpy (vectorised, grid given):    ${res.seconds.toFixed(2)} s`);
    console.log(`  ratio skyspan/numpy: ${ratio.toFixed(3)} (target <= 0.5); max relative difference of the maps ${maxRelDiff.toExponential(2)}`);
    return { skyspanSeconds, numpySeconds: res.seconds, ratio, maxRelDiff };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await benchTemplates();
}
