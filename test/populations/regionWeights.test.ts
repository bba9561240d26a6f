/**
 * Region weights of sources: an isotropic population has the same mean
 * intensity in any region, exposure-weighted or not (isotropy, common
 * knowledge); a threshold map read from a FITS file resolves as the map says.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { Random } from '../../src/compare/random.js';
import { createSkyMap } from '../../src/maps/create.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { summedFlux } from '../../src/populations/counts.js';
import { drawRealisation, populationSampler } from '../../src/populations/realise.js';
import { regionWeightsOfSources } from '../../src/populations/sourcePixels.js';
import { runPopulationSection } from '../../src/populations/runSection.js';
import { ballModel } from './fixtures.js';
import { tempDir } from '../helpers/tempDir.js';

const doc = parseRegionDocument(`regions:
  site:
    site: { latDeg: 30, maxZenithDeg: 45, weight: zenith }
  cap:
    box: { frame: equatorial, latDeg: [20, 90] }
`);

describe('region weights of sources', () => {
  it('an isotropic population gives the all-sky mean intensity in an exposure-weighted region and in a cap', () => {
    // Far shell of a ball (d > 5 kpc of 10): the sum over sources in a region divided by its (weighted) solid
    // angle estimates the sky-mean intensity total / 4 pi; error ~ 1 / sqrt(sources in the region).
    const r = drawRealisation(populationSampler(ballModel(400000, 10)), new Random(3));
    const far = new Uint8Array(r.count);
    for (let i = 0; i < r.count; i++) far[i] = r.distanceKpc[i] > 5 ? 0 : 1; // 1 = left out
    const skyMean = summedFlux(r, null, far)[0] / (4 * Math.PI);
    const site = evaluateRegion(doc, 'site', { nside: 32, frame: 'galactic' });
    expect(site.exposure).not.toBeNull();
    for (const [region, ew] of [[site, true], [site, false], [evaluateRegion(doc, 'cap', { nside: 32, frame: 'galactic' }), false]] as const) {
      const { weight, solidAngleSr } = regionWeightsOfSources(r, region, ew);
      expect(Math.abs(summedFlux(r, weight, far)[0] / solidAngleSr / skyMean - 1)).toBeLessThan(0.01);
    }
  });

  it('reads a HEALPix threshold map: a survey that only sees the northern Galactic sky resolves nothing in the south', () => {
    const dir = tempDir('skyspan-pop-map-');
    const nside = 8, npix = 768, plane = new Float32Array(npix);
    for (let p = 0; p < npix; p++) plane[p] = p < npix / 2 ? 1e-12 : 0; // RING: the first half is the northern hemisphere
    writeMapFile(join(dir, 'threshold.fits'), createSkyMap({ nside, ordering: 'RING', frame: 'galactic', planes: [plane] }));
    const regions = parseRegionDocument('regions:\n  north:\n    box: { frame: galactic, latDeg: [5, 90] }\n  south:\n    box: { frame: galactic, latDeg: [-90, -5] }\n');
    const r = runPopulationSection({
      name: 'map-survey', count: 3000, spatial: { distribution: 'ball', radiusKpc: 3 },
      luminosity: { alpha: 2, minErgPerS: 1e32, maxErgPerS: 1e34 }, energiesTeV: [10],
      threshold: { map: 'threshold.fits' }, regions: { counts: ['north', 'south'] }, realisations: 3, nside: 16,
    }, { regions, baseDir: dir });
    const north = r.counts.find((c) => c.region === 'north')!, south = r.counts.find((c) => c.region === 'south')!;
    expect(north.resolved[0].mean).toBeGreaterThan(10);
    expect(south.resolved.every((s) => s.mean === 0)).toBe(true);
    expect(south.all[0].mean).toBeGreaterThan(10);
  });
});
