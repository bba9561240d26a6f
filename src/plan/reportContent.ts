/**
 * What the run's HTML report says, in reading order: the headline sentence
 * with its numbers, the result scaled to each target, the regions and
 * weights, the figures, the assumptions in plain words, the comparison,
 * factor, survival and forecast tables, the warnings grouped by cause, and
 * the provenance. Rendered by render/report.ts.
 */
import { channelWords, defaultMethods } from '../physics/hadronic/channels.js';
import { METHOD_SPREAD_NOTE } from '../compare/conversion.js';
import type { ReportContent, ReportFigure, ReportTable } from '../render/report.js';
import { describePValue } from '../compare/tension.js';
import { SUMMARY_DEFINITIONS } from '../compare/report.js';
import type { RunComputation } from './compute.js';
import type { ResolvedPlan } from './loadPlan.js';
import { projectionSentence } from './projectionReport.js';
import { describeRegions } from './regionSummary.js';
import { FORECAST_UNIT, forecastData, groupMessages, reportTable, scaledTable, survivalData } from './reportTables.js';

/** The headline numbers as shown (3 significant digits) and as computed. */
export interface Headline {
  text: string;
  ratioMedian: number | null; ratioP16: number | null; ratioP84: number | null;
  tensionSigma: number | null; tensionLowerBound: boolean; direction: string | null;
  predictedMedian: number | null; measuredMedian: number | null;
  forecastE2Median: number | null; forecastEnergyGeV: number | null;
  /** The strings shown in the report (toPrecision(3), or fixed(2) for sigma). */
  display: Record<string, string>;
}

const p3 = (x: number) => x.toPrecision(3);

/** The headline (see {@link Headline}). */
export function headline(rp: ResolvedPlan, c: RunComputation): Headline {
  const h: Headline = { text: '', ratioMedian: null, ratioP16: null, ratioP84: null, tensionSigma: null, tensionLowerBound: false, direction: null,
    predictedMedian: null, measuredMedian: null, forecastE2Median: null, forecastEnergyGeV: null, display: {} };
  const eTeV = `${Number((c.e0GeV / 1e3).toPrecision(4))} TeV`;
  const flav = rp.measurement.flavour === 'all' ? 'all-flavour' : `${rp.measurement.flavour}-flavour`;
  const parts: string[] = [];
  if (c.reference) {
    const x = c.reference;
    Object.assign(h, { ratioMedian: x.ratio.median, ratioP16: x.ratio.p16, ratioP84: x.ratio.p84, tensionSigma: x.tension.sigma,
      tensionLowerBound: x.tension.lowerBound, direction: x.tension.direction, predictedMedian: x.predicted.median, measuredMedian: x.measured.median });
    h.display = { ratio: p3(x.ratio.median), ratioLow: p3(x.ratio.p16), ratioHigh: p3(x.ratio.p84), tension: x.tension.sigma.toFixed(2),
      predicted: p3(x.predicted.median), measured: p3(x.measured.median) };
    parts.push(`At ${eTeV} the measured ${flav} neutrino intensity in '${rp.plan.neutrino.region}' is ${h.display.ratio} times the hadronic prediction from the gamma rays` +
      ` (68 % interval ${h.display.ratioLow} to ${h.display.ratioHigh}), a tension of ${x.tension.lowerBound ? 'at least ' : ''}${h.display.tension} sigma with the measurement ${x.tension.direction} the prediction` +
      ` (${describePValue(x.tension)}).`);
  } else if (c.pointsComparison) {
    const x = c.pointsComparison;
    h.display = { chi2: p3(x.chi2), tension: x.sigma.toFixed(2) };
    h.tensionSigma = x.sigma;
    parts.push(`The neutrino points give chi^2 = ${h.display.chi2} for ${x.dof} points against the hadronic prediction, a tension of ${h.display.tension} sigma.`);
  }
  if (c.projection && projectionSentence(c.projection)) parts.push(projectionSentence(c.projection));
  if (c.forecast) {
    const comb = c.forecast.components.find((k) => k.name === 'combined')!;
    const E = c.forecast.energiesGammaGeV;
    let j = 0;
    for (let i = 1; i < E.length; i++) if (Math.abs(Math.log(E[i] / (2 * c.e0GeV))) < Math.abs(Math.log(E[j] / (2 * c.e0GeV)))) j = i;
    const e2 = E[j] * E[j];
    h.forecastE2Median = comb.atEnergies[j].median * e2; h.forecastEnergyGeV = E[j];
    h.display.forecast = p3(h.forecastE2Median); h.display.forecastLow = p3(comb.atEnergies[j].p16 * e2); h.display.forecastHigh = p3(comb.atEnergies[j].p84 * e2);
    parts.push(`If the neutrinos are hadronic and follow the templates, the footprint '${rp.plan.forecast!.footprint}' should see E^2 I = ${h.display.forecast}` +
      ` GeV cm^-2 s^-1 sr^-1 in gamma rays at ${Number((E[j] / 1e3).toPrecision(4))} TeV (68 % interval ${h.display.forecastLow} to ${h.display.forecastHigh}).`);
  }
  h.text = parts.join(' ');
  return h;
}

