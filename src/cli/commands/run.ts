/**
 * `skyspan run PLAN -o OUTDIR`: the whole job from a plan file (see
 * docs/plan.md): parses the options, calls runPlan, prints a short summary
 * and the report path.
 */
import type { Command } from 'commander';
import { UsageError } from '../../core/errors.js';
import { runPlan } from '../../plan/runPlan.js';
import { runPlanShard } from '../../plan/factorShard.js';
import { parseShard } from '../../scaling/shards.js';
import { discardNote } from '../../plan/cache.js';
import type { CliIo } from '../main.js';

interface Options { shard?: string; out?: string; force?: boolean; cache: boolean; cacheDir?: string; json?: boolean; quiet?: boolean }

async function action(planPath: string, o: Options, io: CliIo): Promise<void> {
  if (!o.out) throw new UsageError('run needs an output folder: -o OUTDIR');
  if (o.shard !== undefined) {
    const s = await runPlanShard(planPath, parseShard(o.shard), { outDir: o.out, force: o.force, cache: o.cache, cacheDir: o.cacheDir });
    for (const f of s.cache.discarded) io.err(`${discardNote(f)}\n`);
    if (o.json) { io.out(JSON.stringify({ shard: s.path, templates: s.templates, rows: s.rows }, null, 2) + '\n'); return; }
    io.out(`factor stage only: ${s.templates} template${s.templates === 1 ? '' : 's'}, ${s.rows} rows\nwrote ${s.path}\n`);
    return;
  }
  const r = await runPlan(planPath, { outDir: o.out, force: o.force, cache: o.cache, cacheDir: o.cacheDir });
  for (const f of r.cache.discarded) io.err(`${discardNote(f)}\n`);
  for (const n of r.cache.notes) io.err(`${n}\n`);
  if (o.json) {
    io.out(JSON.stringify({ outDir: r.outDir, report: r.report, results: r.results, files: r.files, headline: r.headline,
      cache: { dir: r.cache.dir, hits: r.cache.hits, misses: r.cache.misses, discarded: r.cache.discarded } }, null, 2) + '\n');
    return;
  }
  if (!o.quiet) {
    if (r.headline.text) io.out(`${r.headline.text}\n`);
    io.out(`cache: ${r.cache.dir ?? 'off'} (${r.cache.hits.length} hits, ${r.cache.misses.length} computed)\n`);
    io.out(`wrote ${r.files.length} files to ${r.outDir}\n`);
  }
  io.out(`report: ${r.report ?? '(no report: outputs.report is false)'}\n`);
}

/** Registers `run`. */
export function register(program: Command, io: CliIo): void {
  program.command('run')
    .description('run a plan file: factors, conversion, comparison, pictures, tables, report and provenance in one folder')
    .argument('<plan>', 'plan file (YAML)')
    .option('-o, --out <dir>', 'output folder')
    .option('--force', 'replace the output folder of an earlier run, as a whole, once every new file is written')
    .option('--no-cache', 'compute every intermediate afresh and store none')
    .option('--cache-dir <dir>', 'cache folder (default: .skyspan-cache beside the output folder)')
    .option('--json', 'print the summary as JSON')
    .option('--quiet', 'print only the report path')
    .option('--shard <K/N>', 'only the factor stage, for templates K, K+N, ...: writes factors-shard-K-of-N.json to OUTDIR for skyspan merge-factors')
    .addHelpText('after', '\nExample:\n  skyspan run examples/northern-plane/plan.yaml -o out/northern-plane --force\n'
      + '  skyspan run plan.yaml --shard 2/4 -o parts/   (then: skyspan merge-factors parts/factors-shard-*-of-4.json -o out/)\n'
      + 'Every result assumes the template shape holds in the unseen sky and that the emission is hadronic.\n')
    .action((plan: string, o: Options) => action(plan, o, io));
}
