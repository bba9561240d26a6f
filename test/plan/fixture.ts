/**
 * A small plan made in a temporary folder for the plan and report tests:
 * two synthetic templates at Nside 32 (smooth Galactic-plane shapes) with
 * invented survival maps beside them, a region file with a site, two plane
 * boxes and a source mask, the demo's invented gamma-ray points, and an
 * invented neutrino normalisation.
 */
import { copyFileSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { createSkyMap } from '../../src/maps/create.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { ringTable } from '../../src/sphere/ringTable.js';
import { nside2npix } from '../../src/sphere/nside.js';
import { survivalPathFor } from '../../src/templates/writeTemplate.js';
import { tempDir } from '../helpers/tempDir.js';

export const GAMMA_ENERGIES_GEV = [20e3, 50e3, 150e3, 200e3, 400e3];

function shape(nside: number, widthRad: number, lonWeight: number): Float64Array {
  const out = new Float64Array(nside2npix(nside));
  const rt = ringTable(nside);
  for (let r = 0; r < rt.count; r++) {
    const theta = rt.theta[r], b = Math.PI / 2 - theta;
    for (let k = 0; k < rt.length[r]; k++) {
      const phi = rt.phi0[r] + k * rt.dphi[r];
      out[rt.first[r] + k] = Math.exp(-Math.abs(b) / widthRad) * (1 + lonWeight * Math.cos(phi)) + 0.01;
    }
  }
  return out;
}

/** Writes the fixture and returns its folder and plan path. `extra` is appended to the plan text. */
export function makePlanFixture(opts: { absorption?: 'cmb' | 'none'; samples?: number; extra?: string } = {}): { dir: string; plan: string; templates: string } {
  const dir = tempDir('skyspan-plan-');
  const tdir = join(dir, 'templates');
  mkdirSync(tdir);
  const nside = 32;
  [['narrow', 0.05, 0.8], ['wide', 0.12, 0.3]].forEach(([name, w, lw]) => {
    const plane = shape(nside, w as number, lw as number);
    const path = join(tdir, `${name}.fits`);
    writeMapFile(path, createSkyMap({ nside, ordering: 'RING', frame: 'galactic', column: 'TEMPLATE', unit: 'cm^-2', planes: [plane] }));
    // invented survival: falls with energy, more absorbed towards the inner Galaxy
    const cosl = shape(nside, 10, 1).map((v) => (v - 0.01) / 2);
    const surv = GAMMA_ENERGIES_GEV.map((e) => Float64Array.from(cosl, (c) => Math.exp(-(e / 1e6) * (0.2 + 0.6 * c) * (w === 0.05 ? 1 : 1.3))));
    writeMapFile(survivalPathFor(path), createSkyMap({ nside, ordering: 'RING', frame: 'galactic', column: 'SURVIVAL', unit: '', planes: surv,
      energiesGeV: Float64Array.from(GAMMA_ENERGIES_GEV) }));
  });
  writeFileSync(join(dir, 'sources.csv'), 'name,lon,lat,frame,radius\nA,40,0.5,galactic,0.5\nB,150,-1,galactic,0.8\n');
  writeFileSync(join(dir, 'regions.yaml'), [
    'frame: galactic', 'regions:', '  seen:', '    site: { latDeg: 31, maxZenithDeg: 45, weight: zenith }',
    '  patches:', '    any:', '      - box: { lonDeg: [22, 82], latDeg: [-5, 5] }', '      - box: { lonDeg: [128, 198], latDeg: [-5, 5] }',
    '  bright:', '    sources: { file: sources.csv }', '  measured:', '    all: [seen, patches]', '    except: bright',
    '  plane:', '    band: { absLatDeg: [0, 5] }', '  sky: { sky: true }', ''].join('\n'));
  copyFileSync(new URL('../../examples/northern-plane/gamma-points.csv', import.meta.url), join(dir, 'gamma-points.csv'));
  writeFileSync(join(dir, 'neutrino.yaml'), ['kind: normalisation', 'label: invented test normalisation', 'flavour: all', 'energyUnit: TeV',
    'valueUnit: GeV^-1 cm^-2 s^-1 sr^-1', 'e0: 100', 'norm: 1.2e-18', 'errLow: 0.3e-18', 'errHigh: 0.4e-18', 'index: 2.7', ''].join('\n'));
  const plan = join(dir, 'plan.yaml');
  writeFileSync(plan, [
    'title: Test plan (invented data)', 'templates:', '  files: [templates]', 'regions: regions.yaml',
    'gamma:', '  points: gamma-points.csv', '  region: measured', '  mask: bright',
    'neutrino:', '  measurement: neutrino.yaml', '  region: sky', 'targets: [plane]',
    'methods:', `  absorption: ${opts.absorption ?? 'cmb'}`,
    'monteCarlo:', `  samples: ${opts.samples ?? 2000}`, '  seed: 5',
    'outputs:', '  mapWidth: 600', opts.extra ?? '', ''].join('\n'));
  return { dir, plan, templates: tdir };
}