function factorTable(c: RunComputation, rp: ResolvedPlan): ReportTable {
  const rows = c.factors ? c.factors.rows : c.forecastFactors!.rows;
  return { id: 'factors', caption: `Extrapolation factors from '${c.factors ? rp.plan.gamma!.region : rp.plan.forecast!.footprint}' (per template, energy plane and target)`,
    columns: ['template', 'plane', 'E (GeV)', 'target', 'k_I', 'k_F (sr)', 'k_4pi', 'Omega_A (sr)', 'Omega_B (sr)', 'c_AB'],
    rows: rows.map((r) => [r.template, r.plane + 1, r.energyGeV, r.target, r.kI, r.kFSr, r.fourPiFactor, r.solidAngleMeasuredSr, r.solidAngleTargetSr, r.coveredFluxFraction]),
    note: 'k_I: mean template intensity in the target over the (exposure-weighted) mean in the measured region A; k_F = k_I Omega_B; k_4pi: the same for the whole sky; c_AB: fraction of the target\'s template flux inside A. Planes are numbered from 1.' };
}

/** Human headings of the comparison table's columns (its keys are the compare layer's JSON keys). */
const COMPARISON_HEADINGS: Record<string, string> = { quantity: 'quantity', description: 'description', energyGeV: 'E (GeV)', median: 'median',
  p16: '16 %', p84: '84 %', relativeHalfWidth: 'relative half-width' };

