/**
 * Malformed plans: each is rejected with one line naming the plan file, the
 * expected key path, and what was found (common practice, no source: the
 * message format is skyspan's own, see docs/plan.md).
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { loadPlan } from '../../src/plan/loadPlan.js';
import { makePlanFixture } from './fixture.js';

const fx = makePlanFixture();
const good = {
  title: 'ok', templates: 'templates:\n  files: [templates]', regions: 'regions: regions.yaml',
  gamma: 'gamma:\n  points: gamma-points.csv\n  region: measured', neutrino: 'neutrino:\n  measurement: neutrino.yaml\n  region: sky',
};
function plan(over: Partial<Record<keyof typeof good, string | null>>, extra = ''): string {
  const g = { ...good, ...over };
  return [g.title === null ? '' : `title: ${g.title}`, g.templates, g.regions, g.gamma, g.neutrino, extra].filter((x) => x).join('\n') + '\n';
}

const cases: { name: string; text: string; keyPath: string; found?: RegExp }[] = [
  { name: 'title missing', text: plan({ title: null }), keyPath: 'title', found: /missing/ },
  { name: 'title a number', text: plan({ title: '5' }), keyPath: 'title' },
  { name: 'unknown top-level key', text: plan({}, 'colour: red'), keyPath: 'colour', found: /unknown key/ },
  { name: 'templates.files not a list', text: plan({ templates: 'templates:\n  files: templates' }), keyPath: 'templates.files' },
  { name: 'templates.buildNside not a power of two', text: plan({}, '').replace('files: [templates]', 'files: [templates]\n  buildNside: 100'), keyPath: 'templates.buildNside' },
  { name: 'templates.frame unknown', text: plan({ templates: 'templates:\n  files: [templates]\n  frame: ecliptic' }), keyPath: 'templates.frame' },
  { name: 'negative template weight', text: plan({ templates: 'templates:\n  files: [templates]\n  weights: { narrow: -1 }' }), keyPath: 'templates.weights.narrow' },
  { name: 'shipped false and nothing else', text: plan({ templates: 'templates:\n  shipped: false' }), keyPath: 'templates.shipped' },
  { name: 'regions missing', text: plan({ regions: null }), keyPath: 'regions' },
  { name: 'coverage unknown', text: plan({}, 'coverage: partial'), keyPath: 'coverage', found: /"partial"/ },
  { name: 'gamma.points missing', text: plan({ gamma: 'gamma:\n  region: measured' }), keyPath: 'gamma.points' },
  { name: 'gamma.region unknown name', text: plan({ gamma: 'gamma:\n  points: gamma-points.csv\n  region: nowhere' }), keyPath: 'gamma.region', found: /nowhere/ },
  { name: 'gamma.exposureWeighted not boolean', text: plan({ gamma: 'gamma:\n  points: gamma-points.csv\n  region: measured\n  exposureWeighted: maybe' }), keyPath: 'gamma.exposureWeighted' },
  { name: 'neither gamma nor forecast', text: plan({ gamma: null }), keyPath: 'gamma', found: /neither/ },
  { name: 'neutrino missing', text: plan({ neutrino: null }), keyPath: 'neutrino' },
  { name: 'neutrino.region unknown', text: plan({ neutrino: 'neutrino:\n  measurement: neutrino.yaml\n  region: galaxy' }), keyPath: 'neutrino.region' },
  { name: 'inline measurement with a bad norm', text: plan({ neutrino: 'neutrino:\n  region: sky\n  measurement: { kind: normalisation, energyUnit: TeV, valueUnit: GeV^-1 cm^-2 s^-1 sr^-1, e0: 100, norm: -1, err: 1, index: 2.7 }' }), keyPath: 'neutrino.measurement.norm' },
  { name: 'targets with an unknown region', text: plan({}, 'targets: [plane, halo]'), keyPath: 'targets[1]' },
  { name: 'unknown conversion method', text: plan({}, 'methods:\n  conversion: [kab, magic]'), keyPath: 'methods.conversion[1]' },
  { name: 'absorption unknown', text: plan({}, 'methods:\n  absorption: ebl'), keyPath: 'methods.absorption' },
  { name: 'channel unknown', text: plan({}, 'methods:\n  channel: pn'), keyPath: 'methods.channel' },
  { name: 'flavour ratio of two numbers', text: plan({}, 'methods:\n  flavourRatio: [1, 2]'), keyPath: 'methods.flavourRatio' },
  { name: 'flavour ratio all zero', text: plan({}, 'methods:\n  flavourRatio: [0, 0, 0]'), keyPath: 'methods.flavourRatio' },
  { name: 'reference energy differs from the measurement', text: plan({}, 'methods:\n  referenceEnergyTeV: 50'), keyPath: 'methods.referenceEnergyTeV', found: /100 TeV/ },
  { name: 'reference energy negative', text: plan({}, 'methods:\n  referenceEnergyTeV: -5'), keyPath: 'methods.referenceEnergyTeV' },
  { name: 'too few samples', text: plan({}, 'monteCarlo:\n  samples: 10'), keyPath: 'monteCarlo.samples', found: /10/ },
  { name: 'seed not an integer', text: plan({}, 'monteCarlo:\n  seed: 1.5'), keyPath: 'monteCarlo.seed' },
  { name: 'forecast footprint unknown', text: plan({}, 'forecast:\n  footprint: south'), keyPath: 'forecast.footprint' },
  { name: 'forecast energies not positive', text: plan({}, 'forecast:\n  footprint: measured\n  energiesTeV: [0]'), keyPath: 'forecast.energiesTeV[0]' },
  { name: 'unknown table format', text: plan({}, 'outputs:\n  tables: [csv, xlsx]'), keyPath: 'outputs.tables[1]' },
  { name: 'map width too small', text: plan({}, 'outputs:\n  mapWidth: 10'), keyPath: 'outputs.mapWidth' },
  { name: 'unknown key under outputs', text: plan({}, 'outputs:\n  pdf: true'), keyPath: 'outputs.pdf' },
  { name: 'gamma points file missing', text: plan({ gamma: 'gamma:\n  points: nope.csv\n  region: measured' }), keyPath: '', found: /nope\.csv/ },
];

describe('malformed plans', () => {
  it('has at least 20 cases', () => expect(cases.length).toBeGreaterThanOrEqual(20));
  it.each(cases)('$name', async ({ text, keyPath, found }) => {
    const path = join(fx.dir, 'bad.yaml');
    writeFileSync(path, text);
    let err: unknown;
    try {
      loadPlan(path);
      // a file that exists only at run time (the points) fails later, in the run
      const { runPlan } = await import('../../src/plan/runPlan.js');
      await runPlan(path, { outDir: join(fx.dir, 'never'), cache: false });
    } catch (e) { err = e; }
    expect(err).toBeInstanceOf(InputError);
    const msg = (err as Error).message;
    expect(msg).not.toContain('\n');
    if (keyPath) expect(msg).toContain(`key ${keyPath}:`);
    if (found) expect(msg).toMatch(found);
  });
  it('a valid plan loads with defaults filled in', () => {
    const path = join(fx.dir, 'good.yaml');
    writeFileSync(path, plan({}));
    const rp = loadPlan(path);
    expect(rp.plan.methods.absorption).toBe('cmb');
    expect(rp.plan.monteCarlo.samples).toBe(20000);
    expect(rp.templateFiles[0]).toBe(join(fx.dir, 'templates'));
  });
});
