/**
 * `skyspan sources`: runs a source-population section (given alone, or as the
 * `populations` key of a larger YAML/JSON file) and writes the N(>S) table
 * (CSV and JSON), the source-intensity table and the log N - log S plot (SVG).
 */
import { readInputText } from '../../io/inputFile.js';
import { dirname, join, resolve } from 'node:path';
import type { Command } from 'commander';
import { parse as parseYaml } from 'yaml';
import { InputError, UsageError } from '../../core/errors.js';
import { checkWritable, ensureOutputFolder, writeFileAtomic } from '../../io/atomicWrite.js';
import { parsePopulationSection } from '../../populations/section.js';
import { runPopulationSection, type PopulationSectionResult } from '../../populations/runSection.js';
import { parseRegionDocument } from '../../regions/document.js';
import type { CliIo } from '../main.js';

interface Options { regions?: string; out?: string; seed?: string; realisations?: string; force?: boolean; json?: boolean }

function integerOption(v: string | undefined, name: string, min: number): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!(Number.isInteger(n) && n >= min)) throw new UsageError(`${name} is '${v}', expected an integer >= ${min}`);
  return n;
}

/** The JSON document: everything except the raw samples and the SVG. */
function jsonOf(r: PopulationSectionResult, written: string[]): unknown {
  return {
    name: r.name, realisations: r.realisations, energiesGeV: Array.from(r.energiesGeV), fluxGridErgCm2S: Array.from(r.grid),
    variants: r.variants, catalogue: r.catalogue,
    counts: r.counts.map((c) => ({ region: c.region, all: c.all.map((s) => ({ mean: s.mean, p16: s.p16, p84: s.p84 })), resolved: c.resolved.map((s) => ({ mean: s.mean, p16: s.p16, p84: s.p84 })) })),
    unresolvedMeasured: r.unresolvedMeasured?.map((s) => ({ mean: s.mean, std: s.std, p16: s.p16, p84: s.p84 })) ?? null,
    neutrinoAll: r.neutrinoAll?.map((s) => ({ mean: s.mean, std: s.std, p16: s.p16, p84: s.p84 })) ?? null,
    units: { flux: 'erg cm^-2 s^-1 (E0^2 dN/dE at the pivot)', intensity: 'GeV^-1 cm^-2 s^-1 sr^-1' },
    assumptions: r.assumptions, notes: r.notes, warnings: r.warnings, written,
  };
}

async function action(file: string, o: Options, io: CliIo): Promise<void> {
  const text = readInputText(file);
  let data: unknown;
  try { data = parseYaml(text); } catch (e) { throw new InputError(`not valid YAML: ${(e as Error).message.split('\n')[0]}`, { file }); }
  const nested = data !== null && typeof data === 'object' && 'populations' in (data as Record<string, unknown>);
  const prefix = nested ? 'populations' : '';
  const raw = nested ? (data as Record<string, unknown>).populations : data;
  const sec = parsePopulationSection(raw, file, prefix);
  const seed = integerOption(o.seed, '--seed', 0), realisations = integerOption(o.realisations, '--realisations', 2);
  if (seed !== undefined) sec.seed = seed;
  if (realisations !== undefined) sec.realisations = realisations;
  const regions = o.regions ? parseRegionDocument(readInputText(o.regions), o.regions) : null;
  const result = runPopulationSection(sec, { regions, file, keyPath: prefix, baseDir: dirname(resolve(file)) });
  const inputs = [resolve(file), ...(o.regions ? [resolve(o.regions)] : [])];
  const written: string[] = [];
  if (o.out) {
    const stem = join(o.out, result.name);
    const outputs: [string, string][] = [
      [`${stem}-counts.csv`, result.tables.counts], [`${stem}-intensities.csv`, result.tables.intensities], [`${stem}-lognlogs.svg`, result.svg],
    ];
    const jsonPath = `${stem}-counts.json`;
    ensureOutputFolder(o.out);
    // Refuse before writing anything, so that a refused run leaves no partial set of outputs.
    for (const p of [...outputs.map((x) => x[0]), jsonPath]) checkWritable(p, { force: o.force, inputs });
    for (const [p, t] of outputs) { writeFileAtomic(p, t, { force: o.force, inputs }); written.push(p); }
    writeFileAtomic(jsonPath, JSON.stringify(jsonOf(result, [...written, jsonPath]), null, 2) + '\n', { force: o.force, inputs });
    written.push(jsonPath);
  }
  for (const w of result.warnings) io.err(`skyspan: ${w}\n`);
  if (o.json) { io.out(JSON.stringify(jsonOf(result, written), null, 2) + '\n'); return; }
  if (!o.out) { io.out(result.tables.counts); return; }
  for (const n of result.notes) io.out(`${n}\n`);
  const sky = result.counts[0];
  io.out(`N(>S) over the whole sky, mean of ${result.realisations} realisations: ${sky.all[0].mean.toPrecision(4)} above ${result.grid[0].toPrecision(3)} erg cm^-2 s^-1\n`);
  if (result.unresolvedMeasured) io.out(`unresolved intensity in the measured region at ${result.energiesGeV[0]} GeV: ${result.unresolvedMeasured[0].mean.toPrecision(4)} +- ${result.unresolvedMeasured[0].std.toPrecision(2)} GeV^-1 cm^-2 s^-1 sr^-1\n`);
  for (const p of written) io.out(`wrote ${p}\n`);
}

/** Registers `skyspan sources`. */
export function register(program: Command, io: CliIo): void {
  program.command('sources')
    .description('Monte Carlo source populations: N(>S), which sources a survey resolves, unresolved-source intensities')
    .argument('<section>', 'YAML/JSON population section (alone or under a populations key)')
    .option('--regions <file>', 'region file the section\'s region names refer to')
    .option('-o, --out <dir>', 'folder for <name>-counts.csv/.json, <name>-intensities.csv and <name>-lognlogs.svg (default: print the N(>S) table)')
    .option('--seed <n>', 'override the section\'s seed')
    .option('--realisations <n>', 'override the section\'s number of realisations')
    .option('--force', 'replace existing outputs')
    .option('--json', 'print the result as JSON')
    .addHelpText('after', '\nExample:\n  skyspan sources nebulae.yaml --regions regions.yaml -o out/ --realisations 100\n')
    .action(async (file: string, o: Options) => { await action(file, o, io); });
}
