/**
 * The report: ONE self-contained HTML file (inline CSS, figures embedded as
 * data: URIs, no scripts, no network), read top-down: the headline sentence
 * and key figures, the result scaled to each target, the regions and weights,
 * the footprint picture, the spectra, other figures, the assumptions, the
 * tables, the warnings (one line per cause) and the provenance. All text is escaped; SVG figures
 * are embedded as images (data:image/svg+xml), so their content cannot run or
 * restyle the page.
 */
import { escapeXml as esc } from './svgText.js';

/** A generic table: caption, column headers and rows of cells. */
export interface ReportTable {
  caption: string;
  columns: string[];
  /** Cells as text or numbers (numbers shown with 4 significant digits). */
  rows: (string | number | null)[][];
  /** Optional note printed under the table. */
  note?: string;
  /** Stable id for the table element (letters, digits, '-'). */
  id?: string;
}

/** Where a figure goes: the footprint picture first, then the spectra, then other pictures. */
export type FigureSection = 'footprint' | 'spectra' | 'other';

/** A figure: PNG bytes or an SVG document string, with a caption. */
export type ReportFigure =
  | { caption: string; png: Uint8Array; alt?: string; id?: string; section?: FigureSection }
  | { caption: string; svg: string; alt?: string; id?: string; section?: FigureSection };

/** A warning or note shown once per cause, with how many times it was raised. */
export interface GroupedMessage { kind: string; text: string; count: number }

/** A number shown prominently next to the headline (and tagged for checks). */
export interface KeyFigure { label: string; value: string; id?: string }

/** Everything the report shows. */
export interface ReportContent {
  title: string;
  subtitle?: string;
  /** The result in one sentence, with its numbers. */
  headline: string;
  keyFigures?: KeyFigure[];
  /** The result scaled to each target (shown right under the headline). */
  results?: ReportTable[];
  /** The regions and weights, one sentence each. */
  regions?: string[];
  /** Warnings and notes, one per cause (shown after the tables). */
  messages?: GroupedMessage[];
  /** Assumptions in plain words (template shape holds in the unseen sky; emission is hadronic; ...). */
  assumptions: string[];
  tables: ReportTable[];
  figures: ReportFigure[];
  /** Key-value provenance: input hashes, versions, seed, time. */
  provenance: Record<string, string | number | boolean> | [string, string | number | boolean][];
  /** Footer line, e.g. which data are invented. */
  footer?: string;
}

