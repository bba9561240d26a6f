/**
 * log N - log S as SVG: N(>S) against S on log-log axes (d3-scale's scaleLog
 * for mapping and ticks), a band (16-84 % of the realisations) and a mean line
 * per curve, catalogue counts as points with Poisson bars (sqrt N), and a
 * legend. A plain string, no scripts, no external references.
 */
import { scaleLog } from 'd3-scale';
import { InputError } from '../core/errors.js';

/** One curve: mean and band of N(>S) on a flux grid (erg cm^-2 s^-1). */
export interface CountCurve {
  label: string;
  fluxErgCm2S: ArrayLike<number>;
  mean: ArrayLike<number>;
  low: ArrayLike<number>;
  high: ArrayLike<number>;
  dashed?: boolean;
}

/** A catalogue count: N sources above a flux. */
export interface CountPoint { label: string; fluxErgCm2S: number; count: number }

/** What {@link renderSourceCountsSvg} draws. */
export interface CountPlot { title?: string; curves: CountCurve[]; points?: CountPoint[]; width?: number; height?: number }

const INK = '#2b2f36', FONT = "font-family=\"'DejaVu Sans', 'Helvetica Neue', Arial, sans-serif\"";
const COLOURS = ['#2f5d8a', '#b5542b', '#4e8a3a', '#7a4b94', '#8a6d1f', '#2f8a84'];

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}
const f2 = (x: number) => (Math.round(x * 100) / 100).toString();
function tickLabel(v: number): string {
  const e = Math.round(Math.log10(v));
  return Math.abs(v / 10 ** e - 1) < 1e-9 ? `1e${e}` : '';
}

/** Draws the plot as an SVG document string. Throws InputError when nothing positive can be drawn. */
export function renderSourceCountsSvg(plot: CountPlot): string {
  const W = plot.width ?? 720, H = plot.height ?? 480;
  const m = { left: 84, right: 24, top: plot.title ? 44 : 20, bottom: 58 };
  const xs: number[] = [], ys: number[] = [];
  for (const c of plot.curves) for (let k = 0; k < c.fluxErgCm2S.length; k++) {
    if (c.high[k] > 0) { xs.push(c.fluxErgCm2S[k]); ys.push(c.high[k]); if (c.low[k] > 0) ys.push(c.low[k]); if (c.mean[k] > 0) ys.push(c.mean[k]); }
  }
  for (const p of plot.points ?? []) if (p.count > 0) { xs.push(p.fluxErgCm2S); ys.push(p.count + Math.sqrt(p.count), Math.max(0.5, p.count - Math.sqrt(p.count))); }
  if (xs.length === 0) throw new InputError('no positive source count to draw', { keyPath: 'curves' });
  const x = scaleLog().domain([Math.min(...xs) / 1.3, Math.max(...xs) * 1.3]).range([m.left, W - m.right]);
  const y = scaleLog().domain([Math.max(0.3, Math.min(...ys) / 1.5), Math.max(...ys) * 1.8]).range([H - m.bottom, m.top]);
  const [y0, y1] = y.domain();
  const Y = (v: number) => y(Math.min(y1, Math.max(y0, v)));
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" ${FONT} font-size="13" fill="${INK}">`);
  out.push(`<rect width="${W}" height="${H}" fill="#ffffff"/>`);
  if (plot.title) out.push(`<text x="${m.left}" y="26" font-size="16" font-weight="600">${esc(plot.title)}</text>`);
  out.push(`<rect x="${m.left}" y="${m.top}" width="${W - m.left - m.right}" height="${H - m.top - m.bottom}" fill="none" stroke="${INK}"/>`);
  for (const t of x.ticks()) {
    const X = f2(x(t)), major = tickLabel(t) !== '';
    out.push(`<line x1="${X}" x2="${X}" y1="${H - m.bottom}" y2="${H - m.bottom + (major ? 6 : 3)}" stroke="${INK}"/>`);
    if (major) out.push(`<text x="${X}" y="${H - m.bottom + 20}" text-anchor="middle">${tickLabel(t)}</text>`);
  }
  for (const t of y.ticks()) {
    const Yt = f2(y(t)), major = tickLabel(t) !== '';
    out.push(`<line x1="${m.left - (major ? 6 : 3)}" x2="${m.left}" y1="${Yt}" y2="${Yt}" stroke="${INK}"/>`);
    if (major) out.push(`<text x="${m.left - 9}" y="${Yt}" dy="0.35em" text-anchor="end">${tickLabel(t)}</text>`);
  }
  out.push(`<text x="${(m.left + W - m.right) / 2}" y="${H - 14}" text-anchor="middle">S = E0² dN/dE at the pivot (erg cm⁻² s⁻¹)</text>`);
  out.push(`<text transform="translate(20 ${(m.top + H - m.bottom) / 2}) rotate(-90)" text-anchor="middle">N(&gt;S)</text>`);
  plot.curves.forEach((c, i) => {
    const col = COLOURS[i % COLOURS.length], up: string[] = [], down: string[] = [], line: string[] = [];
    for (let k = 0; k < c.fluxErgCm2S.length; k++) {
      if (!(c.high[k] > 0)) continue;
      const X = f2(x(c.fluxErgCm2S[k]));
      up.push(`${X},${f2(Y(c.high[k]))}`);
      down.unshift(`${X},${f2(Y(c.low[k] > 0 ? c.low[k] : y0))}`);
      if (c.mean[k] > 0) line.push(`${X},${f2(Y(c.mean[k]))}`);
    }
    if (up.length > 1) out.push(`<polygon points="${[...up, ...down].join(' ')}" fill="${col}" fill-opacity="0.22" stroke="none"/>`);
    if (line.length > 1) out.push(`<polyline points="${line.join(' ')}" fill="none" stroke="${col}" stroke-width="2"${c.dashed ? ' stroke-dasharray="6 4"' : ''}/>`);
    const ly = m.top + 18 + 18 * i;
    out.push(`<line x1="${W - m.right - 190}" x2="${W - m.right - 164}" y1="${ly}" y2="${ly}" stroke="${col}" stroke-width="2"${c.dashed ? ' stroke-dasharray="6 4"' : ''}/>`);
    out.push(`<text x="${W - m.right - 158}" y="${ly}" dy="0.35em">${esc(c.label)}</text>`);
  });
  (plot.points ?? []).forEach((p) => {
    if (!(p.count > 0)) return;
    const X = f2(x(p.fluxErgCm2S)), e = Math.sqrt(p.count);
    out.push(`<line x1="${X}" x2="${X}" y1="${f2(Y(p.count + e))}" y2="${f2(Y(Math.max(y0, p.count - e)))}" stroke="${INK}"/>`);
    out.push(`<circle cx="${X}" cy="${f2(Y(p.count))}" r="4" fill="${INK}"><title>${esc(p.label)}: ${p.count}</title></circle>`);
  });
  out.push('</svg>');
  return out.join('\n') + '\n';
}

/** A placeholder figure saying that nothing could be drawn. */
export function emptyPlotSvg(title: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="720" height="120" viewBox="0 0 720 120" ${FONT} font-size="13" fill="${INK}">\n` +
    `<rect width="720" height="120" fill="#ffffff"/>\n<text x="24" y="40" font-size="16" font-weight="600">${esc(title)}</text>\n` +
    '<text x="24" y="76">no source in the flux range of the plot</text>\n</svg>\n';
}
