/**
 * `skyspan convert-spectrum`: hadronic gamma-ray points to an all-flavour (and
 * per-flavour) neutrino spectrum, or neutrino points to gamma rays, by the
 * KAB 2006 proton-spectrum fit or the K_pi rule; the other method is listed as
 * a systematic. Writes CSV, Markdown and JSON tables and the spectrum-plot data.
 */
import type { Command } from 'commander';
import { UsageError } from '../../core/errors.js';
import { formatCsv } from '../../io/csvWrite.js';
import { convertSpectrum, type ConversionResult } from '../../physics/hadronic/convert.js';
import { parseFlavourRatio } from '../../physics/hadronic/flavour.js';
import type { SpectrumPoints } from '../../physics/points.js';
import { readGammaPoints } from '../../physics/fluxPoints/read.js';
import { energyFromGeV, energyUnitFactor, intensityFromInternal, intensityUnit } from '../../physics/units.js';
import { pointsFromIntensity, type SpectrumPlotData } from '../../render/spectrumData.js';
import type { CliIo } from '../main.js';
import { writeOutputs } from '../options.js';

interface Options {
  to: string; method: string; channel: string; flavourRatio: string; cutoff?: boolean;
  unit: string; energyUnit: string; out?: string; force?: boolean; json?: boolean;
}

const fmt = (v: number) => (Number.isFinite(v) ? v.toPrecision(6) : '');
/** The method's name as users write it (plans, --method, --methods). */
const methodName = (m: ConversionResult['method']) => (m === 'kab2006' ? 'kab' : 'kpi');

/** Rows of the output table, in the requested units. */
function tableRows(r: ConversionResult, unit: string, energyUnit: string): { header: string[]; rows: string[][] } {
  const toNu = r.direction === 'gammaToNeutrino';
  const header = ['energy', toNu ? 'nu_all' : 'gamma', 'err_low', 'err_high', 'ul',
    ...(toNu ? ['nu_e', 'nu_mu', 'nu_tau'] : []), 'kab', 'kpi', 'kab_over_kpi'];
  const rows: string[][] = [];
  for (let i = 0; i < r.energyGeV.length; i++) {
    const e = r.energyGeV[i], c = (v: number) => fmt(intensityFromInternal(v, unit, e));
    rows.push([fmt(energyFromGeV(e, energyUnit)), c(r.value[i]), c(r.errLow[i]), c(r.errHigh[i]), String(r.upperLimit[i]),
      ...(toNu && r.perFlavour ? [c(r.perFlavour.e[i]), c(r.perFlavour.mu[i]), c(r.perFlavour.tau[i])] : []),
      c(r.byMethod.kab2006[i]), c(r.byMethod.kpiRule[i]), fmt(r.methodRatio[i])]);
  }
  return { header, rows };
}

function describe(r: ConversionResult, unit: string, energyUnit: string): string[] {
  return [`direction: ${r.direction}`, `method: ${methodName(r.method)} (the other method is listed as a systematic)`,
    `units: energy ${energyUnit}, intensities ${unit}`, ...r.assumptions.map((a) => `assumption: ${a}`),
    ...r.notes.map((n) => `note: ${n}`)];
}

function plotData(points: SpectrumPoints, r: ConversionResult): SpectrumPlotData {
  const toNu = r.direction === 'gammaToNeutrino';
  return {
    title: `${toNu ? 'neutrinos from gamma rays' : 'gamma rays from neutrinos'} (${methodName(r.method)})`,
    yNote: 'all flavours',
    points: [
      pointsFromIntensity(toNu ? 'gamma rays (input)' : 'neutrinos (input)', toNu ? 'gamma' : 'neutrino', points),
      pointsFromIntensity(`${toNu ? 'neutrinos' : 'gamma rays'} (${methodName(r.method)})`, toNu ? 'neutrino' : 'gamma',
        { energyGeV: r.energyGeV, value: r.value, errLow: r.errLow, errHigh: r.errHigh, upperLimit: r.upperLimit }),
    ],
    bands: [{
      label: 'method spread (kab to kpi)', kind: 'predicted-spread', energyGeV: r.energyGeV,
      low: r.energyGeV.map((e, i) => e * e * Math.min(r.byMethod.kab2006[i], r.byMethod.kpiRule[i])),
      high: r.energyGeV.map((e, i) => e * e * Math.max(r.byMethod.kab2006[i], r.byMethod.kpiRule[i])),
    }].filter((b) => b.low.every((v) => Number.isFinite(v))) as SpectrumPlotData['bands'],
  };
}