/** The report content. `extras` are tables and figures other stages add (e.g. the population section). */
export function reportContent(rp: ResolvedPlan, c: RunComputation, h: Headline, figures: ReportFigure[],
  provenance: [string, string | number | boolean][], comparisonRows: Record<string, string | number>[], extraTables: ReportTable[] = []): ReportContent {
  const keyFigures = [];
  if (c.reference) {
    keyFigures.push({ id: 'kf-ratio', label: 'measured / predicted', value: h.display.ratio },
      { id: 'kf-ratio-low', label: '16th percentile', value: h.display.ratioLow },
      { id: 'kf-ratio-high', label: '84th percentile', value: h.display.ratioHigh },
      { id: 'kf-tension', label: 'tension (sigma)', value: h.display.tension });
  } else if (c.pointsComparison) keyFigures.push({ id: 'kf-tension', label: 'tension (sigma)', value: h.display.tension });
  if (h.display.forecast) keyFigures.push({ id: 'kf-forecast', label: `expected E^2 I at ${Number((h.forecastEnergyGeV! / 1e3).toPrecision(4))} TeV`, value: h.display.forecast });
  const assumptions = [
    'The template shape holds in the unseen sky: outside the measured region the diffuse emission is assumed to look like each template; only the shape carries the measurement to the target.',
    `The emission is hadronic: all of the measured gamma rays come from pion decays in ${channelWords(rp.plan.methods.channel)}; no leptonic or unresolved-source part is subtracted.`,
    `Neutrino flavour ratio at Earth ${rp.plan.methods.flavourRatio.join(':')} (e:mu:tau), neutrinos and antineutrinos together.`,
    c.absorptionStatement,
    `Conversion: ${(rp.plan.methods.conversion ?? defaultMethods(rp.plan.methods.channel)).map((m) => (m === 'kab' ? 'proton-spectrum fit with the Kelner, Aharonian & Bugayov (2006) yields' : 'the K_pi rule of Ahlers & Halzen (2018)')).join(' and ')}; channel ${rp.plan.methods.channel}${(rp.plan.methods.conversion ?? defaultMethods(rp.plan.methods.channel)).includes('kab') ? `. ${METHOD_SPREAD_NOTE}` : ''}.`,
    `Uncertainties: ${rp.plan.monteCarlo.samples} Monte Carlo samples, seed ${rp.plan.monteCarlo.seed}; the template ensemble's spread is read as a model uncertainty.`,
  ];
  const tables: ReportTable[] = [];
  if (comparisonRows.length) {
    const cols = Object.keys(comparisonRows[0]);
    tables.push({ id: 'comparison', caption: `Prediction and comparison at ${Number((c.e0GeV / 1e3).toPrecision(4))} TeV (intensities I in GeV^-1 cm^-2 s^-1 sr^-1)`,
      columns: cols.map((k) => COMPARISON_HEADINGS[k] ?? k), rows: comparisonRows.map((r) => cols.map((k) => (r[k] === '' ? null : r[k]))), note: SUMMARY_DEFINITIONS.join('. ') + '.' });
  }
  tables.push(factorTable(c, rp));
  if (c.survival) tables.push(reportTable(survivalData(c.survival), 'survival', survivalCaption(c.survival)));
  const f = forecastData(c);
  if (f) {
    tables.push(reportTable(f, 'forecast', `Expected gamma-ray intensity in '${rp.plan.forecast!.footprint}' (${FORECAST_UNIT}; the same numbers as forecast.csv)`));
    if (c.forecastSurvival) tables.push(reportTable(survivalData(c.forecastSurvival), 'forecast-survival', survivalCaption(c.forecastSurvival)));
  }
  tables.push(...extraTables);
  const said: [string, string][] = [...(c.prediction?.warnings ?? []).map((w): [string, string] => ['warning', w]), ...(c.forecast?.warnings ?? []).map((w): [string, string] => ['warning', w]),
    ...c.notes.map((n): [string, string] => ['note', n]), ...(c.prediction?.notes ?? []).map((n): [string, string] => ['note', n]), ...(c.forecast?.notes ?? []).map((n): [string, string] => ['note', n])];
  const fr = c.factors ?? c.forecastFactors;
  const results = fr ? [reportTable(scaledTable(fr, c.factors ? c.points : null), 'scaled-results',
    c.factors ? `The gamma-ray intensity measured in '${rp.plan.gamma!.region}' (I_A) scaled to each target: I_B = k_I I_A, median and 16-84 % over the template ensemble`
      : `Extrapolation factor k_I from '${rp.plan.forecast!.footprint}' to each target, median and 16-84 % over the template ensemble`,
    c.factors ? 'The 16-84 % range is the spread between templates only (a model uncertainty); I_A is as measured (its own errors are in the points file), not corrected for absorption. k_I is taken at the template plane nearest each energy.' : undefined)] : [];
  const roles: [string, string][] = [];
  if (rp.plan.gamma) roles.push([`measured region${rp.plan.gamma.exposureWeighted ? ' (exposure weighted)' : ' (not exposure weighted)'}`, rp.plan.gamma.region]);
  if (rp.plan.gamma?.mask) roles.push(['mask (drawn)', rp.plan.gamma.mask]);
  if (rp.plan.forecast) roles.push([`forecast footprint${rp.plan.forecast.exposureWeighted ? ' (exposure weighted)' : ''}`, rp.plan.forecast.footprint]);
  roles.push(['neutrino region', rp.plan.neutrino.region]);
  for (const t of rp.plan.targets) if (t !== rp.plan.neutrino.region) roles.push(['target', t]);
  const regions = [...describeRegions(rp.regions, roles),
    `Coverage: ${rp.plan.coverage === 'centre' ? 'a pixel counts fully when its centre is inside (pixel-centre coverage)' : 'each pixel counts with the fraction of it inside (fractional coverage)'}.`];
  return { title: rp.plan.title, subtitle: rp.plan.about, headline: h.text, keyFigures, results, regions, assumptions, tables, figures, provenance,
    messages: groupMessages(said), footer: 'Made by skyspan. Numbers carry the assumptions listed above.' };
}

function survivalCaption(s: NonNullable<RunComputation['survival']>): string {
  return `Mean survival probability P of gamma rays from '${s.region}' (CMB pair absorption, emission weighted${s.exposureWeighted ? ', exposure weighted' : ''})`;
}
