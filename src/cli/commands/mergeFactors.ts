/**
 * `skyspan merge-factors`: combines the partial results of `skyspan factors
 * --shard K/N` (one per shard) into the tables a single run writes, with a
 * provenance listing every template and every shard. Shards of different
 * jobs (region file, regions, mode, weights, skyspan version) are refused.
 */
import { readFileSync } from 'node:fs';
import type { Command } from 'commander';
import { InputError } from '../../core/errors.js';
import { sha256File } from '../../io/hash.js';
import { buildProvenance } from '../../scaling/provenance.js';
import { mergePartials } from '../../scaling/shards.js';
import { emitFactorResult, parseFormats } from './factors.js';
import type { CliIo } from '../main.js';

function readPart(file: string): unknown {
  let text: string;
  try { text = readFileSync(file, 'utf8'); } catch (e) {
    throw new InputError(`cannot be read (${(e as NodeJS.ErrnoException).code ?? String(e)})`, { file }, 'check the path');
  }
  try { return JSON.parse(text); } catch (e) {
    throw new InputError(`is not JSON (${(e as Error).message})`, { file }, 'name files written by skyspan factors --shard');
  }
}

/** Registers `skyspan merge-factors`. */
export function register(program: Command, io: CliIo): void {
  program.command('merge-factors')
    .description('combine the partial results of skyspan factors --shard K/N into the tables of a single run')
    .argument('<parts...>', 'the partial results, one per shard (factors-shard-K-of-N.json)')
    .option('--format <list>', 'table formats: csv,md,json,tex', 'csv,md,json,tex')
    .option('-o, --out <dir>', 'folder for the tables (default: print a Markdown table)')
    .option('--force', 'replace existing tables')
    .option('--json', 'print the result as JSON')
    .addHelpText('after', '\nExample:\n  skyspan merge-factors parts/factors-shard-*-of-8.json -o out/ --format csv,tex\n')
    .action((parts: string[], o: { format: string; out?: string; force?: boolean; json?: boolean }, cmd: Command) => {
      const formats = parseFormats(o.format);
      const data = parts.map((file) => ({ file, data: readPart(file) }));
      const { result, inputs, first } = mergePartials(data, parts.map((p) => sha256File(p)));
      const argv = (cmd.parent as unknown as { rawArgs?: string[] } | null)?.rawArgs ?? [];
      const prov = buildProvenance(result, { inputs, regionSpec: first.settings.regionSpec, command: `skyspan ${argv.join(' ')}` });
      emitFactorResult(result, prov, { ...o, formats, inputs: [...parts, ...inputs.map((i) => i.path)] }, io);
    });
}
