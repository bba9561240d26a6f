/**
 * Spectra as SVG: E^2 I against E on log-log axes (d3-scale's scaleLog for the
 * mapping and ticks), gamma-ray points with asymmetric errors and upper limits
 * (bar and downward arrow), predicted neutrino bands (template spread inside the
 * total uncertainty), a measured neutrino band or points, and a legend below
 * the plot area (outside it, so it never covers data). The SVG
 * is a plain string with no scripts and no external references.
 */
import { scaleLog, type ScaleLogarithmic } from 'd3-scale';
import { InputError } from '../core/errors.js';
import type { SpectrumBand, SpectrumPlotData, SpectrumPointSet } from './spectrumData.js';
import { escapeXml, fmt, superscript } from './svgText.js';

/** Layout options of {@link renderSpectrumSvg} (pixels). */
export interface SpectrumSvgOptions { width?: number; height?: number }

const ERG_PER_GEV = 1.602176634e-3; // exact, from the SI value of the electronvolt (CODATA 2018)
const ENERGY_DIV: Record<string, number> = { GeV: 1, TeV: 1e3, PeV: 1e6 };
const E2_MUL: Record<string, number> = { GeV: 1, TeV: 1e-3, erg: ERG_PER_GEV };
const INK = '#2b2f36', FONT = "font-family=\"'DejaVu Sans', 'Helvetica Neue', Arial, sans-serif\"";

const BAND_STYLE: Record<SpectrumBand['kind'], { fill: string; opacity: number; line: string; dash?: string }> = {
  'predicted-total': { fill: '#f4b183', opacity: 0.45, line: '#c55a11' },
  'predicted-spread': { fill: '#c55a11', opacity: 0.5, line: '#8a3b08' },
  measured: { fill: '#5aa9a0', opacity: 0.35, line: '#1f6f66', dash: '6 4' },
};
const POINT_STYLE: Record<SpectrumPointSet['kind'], string> = { gamma: '#1d3557', neutrino: '#1f6f66' };

function finitePositive(xs: number[]): number[] { return xs.filter((x) => x > 0 && Number.isFinite(x)); }

function decadeLabel(v: number): string {
  const e = Math.round(Math.log10(v));
  if (Math.abs(v - Math.pow(10, e)) > 1e-9 * v) return String(Number(v.toPrecision(3)));
  if (e >= -2 && e <= 3) return String(Number(v.toPrecision(3)));
  return `10${superscript(e)}`;
}

function isDecade(v: number): boolean {
  const e = Math.round(Math.log10(v));
  return Math.abs(v / Math.pow(10, e) - 1) < 1e-9;
}

function check(data: SpectrumPlotData): void {
  data.points.forEach((p, s) => {
    const n = p.energyGeV.length;
    for (const [k, a] of [['e2I', p.e2I], ['errLow', p.errLow], ['errHigh', p.errHigh]] as const) {
      if (a.length !== n) throw new InputError(`has ${a.length} values of ${k} for ${n} energies`, { keyPath: `points[${s}].${k}` });
    }
  });
  data.bands.forEach((b, s) => {
    const n = b.energyGeV.length;
    if (b.low.length !== n || b.high.length !== n) throw new InputError(`low/high have ${b.low.length}/${b.high.length} values for ${n} energies`, { keyPath: `bands[${s}]` });
  });
}

