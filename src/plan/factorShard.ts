/**
 * A shard of a plan's factor stage, for a cluster: `runPlanShard(plan,
 * {k, n})` loads only the template sources K, K+N, K+2N, ... of the run (in
 * the run's order: template files, then specs to build, then the shipped
 * ensemble; counted from 1), computes their rows of the run's factor table
 * (factors.*) exactly as the whole run does, and writes the partial result
 * `factors-shard-K-of-N.json` (scaling/shards.ts, the same format as
 * `skyspan factors --shard`), with the plan's SHA-256 among its inputs.
 * `skyspan merge-factors` combines the N partial results into the run's
 * factor table. Only the factor stage is sharded: the prediction, comparison
 * and forecast draw over the whole ensemble and are made by a whole run.
 */
import { mkdirSync } from 'node:fs';
import { join, resolve, dirname, basename } from 'node:path';
import { writeFileAtomic } from '../io/atomicWrite.js';
import { sha256File } from '../io/hash.js';
import { FactorJob } from '../scaling/factorJob.js';
import { addTemplateInMemory } from '../scaling/ensembleFactors.js';
import { inShard, makePartial, type Shard } from '../scaling/shards.js';
import type { ProvenanceInput } from '../scaling/provenance.js';
import { shippedEnsembleDir, shippedTemplateNames } from '../templates/ensemble.js';
import { ArtefactCache, type CacheStats } from './cache.js';
import { loadPlan } from './loadPlan.js';
import { factorTableSelection, planEnergies } from './planEnergies.js';
import { cachedRegions, isWholeSky, regionFiles } from './regionWeights.js';
import { loadRunTemplates, templateFileList } from './templateStage.js';

/** Options of {@link runPlanShard}: as for runPlan (outDir holds the partial result). */
export interface ShardRunOptions { outDir: string; force?: boolean; cache?: boolean; cacheDir?: string; date?: Date }

/** What {@link runPlanShard} returns. */
export interface ShardRunSummary { path: string; templates: number; rows: number; cache: CacheStats }

/** Runs shard `shard` of the factor stage of the plan at `planPath` (see module comment). */
export async function runPlanShard(planPath: string, shard: Shard, options: ShardRunOptions): Promise<ShardRunSummary> {
  const rp = loadPlan(planPath);
  const { plan } = rp;
  const outDir = resolve(options.outDir);
  const cacheDir = options.cache === false ? null : resolve(options.cacheDir ?? join(dirname(outDir), '.skyspan-cache'));
  const cache = new ArtefactCache(cacheDir);
  const e = planEnergies(rp);
  const sources = [...(rp.templateFiles.length ? templateFileList(rp.templateFiles) : []), ...rp.buildSpecs,
    ...(rp.shipped ? shippedTemplateNames().map((n) => join(shippedEnsembleDir(), `${n}.fits.gz`)) : [])];
  const select = (i: number) => inShard(i, shard);
  const { templates } = await loadRunTemplates({
    files: rp.templateFiles, specs: rp.buildSpecs, shipped: rp.shipped, buildNside: plan.templates.buildNside,
    absorptionNside: plan.methods.absorptionNside, absorption: plan.methods.absorption === 'cmb', gammaEnergiesGeV: e.gammaEnergiesGeV,
    frame: plan.templates.frame, planFile: rp.file, select,
  }, cache);
  const sel = factorTableSelection(rp, e.points !== null);
  const job = new FactorJob({ ...sel, regions: rp.regions, mode: plan.coverage, assumeFrame: plan.templates.frame,
    isWholeSky: (n: string) => isWholeSky(rp.regions, n) }, cachedRegions(rp.regions, cache));
  const weights = plan.templates.weights;
  for (const t of templates) {
    addTemplateInMemory(job, t.source!.index, t.source!.ordinal, { name: t.name, map: t.map, weight: weights?.[t.name] }, plan.templates.frame);
  }
  const otherInputs: ProvenanceInput[] = [];
  if (rp.file) otherInputs.push({ role: 'plan', path: rp.file, sha256: sha256File(rp.file) });
  if (rp.regionsFile) otherInputs.push({ role: 'regions', path: rp.regionsFile, sha256: sha256File(rp.regionsFile) });
  for (const f of regionFiles(rp.regions)) otherInputs.push({ role: 'region input', ...f });
  const read = [...new Map(templates.map((t) => [t.source!.index, { index: t.source!.index, path: t.origin.path, sha256: t.origin.sha256 }])).values()];
  const part = makePartial(shard, { ...sel, mode: plan.coverage, frame: plan.templates.frame ?? null, regionSpec: rp.regions.source, weights: null },
    sources, otherInputs, read, job.log, `skyspan run ${basename(planPath)} --shard ${shard.k}/${shard.n}`, options.date);
  mkdirSync(outDir, { recursive: true });
  const path = join(outDir, `factors-shard-${shard.k}-of-${shard.n}.json`);
  writeFileAtomic(path, JSON.stringify(part) + '\n', { force: options.force, inputs: [...otherInputs.map((i) => i.path), ...sources] });
  return { path, templates: templates.length, rows: job.log.rows.length, cache: cache.stats };
}
