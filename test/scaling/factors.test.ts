/**
 * computeFactors end to end with the regions layer (parseRegionDocument,
 * evaluateRegion). Sources named beside each check.
 */
import { describe, expect, it } from 'vitest';
import { computeFactors } from '../../src/scaling/factors.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { BLANK } from '../../src/maps/skyMap.js';
import { requirePython, runPython, skipWithoutPython } from '../helpers/python.js';
import { analyticTemplate, uniformTemplate } from './fixtures.js';

const D = Math.PI / 180;
const doc = parseRegionDocument(`
frame: galactic
regions:
  gbox: { box: { lonDeg: [20, 110], latDeg: [1, 5] } }
  band: { site: { latDeg: 33, maxZenithDeg: 45 } }
  survey:
    all:
      - site: { latDeg: 33, maxZenithDeg: 45 }
      - box: { lonDeg: [20, 110], latDeg: [-4, 4] }
    except:
      - disc: { atDeg: [35, 0.5], radiusDeg: 1.5 }
      - disc: { atDeg: [52, -1], radiusDeg: 1 }
      - disc: { atDeg: [78.5, 2], radiusDeg: 2 }
      - disc: { atDeg: [96, 0], radiusDeg: 1.2 }
  strip: { band: { absLatDeg: [0, 4] } }
  sky: { sky: true }
`);
// Spherical geometry (common knowledge): a longitude-latitude box has solid angle
// dl (sin b2 - sin b1); a declination band 2 pi (sin d2 - sin d1). The site at
// latitude 33 deg with zenith <= 45 deg sees declinations -12 .. 78 deg.
const OMEGA_BOX = 90 * D * (Math.sin(5 * D) - Math.sin(1 * D));
const OMEGA_BAND = 2 * Math.PI * (Math.sin(78 * D) - Math.sin(-12 * D));

describe('uniform template with fractional coverage (spherical geometry, common knowledge)', () => {
  it('k_I = 1 and k_F = Omega_B, matching the analytic solid angles to 1e-4 at Nside 256', () => {
    const r = computeFactors({ templates: [{ name: 'flat', map: uniformTemplate(256) }], regions: doc,
      measured: 'gbox', targets: ['band', 'gbox'], mode: 'fraction' });
    const [band, box] = r.rows;
    expect(band.kI).toBe(1);
    expect(Math.abs(band.kFSr / OMEGA_BAND - 1)).toBeLessThan(1e-4);
    expect(Math.abs(box.kFSr / OMEGA_BOX - 1)).toBeLessThan(1e-4);
    expect(Math.abs(band.solidAngleMeasuredSr / OMEGA_BOX - 1)).toBeLessThan(1e-4);
  });

  it('the error shrinks as Nside grows (fixed sub-division depth 2)', () => {
    const err = (nside: number) => {
      const r = computeFactors({ templates: [{ name: 'flat', map: uniformTemplate(nside) }], measured: 'gbox', targets: ['band'],
        evaluate: (name, o) => evaluateRegion(doc, name, { ...o, depth: 2 }) });
      return [Math.abs(r.rows[0].solidAngleMeasuredSr / OMEGA_BOX - 1), Math.abs(r.rows[0].kFSr / OMEGA_BAND - 1)];
    };
    const [b32, d32] = err(32), [b256, d256] = err(256);
    expect(b256).toBeLessThan(b32 / 4);
    expect(d256).toBeLessThan(d32 / 4);
  });
});

describe('against healpy + numpy (scripts/factor_reference.py), regions from the region language', () => {
  it.skipIf(skipWithoutPython)('footprint x box - four discs, centre mode, non-uniform template with blanks: factors to 1e-6', () => {
    requirePython(); // under CI=true a missing reference fails here
    const job = { nside: 128, site_lat_deg: 33, zenith_max_deg: 45, box_l_deg: [20, 110], box_b_deg: [-4, 4],
      discs_deg: [[35, 0.5, 1.5], [52, -1, 1], [78.5, 2, 2], [96, 0, 1.2]], strip_b_deg: 4, blank_stride: 101, exposure: false };
    const ref = JSON.parse(runPython('scripts/factor_reference.py', [], JSON.stringify(job)));
    for (const ordering of ['RING', 'NESTED'] as const) {
      const r = computeFactors({ templates: [{ name: 't', map: analyticTemplate(job.nside, ordering, job.blank_stride, BLANK) }],
        regions: doc, measured: 'survey', targets: ['strip', 'sky'], mode: 'centre' });
      const rel = (x: number, y: number) => expect(Math.abs(x / y - 1)).toBeLessThan(1e-6);
      expect(r.rows.length).toBeGreaterThan(0);
      for (const row of r.rows) {
        const t = ref.targets[row.target];
        rel(row.meanMeasured, ref.meanMeasured);
        rel(row.solidAngleMeasuredSr, ref.solidAngleMeasuredSr);
        rel(row.fourPiFactor, ref.fourPiFactor);
        rel(row.kI, t.kI);
        rel(row.kFSr, t.kFSr);
        rel(row.coveredFluxFraction, t.coveredFluxFraction);
        expect(row.blankMeasured).toBe(ref.blankMeasured);
        expect(row.blankTarget).toBe(t.blankTarget);
      }
    }
  });
});

describe('regions at the template geometry (behaviour of the factor layer; no outside source)', () => {
  it('an equatorial template gets its regions evaluated in equatorial coordinates, with a note', () => {
    const m = { ...uniformTemplate(32), frame: 'equatorial' as const };
    const r = computeFactors({ templates: [{ name: 'eq', map: m }], regions: doc, measured: 'band', targets: ['sky'],
      mode: 'fraction', requested: { nside: 64, frame: 'galactic' } });
    expect(r.regions[0]).toMatchObject({ name: 'band', nside: 32, frame: 'equatorial' });
    expect(r.notes.join(' ')).toMatch(/template 'eq' is at Nside 32 in equatorial coordinates \(requested Nside 64, galactic\)/);
    expect(Math.abs(r.rows[0].solidAngleMeasuredSr / OMEGA_BAND - 1)).toBeLessThan(1e-4);
  });
});