/** Draws the figure described by `data` (see {@link SpectrumPlotData}) as an SVG document string. */
export function renderSpectrumSvg(data: SpectrumPlotData, options: SpectrumSvgOptions = {}): string {
  check(data);
  // The legend sits below the axes, outside the plot area, so it never covers data: one row per entry.
  const legendRows = data.bands.length + data.points.length;
  const legendH = legendRows ? legendRows * 20 + 14 : 0;
  const W = options.width ?? 760, H = (options.height ?? 500) + legendH;
  const eu = data.energyUnit ?? 'TeV', yu = data.e2EnergyUnit ?? 'GeV';
  const ediv = ENERGY_DIV[eu], ymul = E2_MUL[yu];
  const m = { left: 96, right: 24, top: data.title ? 44 : 20, bottom: 62 + legendH };
  const es: number[] = [], ys: number[] = [];
  for (const p of data.points) for (let i = 0; i < p.energyGeV.length; i++) {
    es.push(p.energyGeV[i]); ys.push(p.e2I[i] + p.errHigh[i]);
    ys.push(p.upperLimit?.[i] ? p.e2I[i] / 3 : p.e2I[i] - p.errLow[i]);
  }
  for (const b of data.bands) for (let i = 0; i < b.energyGeV.length; i++) { es.push(b.energyGeV[i]); ys.push(b.low[i], b.high[i]); }
  const ep = finitePositive(es), yp = finitePositive(ys);
  if (!data.energyRangeGeV && ep.length === 0) throw new InputError('the spectrum has no positive energy to draw', { keyPath: 'points' });
  if (!data.e2RangeGeV && yp.length === 0) throw new InputError('the spectrum has no positive E^2 I value to draw', { keyPath: 'points' });
  const eDom = data.energyRangeGeV ?? [Math.min(...ep) / 1.8, Math.max(...ep) * 1.8];
  const yDom = data.e2RangeGeV ?? [Math.min(...yp) / 1.8, Math.max(...yp) * 2.2];
  const x: ScaleLogarithmic<number, number> = scaleLog().domain([eDom[0] / ediv, eDom[1] / ediv]).range([m.left, W - m.right]);
  const y: ScaleLogarithmic<number, number> = scaleLog().domain([yDom[0] * ymul, yDom[1] * ymul]).range([H - m.bottom, m.top]);
  const X = (eGeV: number) => x(eGeV / ediv), Y = (v: number) => y(v * ymul);
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" ${FONT} font-size="13" fill="${INK}">`);
  out.push(`<rect width="${W}" height="${H}" fill="#ffffff"/>`);
  if (data.title) out.push(`<text x="${m.left}" y="26" font-size="16" font-weight="600">${escapeXml(data.title)}</text>`);
  out.push(`<defs><clipPath id="plot"><rect x="${m.left}" y="${m.top}" width="${W - m.left - m.right}" height="${H - m.top - m.bottom}"/></clipPath>`
    + '</defs>');
  // Axes, ticks and grid.
  const x0 = m.left, x1 = W - m.right, y0 = H - m.bottom, y1 = m.top;
  for (const t of x.ticks()) {
    const px = fmt(x(t)), major = isDecade(t);
    if (major) out.push(`<line x1="${px}" y1="${y1}" x2="${px}" y2="${y0}" stroke="#e4e7eb"/>`);
    out.push(`<line x1="${px}" y1="${y0}" x2="${px}" y2="${y0 + (major ? 6 : 3)}" stroke="${INK}"/>`);
    if (major) out.push(`<text x="${px}" y="${y0 + 21}" text-anchor="middle" data-role="tick-label">${decadeLabel(t)}</text>`);
  }
  for (const t of y.ticks()) {
    const py = fmt(y(t)), major = isDecade(t);
    if (major) out.push(`<line x1="${x0}" y1="${py}" x2="${x1}" y2="${py}" stroke="#e4e7eb"/>`);
    out.push(`<line x1="${x0 - (major ? 6 : 3)}" y1="${py}" x2="${x0}" y2="${py}" stroke="${INK}"/>`);
    if (major) out.push(`<text x="${x0 - 9}" y="${fmt(y(t) + 4.5)}" text-anchor="end" data-role="tick-label">${decadeLabel(t)}</text>`);
  }
  out.push(`<rect x="${x0}" y="${y1}" width="${x1 - x0}" height="${y0 - y1}" fill="none" stroke="${INK}"/>`);
  out.push(`<text x="${fmt((x0 + x1) / 2)}" y="${y0 + 46}" text-anchor="middle" data-role="axis-label">E [${eu}]</text>`);
  const yLabel = `E\u00b2 I [${yu} cm\u207b\u00b2 s\u207b\u00b9 sr\u207b\u00b9]` + (data.yNote ? ` (${data.yNote})` : '');
  out.push(`<text transform="translate(22 ${fmt((y0 + y1) / 2)}) rotate(-90)" text-anchor="middle" data-role="axis-label">${escapeXml(yLabel)}</text>`);
  // Bands: totals first, spreads over them, measured last.
  const order: SpectrumBand['kind'][] = ['predicted-total', 'predicted-spread', 'measured'];
  const legend: string[] = [];
  out.push('<g clip-path="url(#plot)">');
  for (const kind of order) for (const b of data.bands.filter((q) => q.kind === kind)) {
    const st = BAND_STYLE[kind];
    const idx = [...Array(b.energyGeV.length).keys()].filter((i) => b.energyGeV[i] > 0 && b.low[i] > 0 && b.high[i] > 0);
    if (idx.length < 2) continue;
    const up = idx.map((i) => `${fmt(X(b.energyGeV[i]))} ${fmt(Y(b.high[i]))}`), down = idx.reverse().map((i) => `${fmt(X(b.energyGeV[i]))} ${fmt(Y(b.low[i]))}`);
    out.push(`<path data-role="band" data-kind="${kind}" d="M${up.join(' L')} L${down.join(' L')} Z" fill="${st.fill}" fill-opacity="${st.opacity}" stroke="${st.line}" stroke-width="0.8"${st.dash ? ` stroke-dasharray="${st.dash}"` : ''}/>`);
    if (b.central) {
      const c = idx.reverse().filter((i) => b.central![i] > 0).map((i) => `${fmt(X(b.energyGeV[i]))} ${fmt(Y(b.central![i]))}`);
      if (c.length > 1) out.push(`<path data-role="band-central" d="M${c.join(' L')}" fill="none" stroke="${st.line}" stroke-width="1.8"${st.dash ? ` stroke-dasharray="${st.dash}"` : ''}/>`);
    }
    legend.push(`<rect x="0" y="-9" width="22" height="11" fill="${st.fill}" fill-opacity="${st.opacity}" stroke="${st.line}" stroke-width="0.8"/><text x="30" y="0">${escapeXml(b.label)}</text>`);
  }
  out.push('</g>');
  // Points.
  for (const p of data.points) {
    const colour = POINT_STYLE[p.kind];
    for (let i = 0; i < p.energyGeV.length; i++) {
      const e = p.energyGeV[i], v = p.e2I[i];
      if (!(e > 0 && v > 0)) continue;
      const px = fmt(X(e)), py = Y(v);
      if (p.upperLimit?.[i]) {
        out.push(`<g data-role="upper-limit" stroke="${colour}" stroke-width="1.6"><line x1="${fmt(X(e) - 6)}" y1="${fmt(py)}" x2="${fmt(X(e) + 6)}" y2="${fmt(py)}"/>`
          + `<line x1="${px}" y1="${fmt(py)}" x2="${px}" y2="${fmt(py + 21)}"/>`
          + `<path d="M${fmt(X(e) - 4.5)} ${fmt(py + 19)} L${fmt(X(e) + 4.5)} ${fmt(py + 19)} L${px} ${fmt(py + 28)} Z" fill="${colour}" stroke="none"/></g>`);
        continue;
      }
      const lo = v - p.errLow[i], hi = v + p.errHigh[i];
      const pyLo = lo > 0 ? Y(lo) : y0, pyHi = Y(hi);
      out.push(`<line data-role="error-bar" x1="${px}" y1="${fmt(pyLo)}" x2="${px}" y2="${fmt(pyHi)}" stroke="${colour}" stroke-width="1.4"/>`);
      out.push(p.kind === 'gamma'
        ? `<circle data-role="point" cx="${px}" cy="${fmt(py)}" r="4.2" fill="${colour}" stroke="#ffffff" stroke-width="1"/>`
        : `<rect data-role="point" x="${fmt(X(e) - 4)}" y="${fmt(py - 4)}" width="8" height="8" fill="${colour}" stroke="#ffffff" stroke-width="1"/>`);
    }
    legend.push((p.kind === 'gamma' ? `<circle cx="11" cy="-4" r="4.2" fill="${colour}"/>` : `<rect x="7" y="-8" width="8" height="8" fill="${colour}"/>`)
      + `<line x1="11" y1="-11" x2="11" y2="3" stroke="${colour}" stroke-width="1.4"/><text x="30" y="0">${escapeXml(p.label)}</text>`);
  }
  // Legend below the axis label, outside the plot area.
  if (legend.length) {
    const lw = Math.min(x1 - x0, 44 + 7.2 * Math.max(...[...data.bands.map((b) => b.label.length), ...data.points.map((p) => p.label.length)]));
    const lx = x0 + 8, ly = y0 + 60;
    out.push(`<g data-role="legend" transform="translate(${fmt(lx)} ${fmt(ly)})"><rect x="-8" y="-4" width="${fmt(lw)}" height="${legend.length * 20 + 8}" fill="#ffffff" fill-opacity="0.88" stroke="#c9ced6"/>`);
    legend.forEach((l, k) => out.push(`<g transform="translate(0 ${k * 20 + 14})">${l}</g>`));
    out.push('</g>');
  }
  out.push('</svg>');
  return out.join('\n');
}
