/**
 * `skyspan compare`: the neutrino intensity predicted in the neutrino
 * analysis's region from gamma-ray points measured in region A and the
 * template ensemble's extrapolation factors, with each uncertainty listed
 * separately and combined by a seeded Monte Carlo; and, given a neutrino
 * measurement, the ratio measured / predicted, the tension in sigma and chi^2
 * over points. Writes CSV, Markdown and JSON tables and the spectrum-plot data.
 */
import type { Command } from 'commander';
import { join } from 'node:path';
import { UsageError } from '../../core/errors.js';
import { parseFlavourRatio } from '../../physics/hadronic/flavour.js';
import { readGammaPoints } from '../../physics/fluxPoints/read.js';
import { energyToGeV } from '../../physics/units.js';
import { readFactors } from '../../compare/factorsFile.js';
import { readMeasurement } from '../../compare/measurement.js';
import { predictNeutrinos } from '../../compare/predict.js';
import { renderComparison, type ComparisonReport } from '../../compare/report.js';
import { predictionFluxPointFiles } from '../../compare/spectrumFluxPoints.js';
import { chiSquareOverPoints, compareAtReference } from '../../compare/tension.js';
import { VERSION } from '../../version.js';
import type { CliIo } from '../main.js';
import { parseFormats, parseInteger, parseMethods, writeOutputs } from '../options.js';

interface Options {
  gamma: string; factors: string; neutrino?: string; target?: string; e0?: string; energyUnit: string;
  methods: string; channel: string; flavourRatio: string; samples: string; seed: string;
  out?: string; format: string; force?: boolean; json?: boolean;
}

function action(o: Options, io: CliIo): void {
  const methods = parseMethods(o.methods);
  const formats = parseFormats(o.format);
  if (o.channel !== 'pp' && o.channel !== 'pgamma') throw new UsageError(`--channel is '${o.channel}', expected pp or pgamma`);
  const samples = parseInteger(o.samples, '--samples'), seed = parseInteger(o.seed, '--seed');
  const points = readGammaPoints(o.gamma);
  const measurement = o.neutrino ? readMeasurement(o.neutrino) : undefined;
  let e0GeV: number;
  if (o.e0 !== undefined) {
    const v = Number(o.e0);
    if (!(v > 0)) throw new UsageError(`--e0 is '${o.e0}', expected a positive number (in --energy-unit)`);
    e0GeV = energyToGeV(v, o.energyUnit, { keyPath: '--energy-unit' });
  } else if (measurement && measurement.kind !== 'points') e0GeV = measurement.e0GeV;
  else {
    let s = 0, k = 0;
    for (let i = 0; i < points.energyGeV.length; i++) if (!points.upperLimit[i]) { s += Math.log(points.energyGeV[i]); k++; }
    e0GeV = Math.exp(s / k) / 2;
  }
  if (measurement && measurement.kind !== 'points' && Math.abs(e0GeV - measurement.e0GeV) > 1e-9 * e0GeV) {
    throw new UsageError(`--e0 differs from the measurement's e0 (${measurement.e0GeV} GeV); leave --e0 out to use the measurement's`);
  }
  const fac = readFactors(o.factors, { target: o.target });
  const energies = Array.from(points.energyGeV).filter((_, i) => !points.upperLimit[i]).map((e) => e / 2);
  if (measurement?.kind === 'points') energies.push(...measurement.points.map((p) => p.energyGeV));
  const unique = [...new Set(energies)].sort((a, b) => a - b);
  const prediction = predictNeutrinos({
    gamma: { kind: 'points', points }, factors: fac.factors, factorsFile: o.factors, e0GeV, energiesNuGeV: unique,
    methods, channel: o.channel as 'pp' | 'pgamma', flavourRatio: parseFlavourRatio(o.flavourRatio), region: fac.target, samples, seed,
  });
  prediction.notes.push(...fac.notes);
  const report: ComparisonReport = {
    prediction, measurement, gammaPoints: points,
    reference: measurement && measurement.kind !== 'points' ? compareAtReference(prediction, measurement) : undefined,
    points: measurement?.kind === 'points' ? chiSquareOverPoints(prediction, measurement) : undefined,
    provenance: { tool: `skyspan ${VERSION}`, command: 'skyspan compare', options: { ...o }, gamma: o.gamma, factors: o.factors,
      neutrino: o.neutrino ?? null, target: fac.target ?? null, created: new Date().toISOString() },
  };
  const files = renderComparison(report, formats);
  const written = o.out
    ? writeOutputs([...files.map((f) => ({ path: join(o.out!, f.name), text: f.text as string | Uint8Array })),
      ...predictionFluxPointFiles(prediction).map((f) => ({ path: join(o.out!, f.name), text: f.data }))],
      { force: o.force, inputs: [o.gamma, o.factors, ...(o.neutrino ? [o.neutrino] : [])] })
    : [];
  for (const w of prediction.warnings) io.err(`skyspan: warning: ${w}\n`);
  if (o.json) { io.out(files.find((f) => f.name.endsWith('comparison.json'))?.text ?? renderComparison(report, ['json'])[0].text); return; }
  const c = prediction.components.find((x) => x.name === 'combined')!.atE0;
  const flav = measurement?.flavour ?? 'all';
  const f = flav === 'all' ? 1 : prediction.flavourFraction[flav];
  io.out(`predicted ${flav === 'all' ? 'all-flavour' : `${flav}-flavour`} intensity at ${e0GeV.toPrecision(4)} GeV: ${(f * c.median).toPrecision(4)} ` +
    `(16-84%: ${(f * c.p16).toPrecision(4)} to ${(f * c.p84).toPrecision(4)}) GeV^-1 cm^-2 s^-1 sr^-1\n`);
  for (const x of prediction.components) {
    io.out(`  ${x.name}: relative half-width ${(0.5 * (x.atE0.p84 - x.atE0.p16) / x.atE0.median).toPrecision(3)} (${x.description})\n`);
  }
  if (report.reference) {
    const r = report.reference;
    io.out(`measured / predicted: ${r.ratio.median.toPrecision(3)} (16-84%: ${r.ratio.p16.toPrecision(3)} to ${r.ratio.p84.toPrecision(3)}); ` +
      `tension ${r.tension.lowerBound ? '>= ' : ''}${r.tension.sigma.toFixed(2)} sigma, measurement ${r.tension.direction} the prediction\n`);
  }
  if (report.points) io.out(`chi2 over points: ${report.points.chi2.toPrecision(4)} for ${report.points.dof} dof (p = ${report.points.pValue.toPrecision(3)})\n`);
  io.out(`linear check: ${prediction.linearCheck.note}\n`);
  for (const a of prediction.assumptions) io.out(`assumption: ${a}\n`);
  for (const p of written) io.out(`wrote ${p}\n`);
}

