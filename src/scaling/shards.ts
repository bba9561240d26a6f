/**
 * Factor jobs split into shards for a cluster: shard K of N takes every N-th
 * template file starting at the K-th (K from 1) and saves its partial result
 * (the job log of factorJob.ts, the settings and the hashes of what it read);
 * {@link mergePartials} checks that the shards belong to one job and combines
 * them into exactly the result a single run gives (composeFactorResult).
 */
import { InputError } from '../core/errors.js';
import { VERSION } from '../version.js';
import { composeFactorResult, type FactorJobLog } from './factorJob.js';
import type { FactorResult } from './factorTypes.js';
import type { ProvenanceInput } from './provenance.js';

/** Marker of a partial-result file. */
export const PARTIAL_FORMAT = 'skyspan factor shard 1';

/** A shard: K of N, 1 <= K <= N. */
export interface Shard { k: number; n: number }

/** Parses `K/N` (1 <= K <= N, integers); `what` names the option in the error. */
export function parseShard(text: string, what = '--shard'): Shard {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const k = m ? Number(m[1]) : NaN, n = m ? Number(m[2]) : NaN;
  if (!(k >= 1 && n >= 1 && k <= n && n <= 100000)) {
    throw new InputError(`is '${text}', expected K/N with 1 <= K <= N (e.g. 3/8)`, { keyPath: what });
  }
  return { k, n };
}

/** True when template file `index` (from 0) belongs to `shard`. */
export function inShard(index: number, shard: Shard): boolean {
  return index % shard.n === shard.k - 1;
}

/** The settings every shard of one job must share. */
export interface ShardSettings {
  measured: string; targets: string[]; mode: 'fraction' | 'centre'; exposureWeighted: boolean;
  frame: string | null; regionSpec: unknown; weights: number[] | null;
}

/** A saved partial result (see module doc). */
export interface PartialFactors {
  format: typeof PARTIAL_FORMAT;
  version: string;
  shard: Shard;
  createdUtc: string;
  command: string | null;
  settings: ShardSettings;
  /** Every template file of the job, in order (all shards list the same). */
  templateFiles: string[];
  /** Inputs read by this shard besides templates (region file, catalogues, exposure maps). */
  otherInputs: ProvenanceInput[];
  /** The template files this shard read, with their SHA-256. */
  read: { index: number; path: string; sha256: string }[];
  log: FactorJobLog;
}

/** Builds the partial result of a shard. */
export function makePartial(shard: Shard, settings: ShardSettings, templateFiles: string[], otherInputs: ProvenanceInput[],
  read: { index: number; path: string; sha256: string }[], log: FactorJobLog, command: string | null, date = new Date()): PartialFactors {
  return { format: PARTIAL_FORMAT, version: VERSION, shard, createdUtc: date.toISOString(), command, settings, templateFiles, otherInputs, read, log };
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/**
 * Checks that `parts` (file name, parsed JSON) are the N shards of one job
 * (same skyspan version, region file, regions, mode, exposure weighting,
 * frame, weights and template list; each K once) and combines them: the
 * result, and the provenance inputs (region inputs, every template, every
 * shard file with `shardHashes`). Each refusal is one InputError naming the file.
 */
export function mergePartials(parts: { file: string; data: unknown }[], shardHashes: string[]): { result: FactorResult; inputs: ProvenanceInput[]; first: PartialFactors } {
  if (parts.length === 0) throw new InputError('no shard files given', {}, 'name the partial results of every shard');
  const ps = parts.map(({ file, data }) => {
    const p = data as PartialFactors;
    if (!p || typeof p !== 'object' || p.format !== PARTIAL_FORMAT) {
      throw new InputError(`is not a skyspan factor shard (format '${String((p as { format?: unknown })?.format)}')`, { file }, 'name files written by skyspan factors --shard');
    }
    return { file, p };
  });
  const { file: f0, p: p0 } = ps[0];
  const seen = new Map<number, string>();
  for (const { file, p } of ps) {
    const differ = (what: string) => new InputError(`${what} differs from that of ${f0}; shards of one job only`, { file });
    if (p.version !== p0.version || p.version !== VERSION) {
      throw new InputError(`was made by skyspan ${p.version}, but ${p.version !== p0.version ? `${f0} by ${p0.version}` : `this is ${VERSION}`}; re-run the shards with one version`, { file });
    }
    if (!same(p.otherInputs.find((i) => i.role === 'regions')?.sha256, p0.otherInputs.find((i) => i.role === 'regions')?.sha256) ||
      !same(p.settings.regionSpec, p0.settings.regionSpec)) throw differ('the region file');
    const planSha = (x: PartialFactors) => x.otherInputs.find((i) => i.role === 'plan')?.sha256;
    if (planSha(p) !== planSha(p0)) throw differ('the plan file (skyspan run --shard)');
    if (!same(p.otherInputs.map((i) => i.sha256), p0.otherInputs.map((i) => i.sha256))) throw differ('the region data (catalogues, exposure maps)');
    if (p.settings.measured !== p0.settings.measured || !same(p.settings.targets, p0.settings.targets)) throw differ('the measured or target regions');
    if (p.settings.mode !== p0.settings.mode) throw differ(`the mode (${p.settings.mode})`);
    if (p.settings.exposureWeighted !== p0.settings.exposureWeighted) throw differ('the exposure weighting');
    if (p.settings.frame !== p0.settings.frame) throw differ('the assumed frame');
    if (!same(p.settings.weights, p0.settings.weights)) throw differ('the template weights');
    if (!same(p.templateFiles, p0.templateFiles)) throw differ('the list of template files');
    if (p.shard.n !== p0.shard.n) throw new InputError(`is shard ${p.shard.k}/${p.shard.n} but ${f0} is of ${p0.shard.n}`, { file });
    if (seen.has(p.shard.k)) throw new InputError(`is shard ${p.shard.k}/${p.shard.n} like ${seen.get(p.shard.k)}`, { file }, 'give each shard once');
    seen.set(p.shard.k, file);
  }
  const geoms = new Map<string, string>();
  for (const { file, p } of ps) {
    for (const r of p.log.regions) {
      const key = `${r.geom} ${r.region.name}`, v = JSON.stringify(r.region);
      if (geoms.has(key) && geoms.get(key) !== v) throw new InputError(`region '${r.region.name}' at Nside/frame ${r.geom} differs from another shard's`, { file });
      geoms.set(key, v);
    }
  }
  const missing = [];
  for (let k = 1; k <= p0.shard.n; k++) if (!seen.has(k)) missing.push(k);
  if (missing.length) throw new InputError(`shard${missing.length > 1 ? 's' : ''} ${missing.join(', ')} of ${p0.shard.n} missing`, { file: f0 }, 'name the partial result of every shard');
  const result = composeFactorResult(ps.map(({ p }) => p.log), p0.settings.weights ?? undefined);
  const read = ps.flatMap(({ p }) => p.read).sort((a, b) => a.index - b.index);
  const inputs: ProvenanceInput[] = [...p0.otherInputs, ...read.map((r) => ({ role: 'template', path: r.path, sha256: r.sha256 })),
    ...ps.map(({ file, p }, i) => ({ role: `shard ${p.shard.k}/${p.shard.n}`, path: file, sha256: shardHashes[i] }))];
  return { result, inputs, first: p0 };
}
