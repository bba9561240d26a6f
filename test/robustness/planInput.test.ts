/**
 * Malformed plan files: every problem is one InputError line naming the plan
 * file and the key path, never a stack trace. A table of hand-made cases
 * (wrong types, missing keys, NaN/Infinity, huge numbers, names the region
 * document does not have, files that are missing), then a seeded fast-check
 * fuzz that mutates a valid plan and checks that only success or an
 * InputError comes out of loadPlan.
 * Expectations: the error contract of src/core/errors.ts; common practice,
 * no source.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { stringify } from 'yaml';
import { InputError } from '../../src/core/errors.js';
import { loadPlan } from '../../src/plan/loadPlan.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-plan-input-');
const planFile = join(dir, 'plan.yaml');
// An invented scenario: a gamma-ray survey box, a neutrino measurement of the plane (numbers invented).
const VALID = {
  title: 'invented robustness plan',
  regions: { frame: 'galactic', regions: { survey: { box: { lonDeg: [20, 110], latDeg: [-4, 4] } }, plane: { band: { absLatDeg: [0, 5] } }, sky: { sky: true } } },
  gamma: { points: 'points.csv', region: 'survey' },
  neutrino: {
    measurement: { kind: 'normalisation', energyUnit: 'GeV', valueUnit: 'GeV^-1 cm^-2 s^-1 sr^-1', e0: 10000, norm: 2e-15, err: 0.5e-15, index: 2.5, energyRange: [1000, 100000] },
    region: 'plane',
  },
  targets: ['sky'],
  monteCarlo: { samples: 1000, seed: 3 },
};
type Plan = Record<string, any>;

function load(plan: unknown): void {
  writeFileSync(planFile, typeof plan === 'string' ? plan : stringify(plan));
  loadPlan(planFile);
}

function errorOf(plan: unknown): Error {
  try { load(plan); } catch (e) { return e as Error; }
  throw new Error('expected an error, got none');
}

const edit = (f: (p: Plan) => void): Plan => { const p = structuredClone(VALID) as Plan; f(p); return p; };

describe('malformed plans: one line naming the plan file and key path', () => {
  it('the valid plan loads (so every case below differs from a working plan by one edit)', () => {
    expect(() => load(VALID)).not.toThrow();
  });

  const cases: [string, unknown, string][] = [
    ['YAML that does not parse', 'title: [unclosed', 'not valid YAML'],
    ['an empty file', '', 'key (document)'],
    ['a list', '- a\n- b\n', 'key (document)'],
    ['no title', edit((p) => { delete p.title; }), 'key title: found nothing (missing key)'],
    ['a number for the title', edit((p) => { p.title = 5; }), 'key title: found 5'],
    ['no neutrino section', edit((p) => { delete p.neutrino; }), 'key neutrino: found nothing (missing key)'],
    ['an unknown key', edit((p) => { p.colour = 'red'; }), "key colour: found unknown key 'colour'"],
    ['neither gamma nor forecast', edit((p) => { delete p.gamma; }), 'key gamma: found neither gamma nor forecast'],
    ['NaN samples', edit((p) => { p.monteCarlo.samples = NaN; }), 'key monteCarlo.samples: found NaN'],
    ['a huge sample count', edit((p) => { p.monteCarlo.samples = 1e12; }), 'key monteCarlo.samples: found 1000000000000, expected <= 10000000'],
    ['a negative seed', edit((p) => { p.monteCarlo.seed = -1; }), 'key monteCarlo.seed: found -1'],
    ['a build Nside of 100', edit((p) => { p.templates = { buildNside: 100 }; }), 'key templates.buildNside: found 100, expected a power of two'],
    ['Infinity in the flavour ratio', edit((p) => { p.methods = { flavourRatio: [1, Infinity, 1] }; }), 'key methods.flavourRatio[1]: found Infinity'],
    ['a zero flavour ratio', edit((p) => { p.methods = { flavourRatio: [0, 0, 0] }; }), 'key methods.flavourRatio: '],
    ['a negative reference energy', edit((p) => { p.methods = { referenceEnergyTeV: -5 }; }), 'key methods.referenceEnergyTeV: found -5'],
    ['a reference energy unlike the measurement', edit((p) => { p.methods = { referenceEnergyTeV: 3 }; }), 'key methods.referenceEnergyTeV: found 3 TeV'],
    ['an empty energy list', edit((p) => { p.forecast = { footprint: 'survey', energiesTeV: [] }; }), 'key forecast.energiesTeV: found []'],
    ['a huge picture width', edit((p) => { p.outputs = { mapWidth: 1e308 }; }), 'key outputs.mapWidth: found 1e+308'],
    ['an unknown coverage mode', edit((p) => { p.coverage = 'half'; }), 'key coverage: found "half"'],
    ['a text for the target list', edit((p) => { p.targets = 'sky'; }), 'key targets: found "sky"'],
    ['a region latitude of 95 deg (inline regions)', edit((p) => { p.regions.regions.survey = { disc: { atDeg: [10, 95], radiusDeg: 1 } }; }), 'regions.survey.disc.atDeg[1]: found 95'],
    ['a gamma region the regions do not have', edit((p) => { p.gamma.region = 'nowhere'; }), "key gamma.region: found region 'nowhere'"],
    ['a target the regions do not have', edit((p) => { p.targets = ['sky', 'nope']; }), "key targets[1]: found region 'nope'"],
    ['NaN in the measurement', edit((p) => { p.neutrino.measurement.norm = NaN; }), 'key neutrino.measurement.norm: '],
    ['a negative normalisation', edit((p) => { p.neutrino.measurement.norm = -1; }), 'key neutrino.measurement.norm: '],
    ['an inverted energy range', edit((p) => { p.neutrino.measurement.energyRange = [1e5, 1e3]; }), 'key neutrino.measurement.energyRange: '],
    ['a measurement file that is missing', edit((p) => { p.neutrino.measurement = 'missing.yaml'; }), 'key neutrino.measurement: cannot read'],
    ['a region file that is missing', edit((p) => { p.regions = 'missing-regions.yaml'; }), 'key regions: cannot read'],
  ];
  it.each(cases)('%s', (_what, plan, where) => {
    const e = errorOf(plan);
    expect(e).toBeInstanceOf(InputError);
    expect(e.message).not.toContain('\n');
    expect(e.message.startsWith(planFile)).toBe(true);
    expect(e.message).toContain(where);
  });
});

// ---------------------------------------------------------------------------------------------

type Path = (string | number)[];
function paths(v: unknown, at: Path = [], out: Path[] = []): Path[] {
  if (v !== null && typeof v === 'object') {
    for (const [k, c] of Object.entries(v)) {
      const p = [...at, Array.isArray(v) ? Number(k) : k];
      out.push(p);
      paths(c, p, out);
    }
  }
  return out;
}
const REPLACEMENTS: unknown[] = [NaN, Infinity, -Infinity, 1e308, -1e308, 0, -1, 1e-300, 4097, '', 'text', 'sky', null, true, false,
  [], [1], [NaN, 1, 1], {}, { sky: true }];
type Mutation = { pick: number; op: 'delete' | 'replace' | 'insert'; value: number };
function mutate(doc: unknown, ms: Mutation[]): unknown {
  const copy = structuredClone(doc) as Record<string, unknown>;
  for (const m of ms) {
    const all = paths(copy);
    if (all.length === 0) break;
    const p = all[m.pick % all.length];
    let parent: Record<string | number, unknown> = copy;
    for (const k of p.slice(0, -1)) parent = parent[k] as Record<string | number, unknown>;
    const last = p[p.length - 1];
    const value = structuredClone(REPLACEMENTS[m.value % REPLACEMENTS.length]);
    if (m.op === 'delete') { if (Array.isArray(parent)) parent.splice(last as number, 1); else delete parent[last]; }
    else if (m.op === 'replace') parent[last] = value;
    else if (Array.isArray(parent)) parent.splice(last as number, 0, value);
    else parent[`${String(last)}X`] = value;
  }
  return copy;
}

describe('fuzz: mutated plans give success or one InputError', () => {
  it('300 mutations of the valid plan through loadPlan', () => {
    let refused = 0;
    fc.assert(fc.property(
      fc.array(fc.record({ pick: fc.nat(), op: fc.constantFrom('delete', 'replace', 'insert'), value: fc.nat() }) as fc.Arbitrary<Mutation>, { minLength: 1, maxLength: 3 }),
      (ms) => {
        try { load(mutate(VALID, ms)); } catch (e) {
          refused++;
          if (!(e instanceof InputError)) throw new Error(`not an InputError: ${(e as Error)?.stack ?? String(e)}`);
          if (e.message.includes('\n')) throw new Error(`message on several lines: ${e.message}`);
          if (!e.message.startsWith(planFile)) throw new Error(`message does not name the plan file: ${e.message}`);
        }
      }), { seed: 424242, numRuns: 300 });
    expect(refused).toBeGreaterThan(100);
  });
});
