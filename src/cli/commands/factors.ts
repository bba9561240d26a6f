/**
 * `skyspan factors`: extrapolation factors of templates from a measured region
 * to target regions, written as CSV, Markdown, JSON and LaTeX tables with
 * provenance. Without --templates the shipped ensemble is used.
 */
import { readInputText } from '../../io/inputFile.js';
import { statSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { UsageError } from '../../core/errors.js';
import { parseRegionDocument } from '../../regions/document.js';
import type { RegionDocument, RegionNode } from '../../regions/types.js';
import { regionBaseDir } from '../../regions/catalogue.js';
import { resample } from '../../maps/resample.js';
import { loadShippedEnsemble } from '../../templates/ensemble.js';
import { assertNside } from '../../sphere/nside.js';
import { computeFactors, regionEvaluator } from '../../scaling/factors.js';
import type { FactorResult, FactorTemplate } from '../../scaling/ensembleFactors.js';
import { listTemplateFiles, readTemplateFiles } from '../../scaling/templateFiles.js';
import { buildProvenance, hashInputs, type FactorProvenance, type ProvenanceInput } from '../../scaling/provenance.js';
import { composeFactorResult, FactorJob, type FactorJobSettings } from '../../scaling/factorJob.js';
import { reduceTemplateFilesParallel, workerCount } from '../../scaling/templatePool.js';
import { fileProgress } from '../fileProgress.js';
import { inShard, makePartial, parseShard } from '../../scaling/shards.js';
import { join } from 'node:path';
import { writeFileAtomic } from '../../io/atomicWrite.js';
import { renderFactorTables, TABLE_FORMATS, type TableFormat } from '../../scaling/tableText.js';
import { writeFactorTables } from '../../scaling/writeTables.js';
import type { CliIo } from '../main.js';

interface Options {
  regions: string; measured: string; target: string[]; templates?: string[]; weights?: string;
  centre?: boolean; exposure: boolean; frame?: string; nside?: string; format: string; out?: string;
  force?: boolean; json?: boolean; shard?: string; workers?: string;
}

/** Files a region document refers to (catalogues, exposure maps), resolved. */
function referencedFiles(doc: RegionDocument, regionFile: string): string[] {
  const base = regionBaseDir(regionFile, undefined);
  const out = new Set<string>();
  const walk = (n: RegionNode) => {
    if (n.kind === 'sources') out.add(resolve(base, n.file));
    if (n.kind === 'site' && n.weight.kind === 'map') out.add(resolve(base, n.weight.file));
    if (n.kind === 'all' || n.kind === 'any') n.items.forEach(walk);
    n.except.forEach(walk);
  };
  doc.regions.forEach(walk);
  return [...out];
}

function parseFrame(v: string | undefined): 'galactic' | 'equatorial' | undefined {
  if (v === undefined) return undefined;
  if (v !== 'galactic' && v !== 'equatorial') throw new UsageError(`--frame is '${v}', expected galactic or equatorial`);
  return v;
}

/** Parses --format: a comma-separated list of csv, md, json, tex. */
export function parseFormats(v: string): TableFormat[] {
  const fs = v.split(',').map((s) => s.trim()).filter(Boolean);
  for (const f of fs) if (!TABLE_FORMATS.includes(f as TableFormat)) throw new UsageError(`--format '${f}' is not one of ${TABLE_FORMATS.join(', ')}`);
  if (fs.length === 0) throw new UsageError('--format needs at least one of csv, md, json, tex');
  return [...new Set(fs)] as TableFormat[];
}

async function action(o: Options, io: CliIo, argv: string[]): Promise<void> {
  const frame = parseFrame(o.frame);
  const formats = parseFormats(o.format);
  const nside = o.nside === undefined ? undefined : Number(o.nside);
  if (nside !== undefined) assertNside(nside, { keyPath: '--nside' });
  const doc = parseRegionDocument(readInputText(o.regions), o.regions);
  const inputs: { role: string; path: string }[] = [{ role: 'regions', path: o.regions },
    ...referencedFiles(doc, o.regions).map((p) => ({ role: 'region data', path: p }))];
  const weights = o.weights === undefined ? undefined : o.weights.split(',').map(Number);
  const command = `skyspan ${argv.join(' ')}`;
  if (o.templates && o.templates.length && nside === undefined) {
    await streamed(o, io, { doc, frame, formats, weights, command, inputs });
    return;
  }
  if (o.shard !== undefined) throw new UsageError('--shard needs --templates and no --nside (shards stream template files)');
  let templates: (FactorTemplate & { file?: string })[];
  if (o.templates && o.templates.length) {
    const files = listTemplateFiles(o.templates);
    templates = readTemplateFiles(files, { frame });
    inputs.push(...files.map((p) => ({ role: 'template', path: p })));
  } else {
    templates = loadShippedEnsemble().map((t) => ({ name: t.name, map: t.map, file: t.file }));
    for (const t of templates) if (t.file) inputs.push({ role: 'template (shipped)', path: t.file });
  }
  if (weights !== undefined) {
    checkWeightCount(weights, templates.map((t) => t.name));
    templates.forEach((t, i) => { t.weight = weights[i]; });
  }
  const notes: string[] = [];
  if (nside !== undefined) {
    templates = templates.map((t) => {
      if (t.map.nside <= nside) return t;
      notes.push(`template '${t.name}' resampled from Nside ${t.map.nside} to ${nside} (pixel means)`);
      return { ...t, map: resample(t.map, nside, { quantity: 'intensive' }).map };
    });
  }
  const result = computeFactors({
    templates, regions: doc, measured: o.measured, targets: o.target, mode: o.centre ? 'centre' : 'fraction',
    exposureWeighted: o.exposure, assumeFrame: frame, requested: nside !== undefined ? { nside } : undefined,
  });
  result.notes.unshift(...notes);
  const prov = buildProvenance(result, { inputs: hashInputs(inputs), regionSpec: doc.source, command });
  emitFactorResult(result, prov, { ...o, formats, inputs: inputs.map((i) => i.path) }, io);
}

/** Bytes below which template files are reduced in this thread by default (a worker's start-up would cost more). */
const SMALL_JOB_BYTES = 64 * 2 ** 20;

/** --workers: a positive integer, or by default as many as cores and memory allow for jobs of 2+ files and 64 MiB+. */
function workers(v: string | undefined, files: string[]): number {
  if (v !== undefined) {
    const n = Number(v);
    if (!(Number.isInteger(n) && n >= 1)) throw new UsageError(`--workers is '${v}', expected a positive integer`);
    return workerCount(n, files.length);
  }
  const bytes = files.reduce((s, f) => s + statSync(f).size, 0);
  return files.length > 1 && bytes >= SMALL_JOB_BYTES ? workerCount(undefined, files.length) : 1;
}

function checkWeightCount(w: number[], names: string[]): void {
  if (w.length !== names.length) throw new UsageError(`--weights has ${w.length} values for ${names.length} templates (${names.join(', ')})`);
}

/**
 * The factor job over template files, streamed (scaling/streamFactors.ts):
 * the whole job, or with --shard K/N one shard's partial result.
 */
async function streamed(o: Options, io: CliIo, c: { doc: RegionDocument; frame?: 'galactic' | 'equatorial'; formats: TableFormat[];
  weights?: number[]; command: string; inputs: { role: string; path: string }[] }): Promise<void> {
  const shard = o.shard === undefined ? null : parseShard(o.shard);
  if (shard && !o.out) throw new UsageError('--shard needs -o <dir> for the partial result');
  const files = listTemplateFiles(o.templates!);
  const settings: FactorJobSettings = { regions: c.doc, measured: o.measured, targets: o.target, mode: o.centre ? 'centre' : 'fraction',
    exposureWeighted: o.exposure, assumeFrame: c.frame };
  const r = regionEvaluator(settings);
  const job = new FactorJob({ ...settings, isWholeSky: r.isWholeSky }, r.evaluate);
  const otherInputs = hashInputs(c.inputs);
  const select = shard ? (i: number) => inShard(i, shard) : () => true;
  const chosen = files.filter((_, i) => select(i));
  const progress = chosen.length > 1 ? fileProgress('templates') : null;
  const read = await reduceTemplateFilesParallel(job, files, { frame: c.frame, select, workers: workers(o.workers, chosen), onFile: progress?.tick })
    .finally(() => progress?.stop());
  const templateInputs: ProvenanceInput[] = read.map((f) => ({ role: 'template', path: f.file, sha256: f.sha256 }));
  if (shard) {
    const part = makePartial(shard, { measured: o.measured, targets: o.target, mode: o.centre ? 'centre' : 'fraction', exposureWeighted: o.exposure,
      frame: c.frame ?? null, regionSpec: c.doc.source, weights: c.weights ?? null }, files, otherInputs,
    read.map((f) => ({ index: f.index, path: f.file, sha256: f.sha256 })), job.log, c.command);
    const path = join(o.out!, `factors-shard-${shard.k}-of-${shard.n}.json`);
    writeFileAtomic(path, JSON.stringify(part) + '\n', { force: o.force, inputs: [...c.inputs.map((i) => i.path), ...files] });
    io.out(`shard ${shard.k}/${shard.n}: ${read.length} template file${read.length === 1 ? '' : 's'}, ${job.log.rows.length} rows\nwrote ${path}\n`);
    return;
  }
  if (c.weights) checkWeightCount(c.weights, job.log.templates.map((t) => t.name));
  const result = composeFactorResult([job.log], c.weights);
  const prov = buildProvenance(result, { inputs: [...otherInputs, ...templateInputs], regionSpec: c.doc.source, command: c.command });
  emitFactorResult(result, prov, { ...o, formats: c.formats, inputs: [...c.inputs.map((i) => i.path), ...files] }, io);
}

/** Prints and writes a factor result as `skyspan factors` does (tables in `o.out`, JSON with --json, else Markdown). */
export function emitFactorResult(result: FactorResult, prov: FactorProvenance,
  o: { out?: string; json?: boolean; force?: boolean; formats: TableFormat[]; inputs: string[] }, io: CliIo): void {
  const formats = o.formats;
  const written = o.out
    ? writeFactorTables(result, prov, { dir: o.out, formats, force: o.force, inputs: o.inputs })
    : [];
  for (const w of result.warnings) io.err(`skyspan: ${w}\n`);
  if (o.json) {
    io.out(JSON.stringify({ provenance: prov, rows: result.rows, summary: result.summary, regions: result.regions, written }, null, 2) + '\n');
  } else if (!o.out) {
    io.out(renderFactorTables(result, prov, 'md')[0].text);
  } else {
    for (const s of result.summary.filter((x) => x.quantity === 'kI' && x.plane === 0)) {
      io.out(`k_I ${result.measured} -> ${s.target}: median ${s.median.toPrecision(4)} (16-84%: ${s.p16.toPrecision(4)}-${s.p84.toPrecision(4)}) over ${s.count} templates\n`);
    }
    io.out(`assumption: ${result.assumption}\n`);
    for (const p of written) io.out(`wrote ${p}\n`);
  }
}

/** Registers `skyspan factors`. */
export function register(program: Command, io: CliIo): void {
  program.command('factors')
    .description('extrapolation factors of templates from a measured region to target regions, as tables with provenance')
    .requiredOption('--regions <file>', 'region file (YAML or JSON)')
    .requiredOption('--measured <name>', 'region where the measurement was made')
    .requiredOption('--target <names...>', 'one or more target regions')
    .option('--templates <paths...>', 'template FITS files or folders of them (default: the shipped ensemble)')
    .option('--weights <list>', 'comma-separated template weights for the ensemble summary, in template order')
    .option('--centre', 'count a pixel when its centre is inside (default: by covered fraction)')
    .option('--no-exposure', 'ignore the exposure weighting of the measured region')
    .option('--frame <frame>', 'frame of templates whose file does not state it: galactic or equatorial')
    .option('--nside <n>', 'working Nside: finer templates are resampled down to it (lowers memory)')
    .option('--format <list>', 'table formats: csv,md,json,tex', 'csv,md,json,tex')
    .option('-o, --out <dir>', 'folder for the tables (default: print a Markdown table)')
    .option('--force', 'replace existing tables')
    .option('--json', 'print the result as JSON')
    .option('--workers <n>', 'worker threads reducing template files (default: as many as cores and memory allow, for jobs of 64 MiB or more)')
    .option('--shard <K/N>', 'compute only template files K, K+N, K+2N, ... (K from 1) and write a partial result for merge-factors')
    .addHelpText('after', '\nExample:\n  skyspan factors --regions regions.yaml --measured survey --target plane sky \\\n    --templates models/ --centre -o out/ --format csv,tex\n' +
      '\nTemplate files are streamed: one pass over each file, whatever its number of planes.\n')
    .action(async (o: Options, cmd: Command) => {
      await action(o, io, (cmd.parent as unknown as { rawArgs?: string[] } | null)?.rawArgs ?? []);
    });
}
