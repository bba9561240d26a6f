/**
 * The pictures of a run: a zoomed footprint picture (measured region outlined,
 * masks hatched, every mask disc circled), a Mollweide sky map of one template
 * with the measured region (and forecast footprint) outlined and the mask hatched, the
 * spectrum (gamma-ray points, predicted neutrino bands: template spread and
 * total, the measured neutrino band) and the forecast spectrum.
 */
import { evaluateRegion } from '../regions/evaluate.js';
import type { RegionDocument } from '../regions/types.js';
import { renderSkyMap, type ZoomWindowDeg } from '../render/skyImage.js';
import { ringTable } from '../sphere/ringTable.js';
import { maskDiscs, type MaskDisc } from './regionSummary.js';
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
    discs: { frame: 'galactic', marks: o.shade.flatMap((r) => { try { return maskDiscs(doc, r); } catch { return []; } }) },
  }).png;
}

/**
 * The lon/lat window (deg) around the pixels of `region` (fraction > 0 at Nside 64): the shortest longitude
 * arc holding them all (found from the widest empty gap) and their latitudes, with a margin of 3 deg and at
 * least 12 deg of latitude; null when the region is empty or covers every longitude of a wide latitude range.
 */
export function footprintWindow(doc: RegionDocument, region: string): ZoomWindowDeg | null {
  const nside = 64;
  const w = evaluateRegion(doc, region, { nside, frame: 'galactic', mode: 'centre' });
  const rt = ringTable(nside);
  const lonSeen = new Uint8Array(360);
  let bMin = 90, bMax = -90;
  for (let r = 0; r < rt.count; r++) {
    const b = 90 - (rt.theta[r] * 180) / Math.PI;
    for (let k = 0; k < rt.length[r]; k++) {
      if (!(w.fraction[rt.first[r] + k] > 0)) continue;
      lonSeen[Math.floor((((rt.phi0[r] + k * rt.dphi[r]) * 180) / Math.PI) % 360)] = 1;
      if (b < bMin) bMin = b;
      if (b > bMax) bMax = b;
    }
  }
  if (bMax < bMin) return null;
  // Widest run of unseen whole degrees, circularly.
  let bestStart = 0, bestLen = 0;
  for (let s = 0; s < 360; s++) {
    if (lonSeen[s] || lonSeen[(s + 359) % 360] === 0) continue;
    let n = 0;
    while (n < 360 && !lonSeen[(s + n) % 360]) n++;
    if (n > bestLen) { bestLen = n; bestStart = s; }
  }
  const margin = 3;
  const latLo = Math.max(-90, bMin - margin), latHi = Math.min(90, bMax + margin);
  const mid = 0.5 * (latLo + latHi), half = Math.max(6, 0.5 * (latHi - latLo));
  const lat: [number, number] = [Math.max(-90, mid - half), Math.min(90, mid + half)];
  if (bestLen < 20) return lat[1] - lat[0] > 60 ? null : { lonMinDeg: -180, lonMaxDeg: 180, latMinDeg: lat[0], latMaxDeg: lat[1] };
  // The seen arc runs from the end of the gap to its start; shown with l decreasing to the right like the sky.
  const from = (bestStart + bestLen) % 360 - margin, width = 360 - bestLen + 2 * margin;
  const lonMin = from > 180 ? from - 360 : from;
  return { lonMinDeg: lonMin, lonMaxDeg: lonMin + Math.min(360, width), latMinDeg: lat[0], latMaxDeg: lat[1] };
}

/**
 * The footprint picture: the template zoomed onto the measured region, the region outlined, the masks hatched
 * and every mask disc circled (at least a few pixels wide). Null when no window fits (see {@link footprintWindow}).
 */
export function footprintPng(map: SkyMap, name: string, doc: RegionDocument, o: { region: string; masks: string[]; width: number }): Uint8Array | null {
  const zoom = footprintWindow(doc, o.region);
  if (!zoom) return null;
  const nside = Math.min(256, Math.max(64, map.nside));
  const marks: MaskDisc[] = [];
  for (const r of [o.region, ...o.masks]) { try { marks.push(...maskDiscs(doc, r)); } catch { /* a catalogue already refused elsewhere */ } }
  return renderSkyMap(map, {
    width: o.width, scale: 'log', title: `footprint '${o.region}' on template ${name}`, zoom,
    outlines: [overlay(doc, o.region, nside, 0xffffff)], shades: o.masks.map((r) => overlay(doc, r, nside)),
    discs: { frame: 'galactic', marks },
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
