/**
 * Preparing one line-of-sight integration (model grid, sampling plan,
 * absorption weights) and integrating toward single directions.
 */
import { KPC_CM } from '../physics/constants.js';
import type { TemplateSpec } from './templateSpec.js';
import { buildModelGrid, type GridOptions } from './modelGrid.js';
import { losPlan } from './quadrature.js';
import { losIntegral, type KernelInput } from './losKernel.js';
import { survivalTable, type AttenuationLengthFn } from './absorption.js';

/** Integration choices that may override the spec's. */
export interface IntegrationOptions {
  stepKpc?: number;
  nodesPerSegment?: number;
  grid?: GridOptions;
  /** Allocates shared memory for grid and outputs (for worker threads). */
  shared?: boolean;
}

/**
 * Tabulates the model for `energies` (null: one plane) and lays out the
 * samples; with `lambda` the absorption weights too. Output arrays hold
 * nE * 12 nside^2 values (nside 0: none, for single directions).
 */
export function prepareIntegration(spec: TemplateSpec, energies: ArrayLike<number> | null, nside: number,
  lambda: AttenuationLengthFn | null, opts: IntegrationOptions = {}): KernelInput {
  const integ = spec.integration;
  const plan = losPlan(integ.maxDistanceKpc, opts.stepKpc ?? integ.stepKpc, opts.nodesPerSegment ?? integ.nodesPerSegment);
  const rMax = spec.observer.rSunKpc + integ.maxDistanceKpc + 0.1;
  const f32 = (n: number) => (opts.shared ? new Float32Array(new SharedArrayBuffer(4 * n)) : new Float32Array(n));
  const f64 = (n: number) => (opts.shared ? new Float64Array(new SharedArrayBuffer(8 * n)) : new Float64Array(n));
  const grid = buildModelGrid(spec, energies, rMax, { ...opts.grid, allocate: f32 });
  const survival = lambda && energies ? survivalTable(plan.sKpc, energies, lambda) : null;
  const n = grid.nE * 12 * nside * nside;
  return {
    nside, rSunKpc: spec.observer.rSunKpc, zSunKpc: spec.observer.zSunKpc,
    nR: grid.nR, nU: grid.nU, nE: grid.nE, dRKpc: grid.dRKpc, zScaleKpc: grid.zScaleKpc, values: grid.values,
    sKpc: plan.sKpc, wKpc: plan.wKpc, survival, out: f64(n), outPlain: survival ? f64(n) : null,
  };
}

/** Factor from model units x kpc to the template's unit: cm per kpc for gas (cm^-3 -> cm^-2), 1 for sources. */
export function unitScale(spec: TemplateSpec): number {
  return spec.sources ? 1 : KPC_CM;
}

/**
 * The template's value toward one direction (Galactic l, b in radians), per
 * energy plane: absorbed and unabsorbed, in the template's unit.
 */
export function integrateToward(input: KernelInput, spec: TemplateSpec, lRad: number, bRad: number): { absorbed: Float64Array; plain: Float64Array } {
  const absorbed = new Float64Array(input.nE), plain = new Float64Array(input.nE);
  losIntegral(input, Math.cos(bRad), Math.sin(bRad), Math.cos(lRad), Math.sin(lRad), absorbed, plain);
  const k = unitScale(spec);
  for (let e = 0; e < input.nE; e++) { absorbed[e] *= k; plain[e] *= k; }
  return { absorbed, plain };
}
