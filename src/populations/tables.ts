/**
 * The section's tables as CSV text: N(>S) per region (mean and 16-84 % of the
 * realisations, all and resolved sources) and the intensities per energy.
 */
import type { PopulationSectionResult } from './runSection.js';
import { formatCsv } from '../io/csvWrite.js';

const g = (x: number) => (Number.isFinite(x) ? Number(x.toPrecision(6)).toString() : '');

/** N(>S) table: region, flux, all_mean, all_p16, all_p84, resolved_mean, resolved_p16, resolved_p84. */
export function countsCsv(r: Pick<PopulationSectionResult, 'grid' | 'counts' | 'name' | 'realisations'>): string {
  const rows: string[][] = [];
  for (const c of r.counts) {
    for (let k = 0; k < r.grid.length; k++) {
      const a = c.all[k], s = c.resolved[k];
      rows.push([c.region, g(r.grid[k]), g(a.mean), g(a.p16), g(a.p84), g(s.mean), g(s.p16), g(s.p84)]);
    }
  }
  return formatCsv(['region', 'flux_erg_cm2_s', 'all_mean', 'all_p16', 'all_p84', 'resolved_mean', 'resolved_p16', 'resolved_p84'], rows,
    { comments: [`source counts N(>S) of population ${r.name}, ${r.realisations} realisations; S = E0^2 dN/dE at the pivot in erg cm^-2 s^-1`] });
}

/** Intensity table per energy (GeV^-1 cm^-2 s^-1 sr^-1): unresolved in the measured region, all sources in the neutrino region. */
export function intensitiesCsv(r: Pick<PopulationSectionResult, 'energiesGeV' | 'unresolvedMeasured' | 'neutrinoAll' | 'name'>): string {
  const rows: string[][] = [];
  for (let e = 0; e < r.energiesGeV.length; e++) {
    const u = r.unresolvedMeasured?.[e], n = r.neutrinoAll?.[e];
    rows.push([g(r.energiesGeV[e]), g(u?.mean ?? NaN), g(u?.std ?? NaN), g(u?.p16 ?? NaN), g(u?.p84 ?? NaN),
      g(n?.mean ?? NaN), g(n?.std ?? NaN), g(n?.p16 ?? NaN), g(n?.p84 ?? NaN)]);
  }
  return formatCsv(['energy_GeV', 'unresolved_measured_mean', 'unresolved_measured_std', 'unresolved_measured_p16', 'unresolved_measured_p84',
    'all_neutrino_mean', 'all_neutrino_std', 'all_neutrino_p16', 'all_neutrino_p84'], rows,
  { comments: [`source intensities of population ${r.name} in GeV^-1 cm^-2 s^-1 sr^-1 (mean, std, 16 and 84 % of the realisations)`] });
}
