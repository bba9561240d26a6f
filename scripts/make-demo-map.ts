/**
 * Writes examples/demo/demo-map.fits: an INVENTED demo map (no measurement
 * behind it) at Nside 16, RING, Galactic frame. The field is a smooth made-up
 * band along the Galactic plane, I = 1e-6 (1 + 0.5 cos l) exp(-b^2 / (2 (0.15 rad)^2)) + 1e-8,
 * in GeV^-1 cm^-2 s^-1 sr^-1, with the pixels of a made-up disc (radius
 * 0.3 rad around l = 2, b = 0.5) blank, so `skyspan info` has blanks to count.
 *
 * Run: npx tsx scripts/make-demo-map.ts
 */
import { mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ringTable } from '../src/sphere/ringTable.js';
import { angularDistance } from '../src/core/math.js';
import { BLANK } from '../src/maps/skyMap.js';
import { writeMapFile } from '../src/io/mapFile.js';

const NSIDE = 16;
const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const out = join(root, 'examples', 'demo', 'demo-map.fits');

const t = ringTable(NSIDE);
const values = new Float32Array(12 * NSIDE * NSIDE);
for (let r = 0; r < t.count; r++) {
  const b = Math.PI / 2 - t.theta[r];
  for (let j = 0; j < t.length[r]; j++) {
    const l = t.phi0[r] + j * t.dphi[r];
    const pix = t.first[r] + j;
    const inHole = angularDistance(l, b, 2, 0.5) < 0.3;
    values[pix] = inHole ? BLANK : 1e-6 * (1 + 0.5 * Math.cos(l)) * Math.exp(-(b * b) / (2 * 0.15 * 0.15)) + 1e-8;
  }
}

mkdirSync(dirname(out), { recursive: true });
writeMapFile(out, {
  nside: NSIDE, ordering: 'RING', frame: 'galactic', column: 'INTENSITY', unit: 'GeV^-1 cm^-2 s^-1 sr^-1',
  planes: [values], energiesGeV: null,
}, { force: true, header: { COMMENT: 'INVENTED demo data: a made-up smooth band, not a measurement', DEMO: true } });
console.log(`wrote ${out}`);
