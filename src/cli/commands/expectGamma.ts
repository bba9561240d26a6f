/**
 * `skyspan expect-gamma`: the reverse of `compare`, for planning a survey. From
 * a neutrino measurement and the factors from the survey footprint to the
 * neutrino region, the hadronic gamma-ray intensity the footprint should see,
 * per uncertainty component and combined (seeded Monte Carlo). Writes CSV,
 * Markdown and JSON tables.
 */
import type { Command } from 'commander';
import { join } from 'node:path';
import { UsageError } from '../../core/errors.js';
import { formatCsv } from '../../io/csvWrite.js';
import { parseFlavourRatio } from '../../physics/hadronic/flavour.js';
import { readFactors } from '../../compare/factorsFile.js';
import { readMeasurement } from '../../compare/measurement.js';
import { expectedGamma } from '../../compare/reverse.js';
import type { CliIo } from '../main.js';
import { parseFormats, parseInteger, parseMethods, writeOutputs } from '../options.js';

interface Options {
  neutrino: string; factors: string; target?: string; methods: string; channel: string; flavourRatio: string;
  samples: string; seed: string; out?: string; format: string; force?: boolean; json?: boolean;
}

const fmt = (x: number) => (Number.isFinite(x) ? x.toPrecision(5) : '');

function action(o: Options, io: CliIo): void {
  const methods = parseMethods(o.methods);
  const formats = parseFormats(o.format);
  if (o.channel !== 'pp' && o.channel !== 'pgamma') throw new UsageError(`--channel is '${o.channel}', expected pp or pgamma`);
  const samples = parseInteger(o.samples, '--samples'), seed = parseInteger(o.seed, '--seed');
  const m = readMeasurement(o.neutrino);
  const fac = readFactors(o.factors, { target: o.target });
  const r = expectedGamma({ measurement: m, factors: fac.factors, methods, channel: o.channel as 'pp' | 'pgamma',
    flavourRatio: parseFlavourRatio(o.flavourRatio), samples, seed });
  const header = ['energyGeV', ...r.components.flatMap((c) => [`${c.name}P16`, `${c.name}Median`, `${c.name}P84`]),
    ...r.methods.map((x) => `method${x.id[0].toUpperCase()}${x.id.slice(1)}`)];
  const rows = Array.from(r.energiesGammaGeV, (e, j) => [fmt(e), ...r.components.flatMap((c) => [c.atEnergies[j].p16, c.atEnergies[j].median, c.atEnergies[j].p84].map(fmt)),
    ...r.methods.map((x) => fmt(x.atEnergies[j]))]);
  const info = [`expected gamma-ray intensity in the survey footprint, GeV^-1 cm^-2 s^-1 sr^-1; ${r.samples} samples, seed ${r.seed}`,
    ...r.assumptions.map((a) => `assumption: ${a}`), ...r.notes.map((n) => `note: ${n}`), ...r.warnings.map((w) => `warning: ${w}`)];
  const doc = { neutrino: o.neutrino, factors: o.factors, target: fac.target ?? null, columns: header,
    rows: rows.map((c) => c.map((v) => (v === '' ? null : Number(v)))), assumptions: r.assumptions, notes: r.notes, warnings: r.warnings, samples: r.samples, seed: r.seed };
  const files: { name: string; text: string }[] = [];
  if (formats.includes('csv')) files.push({ name: 'expected-gamma.csv', text: formatCsv(header, rows, { comments: info }) });
  if (formats.includes('md')) files.push({ name: 'expected-gamma.md', text: '# Expected gamma rays in the survey footprint\n\n' + info.map((l) => `- ${l}\n`).join('')
    + `\n| ${header.join(' | ')} |\n|${header.map(() => ' --- |').join('')}\n` + rows.map((c) => `| ${c.join(' | ')} |`).join('\n') + '\n' });
  if (formats.includes('json')) files.push({ name: 'expected-gamma.json', text: JSON.stringify(doc, null, 2) + '\n' });
  if (o.out) writeOutputs(files.map((f) => ({ path: join(o.out!, f.name), text: f.text })), { force: o.force, inputs: [o.neutrino, o.factors] });
  for (const w of r.warnings) io.err(`skyspan: warning: ${w}\n`);
  if (o.json) io.out(JSON.stringify(doc) + '\n');
  else {
    io.out(info.join('\n') + '\n' + [header, ...rows].map((c) => c.join('\t')).join('\n') + '\n');
    if (o.out) for (const f of files) io.out(`wrote ${join(o.out, f.name)}\n`);
  }
}

/** Registers `expect-gamma`. */
export function register(program: Command, io: CliIo): void {
  program.command('expect-gamma')
    .description('from a neutrino measurement, the hadronic gamma-ray intensity a survey footprint should see (for planning)')
    .requiredOption('--neutrino <measurement.yaml>', 'neutrino measurement (kind normalisation, points or band)')
    .requiredOption('--factors <factors.json>', 'extrapolation factors from the survey footprint to the neutrino region')
    .option('--target <region>', 'target region to take from a factors table with several')
    .option('--methods <list>', 'conversion methods: kab, kpi', 'kab,kpi')
    .option('--channel <channel>', 'pp or pgamma, for the K_pi rule', 'pp')
    .option('--flavour-ratio <e:mu:tau>', 'flavour ratio at Earth', '1:1:1')
    .option('--samples <n>', 'Monte Carlo samples', '20000')
    .option('--seed <n>', 'Monte Carlo seed', '1')
    .option('-o, --out <dir>', 'write expected-gamma.csv/.md/.json into this folder')
    .option('--format <list>', 'table formats: csv,md,json', 'csv,md,json')
    .option('--force', 'replace existing outputs')
    .option('--json', 'print the JSON table on stdout')
    .addHelpText('after', '\nExample:\n  skyspan expect-gamma --neutrino nu.yaml --factors footprint-factors.json --samples 20000 --seed 1 -o out/plan\n'
      + 'Assumes the template shape holds in the unseen sky and that the neutrinos come from hadronic gamma-ray sources.\n')
    .action((o: Options) => action(o, io));
}