const CSS = `
:root{--ink:#22262c;--muted:#5d6570;--rule:#d5d9df;--accent:#9a3f0c;--band:#f6f3ee}
*{box-sizing:border-box}
body{margin:0;background:#fff;color:var(--ink);font:16px/1.55 "Charter","Bitstream Charter","Georgia","DejaVu Serif",serif}
main{max-width:60rem;margin:0 auto;padding:2.5rem 1.5rem 3rem}
h1{font:600 1.9rem/1.2 "DejaVu Sans","Helvetica Neue",Arial,sans-serif;margin:0 0 .3rem}
h2{font:600 1.15rem/1.3 "DejaVu Sans","Helvetica Neue",Arial,sans-serif;margin:2.2rem 0 .7rem;padding-bottom:.25rem;border-bottom:1px solid var(--rule)}
.subtitle{color:var(--muted);margin:0 0 1.5rem}
.headline{font-size:1.25rem;line-height:1.45;background:var(--band);border-left:4px solid var(--accent);padding:.9rem 1.1rem;margin:1rem 0}
.keys{display:flex;flex-wrap:wrap;gap:.8rem;margin:1rem 0 0;padding:0;list-style:none}
.keys li{border:1px solid var(--rule);border-radius:4px;padding:.45rem .8rem;min-width:9rem}
.keys .label{display:block;font:.8rem/1.3 "DejaVu Sans",Arial,sans-serif;color:var(--muted)}
.keys .value{font:600 1.15rem/1.3 "DejaVu Sans Mono",Menlo,monospace}
ul.assumptions li,ul.regions li,ul.messages li{margin:.2rem 0}
ul.messages li.warning strong{color:var(--accent)}
sup,sub{font-size:.72em;line-height:0}
table{border-collapse:collapse;width:100%;font:.9rem/1.4 "DejaVu Sans",Arial,sans-serif;margin:.3rem 0 1.4rem}
caption{text-align:left;font-weight:600;padding:0 0 .4rem}
th,td{padding:.32rem .6rem;border-bottom:1px solid var(--rule);text-align:left;vertical-align:top}
th{border-bottom:2px solid var(--ink);white-space:nowrap}
td.num,th.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
tbody tr:nth-child(even){background:#fafafa}
.note{font-size:.85rem;color:var(--muted);margin:-1rem 0 1.4rem}
figure{margin:1.2rem 0 2rem;break-inside:avoid;page-break-inside:avoid}
figure img{display:block;max-width:100%;height:auto;margin:0 auto;border:1px solid var(--rule)}
figcaption{font-size:.9rem;color:var(--muted);margin-top:.5rem}
dl.prov{display:grid;grid-template-columns:max-content 1fr;gap:.2rem 1rem;font:.82rem/1.4 "DejaVu Sans Mono",Menlo,monospace}
dl.prov dt{color:var(--muted)} dl.prov dd{margin:0;word-break:break-all}
footer{margin-top:2.5rem;font-size:.82rem;color:var(--muted)}
@media print{body{font-size:11pt}main{max-width:none;padding:0}h2{break-after:avoid}table,.headline{break-inside:avoid}a{color:inherit}}
`;

/**
 * Escaped text with the plain-text notation of units and symbols typeset: `^-2` and `^2` become
 * superscripts (with a true minus sign); in headings (`sub`), `k_I`, `Omega_A` and `k_4pi` become
 * subscripts, and Omega and pi their Greek letters.
 */
export function richText(text: string, sub = false): string {
  let h = esc(text).replace(/\^(-?)(\d+(?:\.\d+)?)/g, (_, m: string, d: string) => `<sup>${m ? '\u2212' : ''}${d}</sup>`);
  if (sub) {
    h = h.replace(/\bOmega(?![A-Za-z])/g, '\u03a9')
      .replace(/(^|[^\w\u03a9])([A-Za-z\u03a9])_(\w+)/g, (_, p: string, a: string, b: string) => `${p}${a}<sub>${b.replace(/pi$/, '\u03c0')}</sub>`);
  }
  return h;
}

function cell(v: string | number | null): string {
  if (v === null) return '<td>\u2014</td>';
  if (typeof v === 'number') {
    const s = !Number.isFinite(v) ? String(v) : v === 0 ? '0' : Math.abs(v) >= 1e-3 && Math.abs(v) < 1e6 ? String(Number(v.toPrecision(4))) : v.toExponential(3);
    return `<td class="num">${esc(s)}</td>`;
  }
  return /^[-+]?[\d.]+(e[-+]?\d+)?(\s*[±]\s*[\d.]+(e[-+]?\d+)?)?$/i.test(v.trim()) ? `<td class="num">${esc(v)}</td>` : `<td>${esc(v)}</td>`;
}

function table(t: ReportTable): string[] {
  // A column whose cells are all numbers (or empty) is right-aligned, header included.
  const numeric = t.columns.map((_, c) => t.rows.length > 0 && t.rows.every((r) => r[c] === null || r[c] === undefined || cell(r[c]).startsWith('<td class="num"')));
  const h = [`<table${idAttr(t.id)}>`, `<caption>${richText(t.caption)}</caption>`, '<thead><tr>',
    ...t.columns.map((c, k) => `<th scope="col"${numeric[k] ? ' class="num"' : ''}>${richText(c, true)}</th>`), '</tr></thead>', '<tbody>'];
  for (const r of t.rows) h.push(`<tr>${r.map(cell).join('')}</tr>`);
  h.push('</tbody>', '</table>');
  if (t.note) h.push(`<p class="note">${richText(t.note)}</p>`);
  return h;
}

