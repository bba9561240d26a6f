import { describe, expect, it } from 'vitest';
import { renderSpectrumSvg } from '../../src/render/spectrumSvg.js';
import { pointsFromIntensity, type SpectrumPlotData } from '../../src/render/spectrumData.js';

const E = [2e4, 5e4, 1e5, 3e5, 1e6];
const e2 = E.map((e) => 3e-7 * Math.pow(e / 2e4, -0.7));
const es = Array.from({ length: 20 }, (_, i) => 1e4 * Math.pow(10, (i / 19) * 2.3));
const band = es.map((e) => 1.2e-7 * Math.pow(e / 2e4, -0.6));
const data: SpectrumPlotData = {
  title: 'Invented <scenario> & test',
  points: [
    { label: 'gamma rays (invented)', kind: 'gamma', energyGeV: E, e2I: e2, errLow: e2.map((v) => 0.2 * v), errHigh: e2.map((v) => 0.3 * v), upperLimit: [0, 0, 0, 1, 1] },
    { label: 'neutrinos (invented)', kind: 'neutrino', energyGeV: [3e4, 1e5], e2I: [1e-7, 5e-8], errLow: [2e-8, 1e-8], errHigh: [3e-8, 2e-8] },
  ],
  bands: [
    { label: 'predicted, total', kind: 'predicted-total', energyGeV: es, low: band.map((v) => 0.4 * v), high: band.map((v) => 2 * v), central: band },
    { label: 'predicted, template spread', kind: 'predicted-spread', energyGeV: es, low: band.map((v) => 0.7 * v), high: band.map((v) => 1.4 * v) },
    { label: 'measured', kind: 'measured', energyGeV: es, low: band.map((v) => 1.1 * v), high: band.map((v) => 2.5 * v) },
  ],
};

function count(s: string, sub: string): number { return s.split(sub).length - 1; }

describe('spectrum SVG', () => {
  const svg = renderSpectrumSvg(data);
  it('is one well-formed-looking SVG element with balanced tags and no scripts or links', () => {
    expect(svg.startsWith('<svg ')).toBe(true);
    expect(svg.trimEnd().endsWith('</svg>')).toBe(true);
    const opens = (svg.match(/<([a-zA-Z]+)(\s[^>]*)?>/g) ?? []).filter((t) => !t.endsWith('/>')).length;
    expect(opens).toBe(count(svg, '</'));
    expect(svg).not.toMatch(/<script|href=/i);
    expect(svg).toContain('Invented &lt;scenario&gt; &amp; test');
  });
  it('has one marker per measured point and one arrow per upper limit', () => {
    expect(count(svg, 'data-role="point"')).toBe(3 + 2);
    expect(count(svg, 'data-role="upper-limit"')).toBe(2);
    expect(count(svg, 'data-role="band"')).toBe(3);
  });
  it('labels both axes with units', () => {
    expect(svg).toContain('E [TeV]');
    expect(svg).toContain('E\u00b2 I [GeV cm\u207b\u00b2 s\u207b\u00b9 sr\u207b\u00b9]');
    const erg = renderSpectrumSvg({ ...data, energyUnit: 'PeV', e2EnergyUnit: 'erg' });
    expect(erg).toContain('E [PeV]');
    expect(erg).toContain('E\u00b2 I [erg cm');
  });
  it('places a point at the log-scale position (d3-scale scaleLog is the mapping; checked by hand here)', () => {
    // Axis range [1e4/1.8, 1e4*10^2.3*1.8] GeV (the data's energies with room) onto [96, 736] px: log position of 1e5 GeV (common practice, no source).
    const lo = 1e4 / 1.8, hi = 1e4 * Math.pow(10, 2.3) * 1.8;
    const expected = 96 + (640 * Math.log(1e5 / lo)) / Math.log(hi / lo);
    const m = /<circle data-role="point" cx="([\d.]+)"/g;
    const xs = [...svg.matchAll(m)].map((r) => Number(r[1]));
    expect(xs.some((x) => Math.abs(x - expected) < 0.01)).toBe(true);
  });
  it('converts intensities to E^2 I', () => {
    const p = pointsFromIntensity('x', 'gamma', { energyGeV: [10, 100], value: [1, 2], errLow: [0.1, 0.2], errHigh: [0.3, 0.4] });
    expect(Array.from(p.e2I)).toEqual([100, 20000]);
    expect(Array.from(p.errHigh)).toEqual([30, 4000]);
  });
  it('rejects mismatched arrays with the key path', () => {
    expect(() => renderSpectrumSvg({ points: [{ ...data.points[0], errLow: [1] }], bands: [] })).toThrow(/points\[0\]\.errLow/);
  });
});
