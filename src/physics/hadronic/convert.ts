/**
 * Conversion of measured hadronic gamma-ray points into an all-flavour neutrino
 * spectrum, or the reverse, by one of two methods, always reporting the other
 * as a systematic:
 * - 'kab2006': fit a proton spectrum to the points with the KAB 2006 functions
 *   (protonFit.ts) and predict the other messenger; errors from the fit
 *   covariance by linear propagation (central-difference gradient in the
 *   fit's log parameters).
 * - 'kpiRule': the Ahlers & Halzen 2018 rule (kpiRule.ts), point by point,
 *   with the errors scaled by the same factor.
 * Neutrino energies are E_gamma / 2 of each point (and gamma energies 2 E_nu in
 * reverse). The result lists both methods' values and their ratio so that the
 * method choice can enter the uncertainty. Per-flavour values at Earth use the
 * flavour ratio (default 1:1:1).
 */
import { ComputeError, InputError } from '../../core/errors.js';
import type { SpectrumPoints } from '../points.js';
import { KAB_MIN_ENERGY_GEV } from './emissivity.js';
import { FLAVOUR_RATIO_EARTH, type FlavourRatio } from './flavour.js';
import { KPI, type PionChannel } from './kpiRule.js';
import { fitProtonSpectrum, predictFromProtons, protonModelFromInternal, type ProtonFit } from './protonFit.js';
import { ppEmissivity } from './emissivity.js';

/** Method of conversion. */
export type ConversionMethod = 'kab2006' | 'kpiRule';
/** Direction of conversion. */
export type ConversionDirection = 'gammaToNeutrino' | 'neutrinoToGamma';

/** Options of {@link convertSpectrum}. */
export interface ConversionOptions {
  direction?: ConversionDirection;
  method?: ConversionMethod;
  channel?: PionChannel;
  flavourRatio?: FlavourRatio;
  /** Fit the proton spectrum with an exponential cutoff (kab2006). */
  cutoff?: boolean;
}

/** The converted spectrum, in the input's internal units (GeV^-1 cm^-2 s^-1 sr^-1). */
export interface ConversionResult {
  direction: ConversionDirection;
  method: ConversionMethod;
  channel: PionChannel;
  flavourRatio: FlavourRatio;
  /** Output energies in GeV (E_gamma/2 or 2 E_nu of the input points). */
  energyGeV: Float64Array;
  /** Output intensity by the chosen method: all-flavour neutrinos, or gamma rays. */
  value: Float64Array;
  errLow: Float64Array;
  errHigh: Float64Array;
  /** 1 where the output is an upper limit (kpiRule of an input limit; kab2006 outputs are model values). */
  upperLimit: Uint8Array;
  /** Per-flavour neutrino intensities at Earth (for neutrino output; else null). */
  perFlavour: { e: Float64Array; mu: Float64Array; tau: Float64Array } | null;
  /** Values by each method (NaN where a method does not apply). */
  byMethod: { kab2006: Float64Array; kpiRule: Float64Array };
  /** kab2006 / kpiRule per output point: the method systematic. */
  methodRatio: Float64Array;
  protonFit: ProtonFit | null;
  notes: string[];
  assumptions: string[];
}

function propagate(fit: ProtonFit, secondary: 'gamma' | 'neutrinoAllFlavour', e: number): number {
  const p = fit.theta.length, grad = new Float64Array(p), t = Float64Array.from(fit.theta);
  const e0 = fit.protons.kind === 'powerLaw' || fit.protons.kind === 'cutoffPowerLaw' ? fit.protons.e0GeV : 1;
  for (let j = 0; j < p; j++) {
    const h = 1e-4 * Math.max(1, Math.abs(t[j]));
    t[j] = fit.theta[j] + h; const up = Math.log(ppEmissivity(secondary, e, protonModelFromInternal(t, e0)));
    t[j] = fit.theta[j] - h; const dn = Math.log(ppEmissivity(secondary, e, protonModelFromInternal(t, e0)));
    t[j] = fit.theta[j]; grad[j] = (up - dn) / (2 * h);
  }
  let v = 0;
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) v += grad[a] * grad[b] * fit.covariance[a * p + b];
  return Math.sqrt(Math.max(v, 0)); // sigma of ln I
}

