/**
 * The pictures of a run, as files and as report figures in reading order:
 * the footprint picture (zoomed on the measured region, every mask drawn), the
 * spectra (comparison, forecast) and the full-sky map of one template.
 */
import type { ReportFigure } from '../render/report.js';
import type { ComparisonReport } from '../compare/report.js';
import type { RunComputation } from './compute.js';
import { comparisonSvg, footprintPng, forecastSvg, skyMapPng } from './figures.js';
import type { ResolvedPlan } from './loadPlan.js';

/** The picture files (name relative to the output folder) and the report figures. */
export function runFigures(rp: ResolvedPlan, c: RunComputation, compReport: ComparisonReport | null):
  { files: { name: string; data: string | Uint8Array }[]; figures: ReportFigure[] } {
  const { plan } = rp;
  const files: { name: string; data: string | Uint8Array }[] = [];
  const figures: ReportFigure[] = [];
  const name = plan.outputs.mapTemplate ?? c.templates[0].name;
  const t = c.templates.find((x) => x.name === name) ?? c.templates[0];
  const masks = plan.gamma?.mask ? [plan.gamma.mask] : [];
  if (plan.outputs.maps) {
    const region = plan.gamma?.region ?? plan.forecast!.footprint;
    const png = footprintPng(t.map, t.name, rp.regions, { region, masks, width: plan.outputs.mapWidth });
    if (png) {
      files.push({ name: 'map-footprint.png', data: png });
      figures.push({ id: 'fig-footprint', section: 'footprint', png, caption: `The ${plan.gamma ? 'measured region' : 'forecast footprint'} '${region}' (white outline) on template '${t.name}' (Galactic, log scale)`
        + `${masks.length ? `; '${masks[0]}' hatched, and every masked disc circled (small discs at a minimum size)` : ''}.` });
    }
  }
  if (plan.outputs.spectrum && compReport) {
    const svg = comparisonSvg(compReport, plan.title);
    files.push({ name: 'spectrum.svg', data: svg });
    figures.push({ id: 'fig-spectrum', section: 'spectra', svg, caption: 'Gamma-ray points in the measured region, the predicted neutrino intensity (template spread inside the total uncertainty) and the measured neutrino band.' });
  }
  if (plan.outputs.spectrum && c.forecast) {
    const svg = forecastSvg(c.forecast, rp.measurement, `${plan.title}: forecast`);
    files.push({ name: 'forecast.svg', data: svg });
    figures.push({ id: 'fig-forecast', section: 'spectra', svg, caption: `Gamma-ray intensity expected in '${plan.forecast!.footprint}' from the neutrino measurement.` });
  }
  if (plan.outputs.maps) {
    const outline = [...(plan.gamma ? [plan.gamma.region] : []), ...(plan.forecast ? [plan.forecast.footprint] : [])];
    const png = skyMapPng(t.map, t.name, rp.regions, { outline, shade: masks, width: plan.outputs.mapWidth });
    files.push({ name: 'map-template.png', data: png });
    figures.push({ id: 'fig-map', section: 'other', png, caption: `Template '${t.name}' (Mollweide, Galactic, log scale) with ${outline.map((o) => `'${o}'`).join(' and ')} outlined${masks.length ? ` and '${masks[0]}' hatched, its discs circled` : ''}.` });
  }
  return { files, figures };
}
