/** Small population models shared by the population tests (invented numbers). */
import type { PopulationModel } from '../../src/populations/model.js';
import { RADIAL_LAWS } from '../../src/templates/radialLaws.js';

/** Flux (erg cm^-2 s^-1) of 1e34 erg/s at 1 kpc: 1e34 / (4 pi (3.0857e21 cm)^2) (inverse-square law, common knowledge). */
export const S_1E34_AT_1KPC = 1e34 / (4 * Math.PI * 3.0857e21 ** 2);

const common = {
  name: 'invented',
  luminosity: { kind: 'powerLaw', alpha: 2, minErgPerS: 1e34, maxErgPerS: 2e34 } as const,
  spectrum: { pivotGeV: 1e4, index: 2.5, indexSpread: 0, cutoffGeV: null },
  size: { kind: 'point' } as const,
  energiesGeV: [1e4],
};

export function ballModel(count: number, radiusKpc: number): PopulationModel {
  return { ...common, count, spatial: { kind: 'ball', radiusKpc } };
}

export function thinDiscModel(count: number, scaleHeightKpc: number, rMaxKpc: number): PopulationModel {
  return { ...common, count, spatial: { kind: 'disc', law: null, lawName: 'constant', scaleHeightKpc, rSunKpc: 8.5, zSunKpc: 0, rMaxKpc } };
}

export function lorimerModel(count: number, scaleHeightKpc: number): PopulationModel {
  return {
    ...common, count,
    luminosity: { kind: 'powerLaw', alpha: 1.8, minErgPerS: 1e33, maxErgPerS: 1e35 },
    spectrum: { pivotGeV: 1e4, index: 2.4, indexSpread: 0.2, cutoffGeV: 2e5 },
    energiesGeV: [1e3, 1e4, 1e5],
    spatial: { kind: 'disc', law: RADIAL_LAWS.lorimer2006, lawName: 'lorimer2006', scaleHeightKpc, rSunKpc: 8.5, zSunKpc: 0, rMaxKpc: 30 },
  };
}
