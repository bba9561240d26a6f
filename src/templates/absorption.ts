/**
 * Pair absorption along the line of sight. In a uniform radiation field (the
 * CMB) the optical depth to distance s is s / lambda(E), so each sample is
 * weighted by exp(-s / lambda(E)) (common practice, no source).
 * The attenuation length comes from the physics layer unless a function is
 * injected (tests use a constant lambda).
 */
import { ComputeError } from '../core/errors.js';
import { attenuationLengthKpc } from '../physics/absorption/attenuationLength.js';

/** Attenuation length in kpc at an energy in GeV. */
export type AttenuationLengthFn = (energyGeV: number) => number;

/** exp(-s_k / lambda(E_e)) at [k * nE + e]. */
export function survivalTable(sKpc: Float64Array, energiesGeV: ArrayLike<number>, lambda: AttenuationLengthFn): Float64Array {
  const nE = energiesGeV.length;
  const out = new Float64Array(sKpc.length * nE);
  for (let e = 0; e < nE; e++) {
    const l = lambda(energiesGeV[e]);
    if (!(l > 0)) throw new ComputeError(`attenuation length at ${energiesGeV[e]} GeV is ${l} kpc, expected a positive value`);
    for (let k = 0; k < sKpc.length; k++) out[k * nE + e] = Math.exp(-sKpc[k] / l);
  }
  return out;
}

/**
 * The physics layer's attenuation length on the CMB at 2.7255 K
 * (src/physics/absorption/attenuationLength.ts; Infinity where transparent).
 */
export async function defaultAttenuationLength(): Promise<AttenuationLengthFn> {
  return (energyGeV: number) => attenuationLengthKpc(energyGeV);
}
