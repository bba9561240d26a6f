/**
 * Provenance of a factor table: what it was computed from (input files with
 * their SHA-256, the region document), how (measured and target regions, mode,
 * Nside, exposure weighting), by which skyspan version and when, and the
 * extrapolation assumption. Every table format carries it.
 */
import { sha256File } from '../io/hash.js';
import { VERSION } from '../version.js';
import type { FactorResult } from './ensembleFactors.js';

/** One input file and its content hash. */
export interface ProvenanceInput { role: string; path: string; sha256: string }

/** The provenance record (see module doc). */
export interface FactorProvenance {
  tool: 'skyspan';
  version: string;
  /** ISO 8601 UTC time the table was made. */
  createdUtc: string;
  command: string | null;
  inputs: ProvenanceInput[];
  /** The region document as given (plain data), for re-running. */
  regionSpec: unknown;
  measured: string;
  targets: string[];
  mode: 'fraction' | 'centre';
  exposureWeighted: boolean;
  /** Working Nside values (one per distinct template geometry) and frames. */
  nsides: number[];
  frames: string[];
  assumption: string;
  notes: string[];
  warnings: string[];
}

/** Hashes input files (role, path) with SHA-256 (FIPS 180-4). */
export function hashInputs(files: { role: string; path: string }[]): ProvenanceInput[] {
  return files.map((f) => ({ ...f, sha256: sha256File(f.path) }));
}

/**
 * Builds the provenance of `result`. `date` is injectable for reproducible
 * tests; `inputs` are already hashed (see {@link hashInputs}).
 */
export function buildProvenance(result: FactorResult, opts: {
  inputs: ProvenanceInput[]; regionSpec: unknown; command?: string; date?: Date;
}): FactorProvenance {
  return {
    tool: 'skyspan',
    version: VERSION,
    createdUtc: (opts.date ?? new Date()).toISOString(),
    command: opts.command ?? null,
    inputs: opts.inputs,
    regionSpec: opts.regionSpec ?? null,
    measured: result.measured,
    targets: result.targets,
    mode: result.mode,
    exposureWeighted: result.exposureWeighted,
    nsides: [...new Set(result.regions.map((r) => r.nside))].sort((a, b) => a - b),
    frames: [...new Set(result.regions.map((r) => r.frame))],
    assumption: result.assumption,
    notes: result.notes,
    warnings: result.warnings,
  };
}

/** Provenance as `key: value` lines (for comment headers), values JSON where not plain text. */
export function provenanceLines(p: FactorProvenance): string[] {
  const lines = [
    `made by skyspan ${p.version} on ${p.createdUtc}`,
    ...(p.command ? [`command: ${p.command}`] : []),
    `assumption: ${p.assumption}`,
    `measured region: ${p.measured}; targets: ${p.targets.join(', ')}`,
    `mode: ${p.mode === 'centre' ? 'pixel centre in region' : 'fractional pixel coverage'}; exposure weighted: ${p.exposureWeighted ? 'yes' : 'no'}`,
    `Nside: ${p.nsides.join(', ')}; frame: ${p.frames.join(', ')}`,
    ...p.inputs.map((i) => `input (${i.role}): ${i.path} sha256 ${i.sha256}`),
    `region spec: ${JSON.stringify(p.regionSpec)}`,
    ...p.notes.map((n) => `note: ${n}`),
    ...p.warnings.map((w) => w.startsWith('WARNING') ? w : `WARNING: ${w}`),
  ];
  return lines.map((l) => l.replace(/\s*\n\s*/g, ' '));
}
