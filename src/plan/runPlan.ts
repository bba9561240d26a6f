/**
 * `runPlan(planPath, options)`: the whole job from a plan file to one folder
 * of outputs — results.json, factor tables (CSV/MD/JSON/TeX), comparison
 * tables, survival table, sky map PNG, spectrum SVG, the HTML report and
 * provenance.json (input SHA-256, the resolved plan, skyspan and Node
 * versions, seed, time, and the SHA-256 of every output beside it). Every
 * destination is checked before the first is written; an existing file is
 * replaced only with `force`. The folder is written as a whole
 * (io/atomicFolder.ts): a `force` rerun replaces the previous run's folder
 * only once every new file is complete, so it always holds one run's outputs. Expensive intermediates are cached (cache.ts)
 * in `cacheDir`, by default `.skyspan-cache` beside the output folder.
 */
import { createHash } from 'node:crypto';
import { basename, dirname, join, resolve } from 'node:path';
import { writeFolderAtomic } from '../io/atomicFolder.js';
import { previousOutputs } from './previousOutputs.js';
import { sha256File } from '../io/hash.js';
import { renderReport, type ReportFigure, type ReportTable } from '../render/report.js';
import { renderComparison, summaryRows, type ComparisonReport } from '../compare/report.js';
import { predictionFluxPointFiles } from '../compare/spectrumFluxPoints.js';
import { buildProvenance } from '../scaling/provenance.js';
import { renderFactorTables } from '../scaling/tableText.js';
import { VERSION } from '../version.js';
import { ArtefactCache, type CacheStats } from './cache.js';
import { computePlan, type RunComputation } from './compute.js';
import { runFigures } from './runFigures.js';
import { runTableFiles } from './runTables.js';
import { loadPlan } from './loadPlan.js';
import { regionFiles } from './regionWeights.js';
import { headline, reportContent, type Headline } from './reportContent.js';
import { projectionResults, projectionTable } from './projectionReport.js';

/** Options of {@link runPlan}. */
export interface RunOptions {
  outDir: string;
  force?: boolean;
  /** false: compute everything afresh and store nothing. */
  cache?: boolean;
  /** Cache folder (default: `<parent of outDir>/.skyspan-cache`). */
  cacheDir?: string;
  /** Fixed time for reproducible outputs (tests). */
  date?: Date;
}

/** What {@link runPlan} returns. */
export interface RunSummary {
  outDir: string;
  files: string[];
  report: string | null;
  results: string;
  headline: Headline;
  cache: CacheStats;
  computation: RunComputation;
}

type Out = { name: string; data: string | Uint8Array };

function toJson(v: unknown): string {
  return JSON.stringify(v, (_, x) => (ArrayBuffer.isView(x) ? Array.from(x as unknown as ArrayLike<number>) : typeof x === 'number' && !Number.isFinite(x) ? String(x) : x), 2) + '\n';
}

