/**
 * The plan file: one YAML document naming everything a run needs. Checked
 * with zod; every problem is one line with the key path, what was found and
 * what was expected (regions/schema.ts `checkWith`). Keys are documented in
 * docs/plan.md. Energies in keys ending TeV are in TeV; they become GeV in
 * plan/resolve.ts.
 */
import { z } from 'zod';

const posInt = z.number().int().positive();
const pow2 = posInt.refine((n) => n <= 8192 && (n & (n - 1)) === 0, 'a power of two from 1 to 8192');
const positive = z.number().positive();
const name = z.string().min(1);

/** Templates: files or folders of HEALPix maps, the shipped ensemble, and specs to build. */
const templates = z.strictObject({
  /** The ensemble shipped in templates/ (default when nothing else is named). */
  shipped: z.boolean().optional(),
  /** HEALPix FITS files or folders of them. */
  files: z.array(name).min(1).optional(),
  /** Template spec files (YAML) to build. */
  build: z.array(name).min(1).optional(),
  /** Nside of built templates (default 64). */
  buildNside: pow2.default(64),
  /** Weight per template name (all templates or none). */
  weights: z.record(name, z.number().nonnegative()).optional(),
  /** Frame of template files that do not state it. */
  frame: z.enum(['galactic', 'equatorial']).optional(),
});

const gamma = z.strictObject({
  points: name,
  region: name,
  exposureWeighted: z.boolean().default(true),
  /** A region drawn hatched on the map (pictures only), e.g. the source mask. */
  mask: name.optional(),
});

const neutrino = z.strictObject({
  measurement: z.union([name, z.record(z.string(), z.unknown())]),
  region: name,
  /** The neutrino analysis's spatial template (HEALPix FITS); the measured normalisation multiplies it as stored. */
  template: name.optional(),
  /** The neutrino analysis's acceptance (exposure) map (HEALPix FITS); default uniform. Needs template. */
  acceptance: name.optional(),
});

const methods = z.strictObject({
  /** Methods, first primary; default by channel (physics/hadronic/channels.ts): pp [kab, kpi], p-gamma [kpi]. */
  conversion: z.array(z.enum(['kab', 'kpi'])).min(1).optional(),
  absorption: z.enum(['cmb', 'none']).default('cmb'),
  /** Nside at which survival maps of the shipped ensemble are built (default 32). */
  absorptionNside: pow2.default(32),
  channel: z.enum(['pp', 'pgamma']).default('pp'),
  flavourRatio: z.tuple([z.number().nonnegative(), z.number().nonnegative(), z.number().nonnegative()]).default([1, 1, 1]),
  /** Reference neutrino energy (default: the measurement's). */
  referenceEnergyTeV: positive.optional(),
});

const monteCarlo = z.strictObject({
  samples: z.number().int().min(100).max(10_000_000).default(20000),
  seed: z.number().int().nonnegative().default(1),
});

const forecast = z.strictObject({
  footprint: name,
  exposureWeighted: z.boolean().default(true),
  /** Gamma-ray energies of the forecast (default: 8 values over twice the neutrino range). */
  energiesTeV: z.array(positive).min(1).optional(),
});

const outputs = z.strictObject({
  tables: z.array(z.enum(['csv', 'md', 'json', 'tex'])).min(1).default(['csv', 'md', 'json', 'tex']),
  maps: z.boolean().default(true),
  mapWidth: z.number().int().min(300).max(4000).default(1200),
  /** Template drawn on the map (default: the first). */
  mapTemplate: name.optional(),
  spectrum: z.boolean().default(true),
  report: z.boolean().default(true),
});

/** The whole plan. */
export const planSchema = z.strictObject({
  title: name,
  about: z.string().optional(),
  templates: templates.default({ buildNside: 64 }),
  /** A region file, or a region document written in place ({ frame?, regions: {...} }). */
  regions: z.union([name, z.record(z.string(), z.unknown())]),
  coverage: z.enum(['fraction', 'centre']).default('fraction'),
  gamma: gamma.optional(),
  neutrino,
  targets: z.array(name).default([]),
  methods: methods.default({ absorption: 'cmb', absorptionNside: 32, channel: 'pp', flavourRatio: [1, 1, 1] }),
  monteCarlo: monteCarlo.default({ samples: 20000, seed: 1 }),
  forecast: forecast.optional(),
  outputs: outputs.default({ tables: ['csv', 'md', 'json', 'tex'], maps: true, mapWidth: 1200, spectrum: true, report: true }),
  /** An unresolved-source population (checked and run by the populations layer). */
  populations: z.record(z.string(), z.unknown()).optional(),
});

/** A checked plan (defaults filled, paths as written). */
export type PlanDocument = z.output<typeof planSchema>;
