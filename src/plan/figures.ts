/**
 * The pictures of a run: a Mollweide sky map of one template with the
 * measured region (and forecast footprint) outlined and the mask hatched, the
 * spectrum (gamma-ray points, predicted neutrino bands: template spread and
 * total, the measured neutrino band) and the forecast spectrum.
 */
import { evaluateRegion } from '../regions/evaluate.js';
import type { RegionDocument } from '../regions/types.js';
import { renderSkyMap } from '../render/skyImage.js';
import type { RegionOverlay } from '../render/overlays.js';
import { renderSpectrumSvg } from '../render/spectrumSvg.js';
import { pointsFromIntensity, type SpectrumBand } from '../render/spectrumData.js';
import { spectrumPlotData, type ComparisonReport } from '../compare/report.js';
import type { ReverseResult } from '../compare/reverse.js';
import type { NeutrinoMeasurement } from '../compare/measurement.js';
import type { SkyMap } from '../maps/skyMap.js';

function overlay(doc: RegionDocument, name: string, nside: number, colour?: number): RegionOverlay {
  const w = evaluateRegion(doc, name, { nside, frame: 'galactic', mode: 'fraction', depth: 2 });
  return { name, nside: w.nside, frame: w.frame, fraction: w.fraction, colour };
}

/** The sky map PNG. */
export function skyMapPng(map: SkyMap, name: string, doc: RegionDocument, o: { outline: string[]; shade: string[]; width: number }): Uint8Array {
  const nside = Math.min(128, map.nside);
  return renderSkyMap(map, {
    width: o.width, scale: 'log', title: `template ${name}`,
    outlines: o.outline.map((r, i) => overlay(doc, r, nside, i === 0 ? 0xffffff : 0x7fdbff)),
    shades: o.shade.map((r) => overlay(doc, r, nside)),
  }).png;
}

const e2 = (e: number[], v: number[]) => v.map((x, i) => x * e[i] * e[i]);

/** The comparison spectrum SVG. */
export function comparisonSvg(r: ComparisonReport, title: string): string {
  const d = spectrumPlotData(r);
  const E = d.energiesGeV;
  const bands: SpectrumBand[] = [];
  const tot = d.predicted.combined, spread = d.predicted.template;
  if (tot) bands.push({ label: 'predicted neutrinos, total uncertainty (16-84 %)', kind: 'predicted-total', energyGeV: E, low: e2(E, tot.p16), high: e2(E, tot.p84), central: e2(E, tot.p50) });
  if (spread) bands.push({ label: 'predicted neutrinos, template spread', kind: 'predicted-spread', energyGeV: E, low: e2(E, spread.p16), high: e2(E, spread.p84) });
  const points = [];
  if (d.gamma) points.push(pointsFromIntensity('gamma rays, measured region', 'gamma', { energyGeV: d.gamma.energyGeV, value: d.gamma.value,
    errLow: d.gamma.errLow, errHigh: d.gamma.errHigh, upperLimit: d.gamma.upperLimit }));
  const mb = d.measured;
  if (mb && mb.kind === 'points') {
    points.push(pointsFromIntensity(`neutrinos: ${mb.label}`, 'neutrino', { energyGeV: mb.energyGeV, value: mb.p50,
      errLow: mb.p50.map((v, i) => v - mb.p16[i]), errHigh: mb.p84.map((v, i) => v - mb.p50[i]), upperLimit: mb.upperLimit }));
  } else if (mb) {
    bands.push({ label: `neutrinos measured: ${mb.label}`, kind: 'measured', energyGeV: mb.energyGeV, low: e2(mb.energyGeV, mb.p16), high: e2(mb.energyGeV, mb.p84), central: e2(mb.energyGeV, mb.p50) });
  }
  return renderSpectrumSvg({ title, energyUnit: 'TeV', yNote: d.flavour === 'all' ? 'all flavours' : `${d.flavour} flavour`, points, bands });
}

/** The forecast spectrum SVG: expected gamma-ray band and the neutrino measurement it came from. */
export function forecastSvg(f: ReverseResult, m: NeutrinoMeasurement, title: string): string {
  const E = Array.from(f.energiesGammaGeV);
  const bands: SpectrumBand[] = [];
  const c = f.components.find((x) => x.name === 'combined'), t = f.components.find((x) => x.name === 'template');
  if (c) bands.push({ label: 'expected gamma rays in the footprint, total (16-84 %)', kind: 'predicted-total', energyGeV: E,
    low: e2(E, c.atEnergies.map((s) => s.p16)), high: e2(E, c.atEnergies.map((s) => s.p84)), central: e2(E, c.atEnergies.map((s) => s.median)) });
  if (t) bands.push({ label: 'expected gamma rays, template spread', kind: 'predicted-spread', energyGeV: E,
    low: e2(E, t.atEnergies.map((s) => s.p16)), high: e2(E, t.atEnergies.map((s) => s.p84)) });
  if (m.kind !== 'points') {
    const [lo, hi] = m.energyRangeGeV ?? [m.e0GeV / 10, m.e0GeV * 10];
    const es = Array.from({ length: 12 }, (_, i) => lo * Math.pow(hi / lo, i / 11));
    const g = m.kind === 'normalisation' ? m.index : 0.5 * (m.indexRange[0] + m.indexRange[1]);
    const at = (n: number, e: number) => n * Math.pow(e / m.e0GeV, -g) * e * e;
    bands.push({ label: `neutrinos measured: ${m.label}`, kind: 'measured', energyGeV: es,
      low: es.map((e) => at(m.norm.value - m.norm.errLow, e)), high: es.map((e) => at(m.norm.value + m.norm.errHigh, e)), central: es.map((e) => at(m.norm.value, e)) });
  }
  return renderSpectrumSvg({ title, energyUnit: 'TeV', points: [], bands });
}