/** Converts points (gamma rays in, neutrinos out, or the reverse); see the module comment. */
export function convertSpectrum(points: SpectrumPoints, options: ConversionOptions = {}): ConversionResult {
  const direction = options.direction ?? 'gammaToNeutrino', method = options.method ?? 'kab2006';
  const channel = options.channel ?? 'pp', ratio = options.flavourRatio ?? FLAVOUR_RATIO_EARTH;
  if (method === 'kab2006' && channel !== 'pp') {
    throw new InputError('the KAB 2006 method is for pp collisions only', { keyPath: 'channel' }, 'use the kpi method (--method kpi) for p-gamma');
  }
  const n = points.value.length, toNu = direction === 'gammaToNeutrino';
  const energy = new Float64Array(n);
  for (let i = 0; i < n; i++) energy[i] = toNu ? points.energyGeV[i] / 2 : 2 * points.energyGeV[i];
  const factor = toNu ? 3 * KPI[channel] : 1 / (3 * KPI[channel]);
  const rule = points.value.map((v) => v * factor);
  const kab = new Float64Array(n).fill(NaN), kabSigma = new Float64Array(n).fill(NaN);
  const notes: string[] = [];
  let fit: ProtonFit | null = null;
  if (channel === 'pp') {
    try {
      fit = fitProtonSpectrum(points, { target: toNu ? 'gamma' : 'neutrinoAllFlavour', cutoff: options.cutoff });
      const out = toNu ? 'neutrinoAllFlavour' : 'gamma';
      for (let i = 0; i < n; i++) {
        if (!(energy[i] >= KAB_MIN_ENERGY_GEV)) continue;
        kab[i] = predictFromProtons(fit, out, [energy[i]])[0];
        kabSigma[i] = propagate(fit, out, energy[i]);
      }
      if (kab.some((v) => Number.isNaN(v))) notes.push(`kab2006: no value below ${KAB_MIN_ENERGY_GEV} GeV (outside the parametrisation)`);
    } catch (e) {
      if (method === 'kab2006') throw e;
      notes.push(`kab2006 comparison not available: ${(e as Error).message}`);
    }
  }
  const value = method === 'kab2006' ? kab : rule;
  if (method === 'kab2006' && value.every((v) => Number.isNaN(v))) {
    throw new ComputeError(`kab2006: every output energy is below ${KAB_MIN_ENERGY_GEV} GeV`);
  }
  const errLow = new Float64Array(n), errHigh = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (method === 'kab2006') { errLow[i] = value[i] * (1 - Math.exp(-kabSigma[i])); errHigh[i] = value[i] * Math.expm1(kabSigma[i]); }
    else { errLow[i] = points.errLow[i] * factor; errHigh[i] = points.errHigh[i] * factor; }
  }
  const s = ratio[0] + ratio[1] + ratio[2];
  const perFlavour = toNu ? {
    e: value.map((v) => (v * ratio[0]) / s), mu: value.map((v) => (v * ratio[1]) / s), tau: value.map((v) => (v * ratio[2]) / s),
  } : null;
  return {
    direction, method, channel, flavourRatio: ratio, energyGeV: energy, value, errLow, errHigh,
    upperLimit: method === 'kpiRule' ? Uint8Array.from(points.upperLimit) : new Uint8Array(n), perFlavour,
    byMethod: { kab2006: kab, kpiRule: rule }, methodRatio: kab.map((v, i) => v / rule[i]), protonFit: fit, notes,
    assumptions: [
      'all of the gamma-ray emission is hadronic', 'gamma rays are not absorbed (de-absorb before converting)',
      `flavour ratio at Earth ${ratio.join(':')}`,
      method === 'kab2006' ? 'proton spectrum: ' + (options.cutoff ? 'power law with exponential cutoff' : 'power law')
        : `K_pi = ${KPI[channel]} (${channel})`,
    ],
  };
}