/** Registers `compare`. */
export function register(program: Command, io: CliIo): void {
  program.command('compare')
    .description('predict the neutrino intensity from gamma-ray points and extrapolation factors, and weigh it against a neutrino measurement')
    .requiredOption('--gamma <points.csv>', 'gamma-ray points measured in region A (spectrum points CSV, or flux points .ecsv / .fits)')
    .requiredOption('--factors <factors.json>', 'extrapolation factors A -> neutrino region: the factors command\'s JSON, or { "templates": [{ "name", "kI", "survivalMean"?, "weight"? }] }')
    .option('--neutrino <measurement.yaml>', 'neutrino measurement (kind normalisation, points or band)')
    .option('--target <region>', 'target region to take from a factors table with several')
    .option('--e0 <energy>', 'reference neutrino energy (default: the measurement\'s e0)')
    .option('--energy-unit <unit>', 'unit of --e0', 'TeV')
    .option('--methods <list>', 'conversion methods, the first is primary: kab (Kelner et al. 2006 fit), kpi (K_pi rule)', 'kab,kpi')
    .option('--channel <channel>', 'pp or pgamma, for the K_pi rule', 'pp')
    .option('--flavour-ratio <e:mu:tau>', 'flavour ratio at Earth', '1:1:1')
    .option('--samples <n>', 'Monte Carlo samples', '20000')
    .option('--seed <n>', 'Monte Carlo seed', '1')
    .option('-o, --out <dir>', 'write comparison.csv/.md/.json, comparison-spectrum.csv/.ecsv/.fits and comparison-plot.json into this folder')
    .option('--format <list>', 'table formats: csv,md,json', 'csv,md,json')
    .option('--force', 'replace existing outputs')
    .option('--json', 'print the JSON result on stdout')
    .addHelpText('after', '\nExample:\n  skyspan compare --gamma plane-points.csv --factors out/factors/factors.json --target sky \\\n'
      + '    --neutrino nu.yaml --samples 20000 --seed 1 -o out/compare --format csv,md,json --force\n'
      + 'Assumes the template shape holds in the unseen sky and that the gamma-ray emission is hadronic.\n')
    .action((o: Options) => action(o, io));
}
