/**
 * Benchmark of pair absorption: the table build, a table lookup, and a direct
 * integral of attenuationLengthKpc, against the independent scipy double
 * integral (scripts/attenuation_reference.py) run in the same run on the same
 * energies; printed: times per evaluation and their ratios. Also the KAB
 * emissivity integral per evaluation.
 *
 * Run alone: npx tsx bench/physics.ts
 */
import { execFileSync } from 'node:child_process';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { attenuationLengthKpc, attenuationTable, inverseAttenuationLengthPerCm } from '../src/physics/absorption/attenuationLength.js';
import { ppEmissivity } from '../src/physics/hadronic/emissivity.js';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const ENERGIES = [3e5, 1e6, 2.2e6, 5e6, 1e7];

export async function benchPhysics(): Promise<void> {
  let t = performance.now();
  attenuationTable([{ name: 'bench', temperatureK: 2.7255, dilution: 0.999999 }]);
  const buildMs = performance.now() - t;
  attenuationLengthKpc(1e6);
  const n = 1_000_000;
  t = performance.now();
  let s = 0;
  for (let i = 0; i < n; i++) s += attenuationLengthKpc(1e5 * Math.exp((i % 1000) * 0.005));
  const lookupUs = ((performance.now() - t) * 1e3) / n;
  t = performance.now();
  for (let k = 0; k < 20; k++) for (const e of ENERGIES) s += inverseAttenuationLengthPerCm(e);
  const directUs = ((performance.now() - t) * 1e3) / (20 * ENERGIES.length);
  t = performance.now();
  execFileSync('/usr/bin/python3', [join(ROOT, 'scripts/attenuation_reference.py')], { input: JSON.stringify(ENERGIES), encoding: 'utf8' });
  const refUs = ((performance.now() - t) * 1e3) / ENERGIES.length; // includes its minimum search and start-up: an upper bound
  t = performance.now();
  for (let k = 0; k < 200; k++) s += ppEmissivity('gamma', 1e4, { kind: 'powerLaw', norm: 1, index: 2.5, e0GeV: 1 });
  const kabUs = ((performance.now() - t) * 1e3) / 200;
  console.log(`attenuation table build (one field set): ${buildMs.toFixed(1)} ms`);
  console.log(`lookup: ${lookupUs.toFixed(3)} us/eval; direct integral: ${directUs.toFixed(1)} us/eval; scipy reference (incl. start-up and minimum search): ${refUs.toFixed(0)} us/eval`);
  console.log(`ratio reference / direct: ${(refUs / directUs).toFixed(0)}; reference / lookup: ${(refUs / lookupUs).toFixed(0)}`);
  console.log(`KAB emissivity integral: ${kabUs.toFixed(1)} us/eval (checksum ${s.toExponential(3)})`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await benchPhysics();
