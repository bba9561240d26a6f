/**
 * Measures the line-of-sight quadrature error of a Galactic template against a
 * converged run (step 1/16 kpc, 8 nodes per segment): worst and median relative
 * difference over all pixels at Nside 16, for several steps and node counts.
 * Run: npx tsx bench/templatesConvergence.ts
 */
import { parseTemplateSpec } from '../src/templates/templateSpec.js';
import { buildTemplate } from '../src/templates/buildTemplate.js';

const SPEC = parseTemplateSpec(`name: convergence
gas:
  - {component: hiDickeyLockman}
  - {component: h2NakanishiSofue2006, factor: 2}
cosmicRays: {distribution: lorimer2006, haloHeightKpc: 4}`);

export async function convergenceTable(nside = 16): Promise<string[]> {
  const ref = (await buildTemplate(SPEC, { nside, oversample: 1, stepKpc: 1 / 16, nodesPerSegment: 8 })).map.planes[0];
  const lines = ['step_kpc nodes samples worst_rel median_rel'];
  for (const [step, nodes] of [[1, 4], [0.5, 4], [0.5, 6], [0.25, 4], [0.25, 6], [0.125, 4]] as const) {
    const m = await buildTemplate(SPEC, { nside, oversample: 1, stepKpc: step, nodesPerSegment: nodes });
    const rel = Array.from(m.map.planes[0], (v, i) => Math.abs(v / ref[i] - 1)).sort((a, b) => a - b);
    const samples = Number(m.map.meta?.LOSSAMP ?? NaN);
    lines.push(`${step} ${nodes} ${samples} ${rel[rel.length - 1].toExponential(2)} ${rel[rel.length >> 1].toExponential(2)}`);
  }
  return lines;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const l of await convergenceTable()) console.log(l);
}
