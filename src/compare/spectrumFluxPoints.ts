/**
 * The comparison's output spectrum as flux points in the open gamma-ray
 * data format (physics/fluxPoints): the predicted all-flavour neutrino
 * intensity per energy (E0 and the spectrum energies), the median of the
 * combined Monte Carlo as the value and the distances to its 16th and 84th
 * percentiles as errn / errp. Written as ECSV and FITS beside the CSV tables.
 */
import { formatFluxPointsEcsv } from '../physics/fluxPoints/ecsv.js';
import { formatFluxPointsFits } from '../physics/fluxPoints/fits.js';
import type { SpectrumPoints } from '../physics/points.js';
import type { Prediction } from './predict.js';

/** The combined prediction as points in internal units (GeV; GeV^-1 cm^-2 s^-1 sr^-1), sorted by energy. */
export function predictionSpectrumPoints(p: Prediction): SpectrumPoints {
  const combined = p.components.find((c) => c.name === 'combined')!;
  const rows = [{ e: p.e0GeV, s: combined.atE0 }, ...Array.from(p.energiesNuGeV, (e, j) => ({ e, s: combined.atEnergies[j] }))]
    .sort((a, b) => a.e - b.e)
    .filter((r, i, all) => i === 0 || Math.abs(r.e - all[i - 1].e) > 1e-9 * r.e);
  return {
    energyGeV: Float64Array.from(rows, (r) => r.e),
    value: Float64Array.from(rows, (r) => r.s.median),
    errLow: Float64Array.from(rows, (r) => r.s.median - r.s.p16),
    errHigh: Float64Array.from(rows, (r) => r.s.p84 - r.s.median),
    upperLimit: new Uint8Array(rows.length),
  };
}

/** ECSV and FITS files `<base>.ecsv` and `<base>.fits` of the predicted spectrum (dnde in TeV-1 cm-2 s-1 sr-1). */
export function predictionFluxPointFiles(p: Prediction, base = 'comparison-spectrum'): { name: string; data: string | Uint8Array }[] {
  const points = predictionSpectrumPoints(p);
  const meta = {
    CONTENT: 'predicted all-flavour neutrino intensity (nu + anti-nu), hadronic, template shape assumed in the unseen sky',
    ERRTYPE: 'errn/errp: median minus 16th and 84th minus median percentiles of the Monte Carlo',
    SAMPLES: p.samples, SEED: p.seed,
  };
  return [
    { name: `${base}.ecsv`, data: formatFluxPointsEcsv(points, { meta }) },
    { name: `${base}.fits`, data: formatFluxPointsFits(points, { meta }) },
  ];
}