function idAttr(id?: string): string {
  return id && /^[A-Za-z][\w-]*$/.test(id) ? ` id="${id}"` : '';
}

function base64(bytes: Uint8Array | string): string {
  return (typeof bytes === 'string' ? Buffer.from(bytes, 'utf8') : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength)).toString('base64');
}

/** Builds the report page (see module doc). Deterministic: the same content gives the same bytes. */
export function renderReport(content: ReportContent): string {
  const h: string[] = [];
  h.push('<!DOCTYPE html>', '<html lang="en">', '<head>', '<meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; img-src data:; style-src 'unsafe-inline'\">",
    `<title>${esc(content.title)}</title>`, `<style>${CSS}</style>`, '</head>', '<body>', '<main>');
  h.push(`<h1>${esc(content.title)}</h1>`);
  if (content.subtitle) h.push(`<p class="subtitle">${esc(content.subtitle)}</p>`);
  h.push(`<p class="headline" id="headline">${richText(content.headline)}</p>`);
  if (content.keyFigures?.length) {
    h.push('<ul class="keys">');
    for (const k of content.keyFigures) h.push(`<li${idAttr(k.id)}><span class="label">${richText(k.label)}</span><span class="value" data-value="${esc(k.value)}">${esc(k.value)}</span></li>`);
    h.push('</ul>');
  }
  if (content.results?.length) {
    h.push('<section id="scaled">', '<h2>Result scaled to each target</h2>');
    for (const t of content.results) h.push(...table(t));
    h.push('</section>');
  }
  if (content.regions?.length) {
    h.push('<section id="regions">', '<h2>Regions and weights</h2>', '<ul class="regions">', ...content.regions.map((r) => `<li>${richText(r)}</li>`), '</ul>', '</section>');
  }
  const sections: [FigureSection, string][] = [['footprint', 'Footprint'], ['spectra', 'Spectra'], ['other', 'Sky map and other figures']];
  let n = 0;
  for (const [sec, title] of sections) {
    const figs = content.figures.filter((f) => (f.section ?? 'other') === sec);
    if (!figs.length) continue;
    h.push(`<section id="figures-${sec}">`, `<h2>${title}</h2>`);
    for (const f of figs) {
      const src = 'png' in f ? `data:image/png;base64,${base64(f.png)}` : `data:image/svg+xml;base64,${base64(f.svg)}`;
      h.push(`<figure${idAttr(f.id)}>`, `<img src="${src}" alt="${esc(f.alt ?? f.caption)}">`,
        `<figcaption><strong>Figure ${++n}.</strong> ${richText(f.caption)}</figcaption>`, '</figure>');
    }
    h.push('</section>');
  }
  h.push('<h2>Assumptions</h2>', '<ul class="assumptions">', ...content.assumptions.map((a) => `<li>${richText(a)}</li>`), '</ul>');
  if (content.tables.length) h.push('<section id="tables">', '<h2>Tables</h2>');
  for (const t of content.tables) h.push(...table(t));
  if (content.tables.length) h.push('</section>');
  if (content.messages?.length) {
    h.push('<section id="messages">', '<h2>Warnings and notes</h2>', '<ul class="messages">',
      ...content.messages.map((m) => `<li class="${m.kind === 'warning' ? 'warning' : 'note'}"><strong>${esc(m.kind)}</strong>${m.count > 1 ? ` (${m.count}\u00d7)` : ''}: ${richText(m.text)}</li>`),
      '</ul>', '</section>');
  }
  const prov = Array.isArray(content.provenance) ? content.provenance : Object.entries(content.provenance);
  h.push('<h2>Provenance</h2>', '<dl class="prov">', ...prov.map(([k, v]) => `<dt>${esc(k)}</dt><dd>${esc(String(v))}</dd>`), '</dl>');
  if (content.footer) h.push(`<footer>${esc(content.footer)}</footer>`);
  h.push('</main>', '</body>', '</html>', '');
  return h.join('\n');
}
