/**
 * Benchmark of sky-map rendering at Nside 2048 into a 2048 x 1024 Mollweide
 * area, against healpy's Mollweide projector run in the same benchmark
 * (scripts/mollweide_healpy_bench.py, which times the projection alone, without
 * colouring or PNG encoding). Stages timed: the cached inverse (view), the
 * map-pixel lookup, the colouring kernel, and a full picture (renderSkyMap at
 * 2048 px wide with graticule, colour bar and PNG encoding) once view and lookup
 * are cached. Not a test: nothing is asserted on time.
 * Run alone: npx tsx bench/render.ts
 */
import { execFileSync } from 'node:child_process';
import { pathToFileURL } from 'node:url';
import { mollweideView } from '../src/render/skyView.js';
import { pixelLookup } from '../src/render/pixelLookup.js';
import { colouriseArea } from '../src/render/colourise.js';
import { createRaster } from '../src/render/raster.js';
import { colourLut } from '../src/render/colourMap.js';
import { resolveScale } from '../src/render/valueScale.js';
import { renderSkyMap } from '../src/render/skyImage.js';
import { ringTable } from '../src/sphere/ringTable.js';
import type { SkyMap } from '../src/maps/skyMap.js';

const NSIDE = 2048;
const IDENTITY = Float64Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1]);

function ms(t0: number): number { return performance.now() - t0; }

/** Runs the stages and the reference; prints times and the ratio. */
export async function benchRender(): Promise<void> {
  const t = ringTable(NSIDE);
  const plane = new Float32Array(12 * NSIDE * NSIDE);
  for (let r = 0; r < t.count; r++) {
    const b = Math.PI / 2 - t.theta[r];
    for (let j = 0; j < t.length[r]; j++) plane[t.first[r] + j] = Math.exp(-Math.abs(b) / 0.05) * (1.5 + Math.cos(t.phi0[r] + j * t.dphi[r]));
  }
  const map: SkyMap = { nside: NSIDE, ordering: 'RING', frame: 'galactic', column: 'BENCH', unit: 'arbitrary', planes: [plane], energiesGeV: null };
  let t0 = performance.now();
  const view = mollweideView(2048);
  const tView = ms(t0);
  t0 = performance.now();
  const look = pixelLookup(view, NSIDE, 'RING', IDENTITY);
  const tLook = ms(t0);
  const scale = resolveScale(plane, 'log');
  const raster = createRaster(2048, 1024);
  const lut = colourLut('magma');
  t0 = performance.now();
  colouriseArea(raster, 0, 0, 2048, 1024, plane, look, scale, lut);
  const tColour = ms(t0);
  renderSkyMap(map, { width: 2048, scale: 'log' }); // warm: builds this picture's view and lookup
  t0 = performance.now();
  const img = renderSkyMap(map, { width: 2048, scale: 'log' });
  const tFull = ms(t0);
  console.log(`render: Nside ${NSIDE} map, 2048 x 1024 Mollweide area`);
  console.log(`  cached inverse (d3 invert per pixel, once per size): ${tView.toFixed(0)} ms`);
  console.log(`  map-pixel lookup (once per size and Nside):          ${tLook.toFixed(0)} ms`);
  console.log(`  colouring kernel (per picture, log scale):           ${tColour.toFixed(0)} ms`);
  console.log(`  lookup + colouring:                                  ${(tLook + tColour).toFixed(0)} ms`);
  console.log(`  full picture ${img.width} x ${img.height} with overlays and PNG, view cached: ${tFull.toFixed(0)} ms`);
  try {
    const ref = JSON.parse(execFileSync('/usr/bin/python3', ['scripts/mollweide_healpy_bench.py', String(NSIDE), '2048'], { encoding: 'utf8' }));
    console.log(`  reference healpy MollweideProj ${ref.width} x ${ref.height}: grid+first ${(1000 * ref.gridSeconds).toFixed(0)} ms, projection ${(1000 * ref.projectSeconds).toFixed(0)} ms`);
    console.log(`  ratio (lookup + colouring) / healpy projection: ${((tLook + tColour) / (1000 * ref.projectSeconds)).toFixed(2)}`);
  } catch (e) {
    console.log(`  reference unavailable (/usr/bin/python3 with healpy): ${(e as Error).message.split('\n')[0]}`);
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await benchRender();
