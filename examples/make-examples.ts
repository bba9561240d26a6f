/**
 * Writes the invented data of the demo scenarios (`npm run examples`). Nothing
 * here is a real measurement: the array, the telescope, the sources and the
 * points are made up so that the demo exercises every step of the job.
 *
 * - examples/northern-plane/sources.csv: 30 invented bright sources in the two
 *   measured patches, for the source mask.
 * - examples/northern-plane/gamma-points.csv: invented diffuse gamma-ray points
 *   at 5 energies, 20 TeV to 1 PeV, the last an upper limit; the same points as
 *   flux-point tables in the open gamma-ray data format, gamma-points.ecsv and
 *   gamma-points.fits.
 * - examples/northern-plane/neutrino-template.fits: an invented spatial template
 *   of the fictional neutrino analysis (Nside 32, Galactic), normalised to mean 1
 *   over the whole sky, so its normalisation reads as a whole-sky mean intensity.
 * - examples/northern-plane/neutrino-acceptance.fits: an invented acceptance map
 *   of that analysis (Nside 16, equatorial), rising towards northern declinations.
 */
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeMapFile } from '../src/io/mapFile.js';
import { createSkyMap } from '../src/maps/create.js';
import { formatFluxPointsEcsv } from '../src/physics/fluxPoints/ecsv.js';
import { formatFluxPointsFits } from '../src/physics/fluxPoints/fits.js';
import { parseSpectrumPoints } from '../src/physics/points.js';
import { ringTable } from '../src/sphere/ringTable.js';

const here = dirname(fileURLToPath(import.meta.url));

/** Small seeded generator (mulberry32; public-domain construction) for reproducible invented data. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const rand = mulberry32(20261202);
const patches = [
  { lon: [22, 82], count: 18 },
  { lon: [128, 198], count: 12 },
];
const lines = [
  '# Invented catalogue of bright sources for the demo (not real sources).',
  '# Galactic coordinates in degrees; radius is the intrinsic extension in degrees.',
  'name,lon,lat,frame,radius',
];
let k = 1;
for (const p of patches) {
  for (let i = 0; i < p.count; i++, k++) {
    const lon = p.lon[0] + rand() * (p.lon[1] - p.lon[0]);
    const lat = (rand() - 0.5) * 3.0;
    const radius = 0.1 + 0.5 * rand() * rand();
    lines.push(`FX-${String(k).padStart(2, '0')},${lon.toFixed(2)},${lat.toFixed(2)},galactic,${radius.toFixed(2)}`);
  }
}
writeFileSync(join(here, 'northern-plane', 'sources.csv'), lines.join('\n') + '\n');

// Invented diffuse intensity: E^2 I = 1.1e-7 GeV cm^-2 s^-1 sr^-1 at 20 TeV, index 2.85,
// with made-up scatter; relative errors grow with energy; the last point is an upper limit.
const energiesTeV = [20, 50, 150, 400, 1000];
const relErr = [0.12, 0.15, 0.22, 0.35, 0];
const pts = [
  '# Invented diffuse gamma-ray points of the fictional Kestrel Ridge Array (demo data, not a measurement).',
  '# energy_unit: TeV',
  '# value_unit: GeV cm^-2 s^-1 sr^-1',
  'energy,value,err_low,err_high,ul',
];
energiesTeV.forEach((e, i) => {
  const model = 1.1e-7 * Math.pow(e / 20, -0.85);
  if (relErr[i] === 0) {
    pts.push(`${e},${(model * 2.2).toPrecision(3)},,,1`);
    return;
  }
  const v = model * (1 + relErr[i] * 0.6 * (rand() - 0.5));
  pts.push(`${e},${v.toPrecision(3)},${(v * relErr[i] * 0.9).toPrecision(2)},${(v * relErr[i] * 1.1).toPrecision(2)},0`);
});
writeFileSync(join(here, 'northern-plane', 'gamma-points.csv'), pts.join('\n') + '\n');

// The same invented points as flux-point tables (E^2 dN/dE in GeV cm-2 s-1 sr-1, energies in TeV).
const points = parseSpectrumPoints(pts.join('\n') + '\n', 'gamma-points.csv');
const fpOptions = { sedType: 'e2dnde' as const, energyUnit: 'TeV', valueEnergyUnit: 'GeV', meta: { COMMENT: 'INVENTED demo points of a fictional array, not a measurement' } };
writeFileSync(join(here, 'northern-plane', 'gamma-points.ecsv'), formatFluxPointsEcsv(points, fpOptions));
writeFileSync(join(here, 'northern-plane', 'gamma-points.fits'), formatFluxPointsFits(points, { ...fpOptions, meta: { DEMO: true } }));

// Invented neutrino template: a Galactic band (latitude width 4 deg) brighter towards the centre
// (longitude width 50 deg) on an isotropic floor; normalised to mean 1 over the sky.
function ringMap(nside: number, f: (lonRad: number, latRad: number) => number): Float32Array {
  const t = ringTable(nside);
  const v = new Float64Array(12 * nside * nside);
  for (let r = 0; r < t.count; r++) {
    const lat = Math.PI / 2 - t.theta[r];
    for (let j = 0; j < t.length[r]; j++) v[t.first[r] + j] = f(t.phi0[r] + j * t.dphi[r], lat);
  }
  let mean = 0;
  for (let i = 0; i < v.length; i++) mean += v[i] / v.length;
  return Float32Array.from(v, (x) => x / mean);
}
const deg = Math.PI / 180;
const nuTemplate = ringMap(32, (l, b) => {
  const lc = l > Math.PI ? l - 2 * Math.PI : l;
  return (0.3 + Math.exp(-(lc * lc) / (2 * (50 * deg) ** 2))) * Math.exp(-(b * b) / (2 * (4 * deg) ** 2)) + 0.02;
});
writeMapFile(join(here, 'northern-plane', 'neutrino-template.fits'),
  createSkyMap({ nside: 32, ordering: 'RING', frame: 'galactic', column: 'TEMPLATE', unit: '', planes: [nuTemplate] }),
  { force: true, header: { COMMENT: 'INVENTED neutrino template of a fictional analysis (mean 1 over the sky), not real', DEMO: true } });
// Invented acceptance in equatorial coordinates: 0.25 at the south celestial pole to 1 at the north pole (mean-1 scaled).
const acceptance = ringMap(16, (_ra, dec) => 0.25 + 0.75 * (1 + Math.sin(dec)) / 2);
writeMapFile(join(here, 'northern-plane', 'neutrino-acceptance.fits'),
  createSkyMap({ nside: 16, ordering: 'RING', frame: 'equatorial', column: 'ACCEPTANCE', unit: '', planes: [acceptance] }),
  { force: true, header: { COMMENT: 'INVENTED acceptance of a fictional neutrino analysis, not real', DEMO: true } });
console.log('wrote examples/northern-plane/sources.csv, gamma-points.csv/.ecsv/.fits, neutrino-template.fits and neutrino-acceptance.fits');