/** Runs the plan at `planPath` (see module comment). */
export async function runPlan(planPath: string, options: RunOptions): Promise<RunSummary> {
  const rp = loadPlan(planPath);
  const outDir = resolve(options.outDir);
  const cacheDir = options.cache === false ? null : resolve(options.cacheDir ?? join(dirname(outDir), '.skyspan-cache'));
  const cache = new ArtefactCache(cacheDir);
  const date = options.date ?? new Date();
  const c = await computePlan(rp, cache);
  const { plan } = rp;

  const inputs: { role: string; path: string; sha256: string }[] = [];
  if (rp.file) inputs.push({ role: 'plan', path: rp.file, sha256: sha256File(rp.file) });
  if (rp.regionsFile) inputs.push({ role: 'regions', path: rp.regionsFile, sha256: sha256File(rp.regionsFile) });
  for (const f of regionFiles(rp.regions)) inputs.push({ role: 'region input', ...f });
  if (rp.gammaPointsFile) inputs.push({ role: 'gamma-ray points', path: rp.gammaPointsFile, sha256: sha256File(rp.gammaPointsFile) });
  if (rp.measurementFile) inputs.push({ role: 'neutrino measurement', path: rp.measurementFile, sha256: sha256File(rp.measurementFile) });
  if (rp.neutrinoTemplateFile) inputs.push({ role: 'neutrino template', path: rp.neutrinoTemplateFile, sha256: sha256File(rp.neutrinoTemplateFile) });
  if (rp.acceptanceFile) inputs.push({ role: 'neutrino acceptance', path: rp.acceptanceFile, sha256: sha256File(rp.acceptanceFile) });
  for (const t of c.templates) inputs.push({ role: `template (${t.origin.kind})`, path: t.origin.path, sha256: t.origin.sha256 });
  const inputPaths = inputs.map((i) => i.path);

  const outs: Out[] = [];
  const fr = c.factors ?? c.forecastFactors!;
  const fprov = buildProvenance(fr, { inputs, regionSpec: rp.regions.source, command: `skyspan run ${basename(planPath)}`, date });
  for (const f of plan.outputs.tables) outs.push(...renderFactorTables(fr, fprov, f, 'factors').map((x) => ({ name: x.name, data: x.text })));

  let compReport: ComparisonReport | null = null;
  if (c.prediction) {
    compReport = { prediction: c.prediction, measurement: rp.measurement, gammaPoints: c.points ?? undefined,
      reference: c.reference ?? undefined, points: c.pointsComparison ?? undefined,
      provenance: { tool: `skyspan ${VERSION}`, plan: rp.file ?? null, created: date.toISOString() } };
    const fmts = plan.outputs.tables.filter((f): f is 'csv' | 'md' | 'json' => f !== 'tex');
    outs.push(...renderComparison(compReport, fmts.length ? fmts : ['json'], 'comparison').map((x) => ({ name: x.name, data: x.text })));
    outs.push(...predictionFluxPointFiles(c.prediction));
  }
  outs.push(...runTableFiles(rp, c));
  if (c.populations) {
    outs.push({ name: 'populations-counts.csv', data: c.populations.tables.counts }, { name: 'populations-intensities.csv', data: c.populations.tables.intensities },
      { name: 'populations-counts.svg', data: c.populations.svg });
  }

  const pictures = runFigures(rp, c, compReport);
  outs.push(...pictures.files);
  const figures: ReportFigure[] = pictures.figures;
  const extraTables: ReportTable[] = [];
  if (c.projection) extraTables.push(projectionTable(c.projection));
  if (c.populations) figures.push({ id: 'fig-populations', svg: c.populations.svg, caption: `Source counts of the population '${c.populations.name}' (not applied to the headline).` });

  const h = headline(rp, c);
  const results = {
    title: plan.title, createdUtc: date.toISOString(), skyspan: VERSION, node: process.version,
    samples: plan.monteCarlo.samples, seed: plan.monteCarlo.seed, e0GeV: c.e0GeV, energiesNuGeV: c.energiesNuGeV,
    headline: h, absorption: c.absorptionStatement, perEnergyPrediction: c.perEnergy,
    factorsAtE0: c.factorsAtE0, survival: c.survival, forecastSurvival: c.forecastSurvival,
    factorSummary: c.factors?.summary ?? null,
    prediction: c.prediction ? { flavourRatio: c.prediction.flavourRatio, primaryMethod: c.prediction.primaryMethod,
      components: c.prediction.components.map((k) => ({ name: k.name, description: k.description, atE0: k.atE0, atEnergies: k.atEnergies })),
      methods: c.prediction.methods.map((m) => ({ id: m.id, label: m.label, atE0: m.atE0, atEnergies: m.atEnergies })),
      assumptions: c.prediction.assumptions, notes: c.prediction.notes, warnings: c.prediction.warnings, linearCheck: c.prediction.linearCheck } : null,
    comparison: c.reference, pointsComparison: c.pointsComparison,
    templateProjection: c.projection ? projectionResults(c.projection) : null,
    forecast: c.forecast ? { energiesGammaGeV: c.forecast.energiesGammaGeV, components: c.forecast.components, methods: c.forecast.methods,
      assumptions: c.forecast.assumptions, notes: c.forecast.notes, warnings: c.forecast.warnings } : null,
    populations: c.populations ? { name: c.populations.name, catalogue: c.populations.catalogue, unresolvedMeasured: c.populations.unresolvedMeasured,
      neutrinoAll: c.populations.neutrinoAll, assumptions: c.populations.assumptions, notes: c.populations.notes, warnings: c.populations.warnings } : null,
    notes: c.notes, cache: { dir: cache.stats.dir, hits: cache.stats.hits.length, misses: cache.stats.misses.length, discarded: cache.stats.discarded.length },
  };
  outs.push({ name: 'results.json', data: toJson(results) });

  const planSha = rp.file ? sha256File(rp.file) : null;
  const provBase = { tool: 'skyspan', skyspanVersion: VERSION, nodeVersion: process.version, createdUtc: date.toISOString(),
    seed: plan.monteCarlo.seed, samples: plan.monteCarlo.samples, plan: rp.file ?? null, planSha256: planSha, resolvedPlan: plan, inputs,
    cache: cacheDir ?? 'off' };
  if (plan.outputs.report) {
    const provList: [string, string | number | boolean][] = [
      ['skyspan', VERSION], ['Node', process.version], ['created (UTC)', date.toISOString()], ['seed', plan.monteCarlo.seed],
      ['Monte Carlo samples', plan.monteCarlo.samples], ...inputs.map((i): [string, string] => [`${i.role}: ${basename(i.path)}`, `sha256 ${i.sha256}`]),
      ['full record', 'provenance.json beside this file'],
    ];
    const html = renderReport(reportContent(rp, c, h, figures, provList, compReport ? summaryRows(compReport) : [], extraTables));
    outs.push({ name: 'report.html', data: html });
  }
  const outputsList = outs.map((o) => ({ file: o.name, sha256: createHash('sha256').update(o.data).digest('hex') }));
  outs.push({ name: 'provenance.json', data: toJson({ ...provBase, outputs: outputsList }) });

  writeFolderAtomic(outDir, outs, { force: options.force, inputs: inputPaths, replaceable: previousOutputs(outDir) });
  return { outDir, files: outs.map((o) => join(outDir, o.name)), report: plan.outputs.report ? join(outDir, 'report.html') : null,
    results: join(outDir, 'results.json'), headline: h, cache: cache.stats, computation: c };
}
