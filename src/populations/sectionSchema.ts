/**
 * The `populations` section of a plan file, checked with zod: keys, units in
 * their names (TeV, deg, erg/s, erg cm^-2 s^-1, pc, kpc), defaults. Turned into
 * a {@link PopulationModel} and a {@link DetectionThreshold} by section.ts.
 */
import { z } from 'zod';
import { RADIAL_LAW_NAMES } from '../templates/radialLaws.js';

const pos = z.number().positive();
const fin = z.number().finite();

const spatial = z.object({
  /** A source radial law of the template builder, 'constant', or 'ball' (uniform around the observer). */
  distribution: z.enum([...RADIAL_LAW_NAMES, 'constant', 'ball']).optional(),
  /** A template spec file with a `sources` block: its law, scale height and observer are used. */
  templateSpec: z.string().min(1).optional(),
  scaleHeightKpc: pos.optional(),
  rSunKpc: pos.optional(),
  zSunKpc: fin.optional(),
  rMaxKpc: pos.default(25),
  radiusKpc: pos.optional(),
}).strict();

const luminosity = z.object({
  kind: z.enum(['powerLaw', 'logNormal']).default('powerLaw'),
  alpha: fin.optional(),
  minErgPerS: pos.optional(),
  maxErgPerS: pos.optional(),
  medianErgPerS: pos.optional(),
  sigmaDex: z.number().nonnegative().optional(),
}).strict();

const spectrum = z.object({
  pivotTeV: pos.default(10),
  index: fin.default(2.5),
  indexSpread: z.number().nonnegative().default(0),
  cutoffTeV: pos.nullable().default(null),
}).strict();

const size = z.object({
  radiusPc: pos.optional(),
  minPc: pos.optional(),
  maxPc: pos.optional(),
}).strict();

const threshold = z.object({
  /** Threshold flux at the reference declination (E0^2 dN/dE at the pivot, erg cm^-2 s^-1). */
  fluxErgCm2S: pos.optional(),
  referenceDecDeg: z.number().min(-90).max(90).optional(),
  siteLatDeg: z.number().min(-90).max(90).optional(),
  maxZenithDeg: z.number().gt(0).max(90).optional(),
  weighting: z.enum(['zenith', 'time']).default('zenith'),
  exposurePower: z.number().positive().max(2).default(1),
  /** Or a HEALPix map of the threshold (same unit). */
  map: z.string().min(1).optional(),
  column: z.union([z.string(), z.number().int().nonnegative()]).optional(),
  psfDeg: pos.optional(),
}).strict();

const variant = z.object({
  label: z.string().min(1).optional(),
  alpha: fin.optional(),
  index: fin.optional(),
  distribution: z.enum([...RADIAL_LAW_NAMES, 'constant']).optional(),
  scaleHeightKpc: pos.optional(),
  weight: z.number().nonnegative().default(1),
}).strict();

/** The zod schema of the section (see docs in section.ts for the meaning of every key). */
export const populationSectionSchema = z.object({
  name: z.string().regex(/^[A-Za-z0-9._-]+$/, 'use letters, digits, dot, dash, underscore').default('population'),
  description: z.string().default(''),
  /** Number of sources (the reference count when calibrated). */
  count: pos,
  spatial,
  luminosity,
  spectrum: spectrum.default({ pivotTeV: 10, index: 2.5, indexSpread: 0, cutoffTeV: null }),
  size: size.optional(),
  energiesTeV: z.array(pos).min(1),
  threshold,
  regions: z.object({
    measured: z.string().min(1).optional(),
    neutrino: z.string().min(1).optional(),
    counts: z.array(z.string().min(1)).default([]),
  }).strict().default({ counts: [] }),
  exposureWeighted: z.boolean().default(false),
  calibration: z.object({
    region: z.string().min(1).optional(),
    fluxAboveErgCm2S: z.number().nonnegative().default(0),
    count: pos,
    /** What is adjusted: the number of sources, or a common factor on all luminosities. */
    adjust: z.enum(['count', 'luminosity']).default('count'),
    realisations: z.number().int().min(2).default(40),
  }).strict().optional(),
  catalogue: z.array(z.object({
    region: z.string().min(1).optional(),
    fluxErgCm2S: pos,
    count: z.number().nonnegative(),
  }).strict()).default([]),
  fluxGrid: z.object({ minErgCm2S: pos, maxErgCm2S: pos, points: z.number().int().min(2).max(400).default(31) }).strict().optional(),
  variants: z.array(variant).default([]),
  realisations: z.number().int().min(2).default(40),
  seed: z.number().int().nonnegative().default(1),
  nside: z.number().int().positive().default(64),
}).strict();

/** A checked section (defaults filled in). */
export type PopulationSection = z.output<typeof populationSectionSchema>;
/** One variant of a section. */
export type PopulationVariant = z.output<typeof variant>;