function action(file: string, o: Options, io: CliIo): void {
  if (o.to !== 'neutrino' && o.to !== 'gamma') throw new UsageError(`--to is '${o.to}', expected neutrino or gamma`);
  const method = o.method === 'rule' ? 'kpi' : o.method; // 'rule': the earlier spelling of kpi
  if (method !== 'kab' && method !== 'kpi') throw new UsageError(`--method is '${o.method}', expected kab or kpi`);
  if (o.channel !== 'pp' && o.channel !== 'pgamma') throw new UsageError(`--channel is '${o.channel}', expected pp or pgamma`);
  intensityUnit(o.unit, { keyPath: '--unit' });
  energyUnitFactor(o.energyUnit, { keyPath: '--energy-unit' });
  const points = readGammaPoints(file);
  const r = convertSpectrum(points, {
    direction: o.to === 'neutrino' ? 'gammaToNeutrino' : 'neutrinoToGamma', method: method === 'kab' ? 'kab2006' : 'kpiRule',
    channel: o.channel, flavourRatio: parseFlavourRatio(o.flavourRatio), cutoff: o.cutoff,
  });
  const { header, rows } = tableRows(r, o.unit, o.energyUnit);
  const info = describe(r, o.unit, o.energyUnit);
  const doc = {
    input: file, direction: r.direction, method: methodName(r.method), channel: r.channel, flavourRatio: r.flavourRatio,
    energyUnit: o.energyUnit, intensityUnit: o.unit, columns: header, rows: rows.map((c) => c.map((v) => (v === '' ? null : Number(v)))),
    protonFit: r.protonFit && { names: r.protonFit.names, theta: [...r.protonFit.theta], covariance: [...r.protonFit.covariance],
      chi2: r.protonFit.chi2, dof: r.protonFit.dof, protons: r.protonFit.protons },
    assumptions: r.assumptions, notes: r.notes,
  };
  if (o.out) {
    // Every output is checked before any is written, so a refused job writes nothing.
    writeOutputs([
      { path: `${o.out}.csv`, text: formatCsv(header, rows, { comments: info }) },
      { path: `${o.out}.md`, text: info.map((l) => `- ${l}\n`).join('') + '\n| ' + header.join(' | ') + ' |\n|' + header.map(() => ' --- |').join('')
        + '\n' + rows.map((c) => '| ' + c.join(' | ') + ' |').join('\n') + '\n' },
      { path: `${o.out}.json`, text: JSON.stringify(doc, null, 2) + '\n' },
      { path: `${o.out}.plot.json`, text: JSON.stringify(plotData(points, r), (_k, v) => (ArrayBuffer.isView(v) ? Array.from(v as Float64Array) : v), 2) + '\n' },
    ], { force: o.force, inputs: [file] });
  }
  if (o.json) io.out(JSON.stringify(doc) + '\n');
  else {
    io.out(info.join('\n') + '\n' + [header, ...rows].map((c) => c.join('\t')).join('\n') + '\n');
    if (o.out) io.out(`wrote ${o.out}.csv, .md, .json, .plot.json\n`);
  }
}

/** Registers `convert-spectrum`. */
export function register(program: Command, io: CliIo): void {
  program.command('convert-spectrum')
    .description('convert hadronic gamma-ray points to a neutrino spectrum (or back) by the KAB 2006 functions or the K_pi rule')
    .argument('<points>', 'spectrum points CSV (columns energy|e_min,e_max, value, err|err_low,err_high, ul; units in "# energy_unit:" and "# value_unit:" lines), or flux points .ecsv / .fits')
    .option('--to <messenger>', 'neutrino or gamma', 'neutrino')
    .option('--method <method>', 'kab (proton-spectrum fit, Kelner et al. 2006) or kpi (K_pi rule, Ahlers & Halzen 2018)', 'kab')
    .option('--channel <channel>', 'pp or pgamma (pgamma only with --method kpi)', 'pp')
    .option('--flavour-ratio <e:mu:tau>', 'flavour ratio at Earth', '1:1:1')
    .option('--cutoff', 'fit the proton spectrum with an exponential cutoff')
    .option('--unit <unit>', 'output intensity unit (I or E^2 I form)', 'GeV^-1 cm^-2 s^-1 sr^-1')
    .option('--energy-unit <unit>', 'output energy unit', 'TeV')
    .option('-o, --out <prefix>', 'write <prefix>.csv, .md, .json and .plot.json')
    .option('--force', 'replace existing outputs')
    .option('--json', 'print the JSON table on stdout')
    .addHelpText('after', '\nExample:\n  skyspan convert-spectrum plane-points.csv --method kab --unit "TeV cm^-2 s^-1 sr^-1" -o out/nu\n'
      + 'Assumes the gamma-ray emission is hadronic and not absorbed (de-absorb first).\n')
    .action((file: string, o: Options) => action(file, o, io));
}
