/**
 * The plain data a spectrum figure is drawn from. All values are in skyspan's
 * internal units: energies in GeV, E^2 I in GeV cm^-2 s^-1 sr^-1 (I the
 * differential intensity per energy, GeV^-1 cm^-2 s^-1 sr^-1). The figure
 * converts to the display units it is asked for.
 */

/** Measured points: gamma rays or neutrinos. */
export interface SpectrumPointSet {
  /** Legend text. */
  label: string;
  /** Gamma-ray points are drawn as circles, neutrino points as squares. */
  kind: 'gamma' | 'neutrino';
  energyGeV: ArrayLike<number>;
  /** E^2 I at each energy (GeV cm^-2 s^-1 sr^-1); for an upper limit, the limit. */
  e2I: ArrayLike<number>;
  /** Downward and upward 1-sigma errors of E^2 I, absolute, same unit (>= 0). */
  errLow: ArrayLike<number>;
  errHigh: ArrayLike<number>;
  /** Non-zero where the point is an upper limit (drawn as a bar and a downward arrow). */
  upperLimit?: ArrayLike<number | boolean>;
}

/** A band between two curves over energy: a prediction or a measured spectrum's range. */
export interface SpectrumBand {
  label: string;
  /**
   * 'predicted-spread': the spread of the prediction across templates;
   * 'predicted-total': its total uncertainty (spread and measurement errors);
   * 'measured': a measured spectrum's band (e.g. a fitted power law's 1-sigma range).
   */
  kind: 'predicted-spread' | 'predicted-total' | 'measured';
  energyGeV: ArrayLike<number>;
  low: ArrayLike<number>;
  high: ArrayLike<number>;
  /** Optional central curve (median or best fit), drawn as a line. */
  central?: ArrayLike<number>;
}

/**
 * Everything one spectrum figure shows: E^2 I against E on log axes.
 *
 * @example
 * const data: SpectrumPlotData = {
 *   title: 'Invented example',
 *   points: [{ label: 'gamma rays (invented)', kind: 'gamma', energyGeV: [2e4, 1e5],
 *              e2I: [3e-7, 1e-7], errLow: [5e-8, 3e-8], errHigh: [5e-8, 3e-8], upperLimit: [0, 0] }],
 *   bands: [],
 * };
 */
export interface SpectrumPlotData {
  title?: string;
  /** Display unit of the energy axis (default 'TeV'). */
  energyUnit?: 'GeV' | 'TeV' | 'PeV';
  /** Energy unit X in the E^2 I axis unit X cm^-2 s^-1 sr^-1 (default 'GeV'). */
  e2EnergyUnit?: 'GeV' | 'TeV' | 'erg';
  /** Qualifier after the quantity, e.g. 'per flavour' or 'all flavours'. */
  yNote?: string;
  points: SpectrumPointSet[];
  bands: SpectrumBand[];
  /** Axis ranges in internal units; default from the data with some room. */
  energyRangeGeV?: [number, number];
  e2RangeGeV?: [number, number];
}

/**
 * Point set from differential intensities I (GeV^-1 cm^-2 s^-1 sr^-1) with
 * absolute errors: multiplies value and errors by E^2 (E in GeV).
 */
export function pointsFromIntensity(
  label: string, kind: 'gamma' | 'neutrino',
  p: { energyGeV: ArrayLike<number>; value: ArrayLike<number>; errLow: ArrayLike<number>; errHigh: ArrayLike<number>; upperLimit?: ArrayLike<number | boolean> },
): SpectrumPointSet {
  const n = p.energyGeV.length;
  const e2 = (i: number) => p.energyGeV[i] * p.energyGeV[i];
  const mul = (a: ArrayLike<number>) => Float64Array.from({ length: n }, (_, i) => a[i] * e2(i));
  return { label, kind, energyGeV: Float64Array.from(p.energyGeV), e2I: mul(p.value), errLow: mul(p.errLow), errHigh: mul(p.errHigh), upperLimit: p.upperLimit };
}
