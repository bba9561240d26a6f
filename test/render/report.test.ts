import { describe, expect, it } from 'vitest';
import { renderReport, richText, type ReportContent } from '../../src/render/report.js';
import { renderSpectrumSvg } from '../../src/render/spectrumSvg.js';
import { renderSkyMap } from '../../src/render/skyImage.js';
import { fieldMap } from './fixtures.js';

const png = renderSkyMap(fieldMap(8, (l, b) => Math.cos(b)), { width: 320 }).png;
const svg = renderSpectrumSvg({ points: [{ label: 'p', kind: 'gamma', energyGeV: [1e4, 1e5], e2I: [1e-7, 5e-8], errLow: [1e-8, 1e-8], errHigh: [1e-8, 1e-8] }], bands: [] });
const content: ReportContent = {
  title: 'Invented <b>scenario</b>',
  headline: 'Measured/predicted = 0.62 ± 0.2 & tension 1.9σ <script>alert(1)</script>',
  keyFigures: [{ label: 'ratio', value: '0.62', id: 'ratio' }],
  assumptions: ['The unseen sky looks like the template.', 'The emission is hadronic; "quotes" and \'apostrophes\'.'],
  tables: [{ caption: 'Factors', columns: ['template', 'k_I', 'note'], rows: [['A', 1.23456, 'x < y'], ['B', 2.5e-9, null]], id: 'factors' }],
  figures: [{ caption: 'Sky map', png }, { caption: 'Spectrum', svg }],
  provenance: { seed: 42, 'input hash': 'abc123', url_like: 'https://example.org/x' },
  footer: 'All data are invented.',
};
const html = renderReport(content);

describe('HTML report', () => {
  it('is self-contained: every src is a data: URI, and no external URL remains outside escaped text', () => {
    const srcs = [...html.matchAll(/\ssrc="([^"]*)"/g)].map((m) => m[1]);
    expect(srcs.length).toBe(2);
    for (const s of srcs) expect(s.startsWith('data:image/')).toBe(true);
    expect(html).not.toMatch(/<script|<link|<iframe|@import|url\(/i);
    // The only 'http' is the user's provenance text, escaped as text content.
    const withoutProv = html.replace('https://example.org/x', '');
    expect(withoutProv).not.toMatch(/https?:/);
  });
  it('escapes every text field', () => {
    expect(html).toContain('Invented &lt;b&gt;scenario&lt;/b&gt;');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).toContain('&quot;quotes&quot; and &#39;apostrophes&#39;');
    expect(html).toContain('<td>x &lt; y</td>');
    expect(html).not.toContain('<b>scenario');
  });
  it('has the sections, the table cells and the key figure', () => {
    for (const h of ['Assumptions', 'Tables', 'Sky map and other figures', 'Provenance']) expect(html).toContain(`<h2>${h}</h2>`);
    expect(html).toContain('<td class="num">1.235</td>');
    expect(html).toContain('<td class="num">2.500e-9</td>');
    expect(html).toContain('data-value="0.62"');
    expect(html).toContain('<figcaption><strong>Figure 2.</strong> Spectrum</figcaption>');
    expect((html.match(/<tr>/g) ?? []).length).toBe(1 + 2); // header row and two body rows
  });
  it('embeds the PNG bytes and the SVG text unchanged (base64 round trip)', () => {
    const [p, s] = [...html.matchAll(/src="data:image\/[^;]+;base64,([^"]+)"/g)].map((m) => Buffer.from(m[1], 'base64'));
    expect(p.equals(png)).toBe(true);
    expect(s.toString('utf8')).toBe(svg);
  });
  it('reads top-down: headline, scaled results, regions, footprint, spectra, tables, then warnings grouped by cause', () => {
    const full = renderReport({ ...content,
      results: [{ id: 'scaled-results', caption: 'Scaled', columns: ['target', 'I_B median'], rows: [['plane', 1e-9]] }],
      regions: ["measured region: 'a' is the box l 20 to 80 deg."],
      figures: [{ caption: 'Spectrum', svg, section: 'spectra', id: 'fig-spectrum' }, { caption: 'Map', png, section: 'other' },
        { caption: 'Footprint', png, section: 'footprint', id: 'fig-footprint' }],
      messages: [{ kind: 'warning', text: 'cause one', count: 4 }] });
    const at = (s: string) => { const i = full.indexOf(s); expect(i).toBeGreaterThan(-1); return i; };
    const order = ['id="headline"', 'id="scaled"', 'id="regions"', 'id="fig-footprint"', 'id="fig-spectrum"', 'id="tables"', 'id="messages"'].map(at);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
    expect(full).toContain('<strong>warning</strong> (4\u00d7): cause one');
    expect(full).toContain('<figcaption><strong>Figure 1.</strong> Footprint</figcaption>');
  });
  it('typesets units and symbols: superscripts in text, subscripts in headings (common practice, no source)', () => {
    expect(richText('E^2 I in GeV cm^-2 s^-1 sr^-1')).toBe('E<sup>2</sup> I in GeV cm<sup>\u2212' + '2</sup> s<sup>\u22121</sup> sr<sup>\u22121</sup>');
    expect(richText('k_I and Omega_A (sr) and k_4pi', true)).toBe('k<sub>I</sub> and \u03a9<sub>A</sub> (sr) and k<sub>4\u03c0</sub>');
    expect(richText("template 'gas_cr'")).toBe('template &#39;gas_cr&#39;');
  });
  it('is deterministic', () => {
    expect(renderReport(content)).toBe(html);
  });
});
