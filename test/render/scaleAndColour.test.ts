import { describe, expect, it } from 'vitest';
import { interpolateCividis, interpolateMagma } from 'd3-scale-chromatic';
import { colourLut, lutIndex, parseCssColour } from '../../src/render/colourMap.js';
import { formatTick, normalise, resolveScale, scaleTicks } from '../../src/render/valueScale.js';
import { measureText } from '../../src/render/strokeFont.js';
import { createLayer } from '../../src/render/raster.js';
import { layerText } from '../../src/render/strokeFont.js';
import { BLANK } from '../../src/maps/skyMap.js';

describe('colour tables (d3-scale-chromatic is the reference)', () => {
  it('magma entries equal the interpolator inside each 1/256 bin; cividis to within one step', () => {
    const m = colourLut('magma'), c = colourLut('cividis');
    for (let k = 0; k < 256; k++) {
      const t = (k + 0.3) / 256;
      expect(lutIndex(t)).toBe(k);
      const e = parseCssColour(interpolateMagma(t));
      expect((m.rgb[3 * k] << 16) | (m.rgb[3 * k + 1] << 8) | m.rgb[3 * k + 2]).toBe(e);
      const ec = parseCssColour(interpolateCividis(t));
      expect(Math.abs(c.rgb[3 * k] - (ec >> 16))).toBeLessThanOrEqual(2);
    }
    expect(lutIndex(1)).toBe(255);
    expect(lutIndex(-0.1)).toBe(0);
    expect(() => colourLut('rainbow')).toThrow(/unknown/);
  });
});

describe('value scales', () => {
  const plane = Float64Array.from([0, -1, 1e-3, 1, 10, BLANK, NaN]);
  it('log: default range from positive values, non-positive values at the bottom', () => {
    const s = resolveScale(plane, 'log');
    expect(s.min).toBe(1e-3);
    expect(s.max).toBe(10);
    expect(normalise(s, 0)).toBe(0);
    expect(normalise(s, -1)).toBe(0);
    // log10(1 / 1e-3) / log10(10 / 1e-3) = 3/4 (common practice, no source)
    expect(normalise(s, 1)).toBeCloseTo(0.75, 12);
    expect(scaleTicks(s)).toEqual([1e-3, 1e-2, 1e-1, 1, 10]);
  });
  it('asinh: Lupton et al. 1999 stretch, linear near zero', () => {
    const s = resolveScale(plane, 'asinh', { softening: 0.5 });
    const t = (v: number) => (Math.asinh(v / 0.5) - Math.asinh(-2)) / (Math.asinh(20) - Math.asinh(-2));
    expect(normalise(s, 1)).toBeCloseTo(t(1), 12);
    expect(scaleTicks(s)).toContain(0);
  });
  it('linear ticks are round and inside the range; labels use superscript markup', () => {
    const s = resolveScale(plane, 'linear');
    expect(scaleTicks(s)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(formatTick(1e-7)).toBe('10^-7');
    expect(formatTick(2.5e-8)).toBe('2.5×10^-8');
    expect(formatTick(0.25)).toBe('0.25');
  });
  it('refuses a map without finite values, and an empty range', () => {
    expect(() => resolveScale(Float64Array.from([BLANK, NaN]), 'linear')).toThrow(/--min and --max/);
    expect(() => resolveScale(plane, 'linear', { min: 5, max: 1 })).toThrow(/empty/);
    expect(() => resolveScale(plane, 'log', { min: -1 })).toThrow(/positive/);
  });
});

describe('stroke font', () => {
  it('measures text proportionally to size and inks pixels inside its box only', () => {
    expect(measureText('10^-7 GeV', 24)).toBeCloseTo(2 * measureText('10^-7 GeV', 12), 9);
    const layer = createLayer(200, 40);
    layerText(layer, 'Ab 12°', 10, 30, 16);
    let inked = 0, outside = 0;
    const w = measureText('Ab 12°', 16);
    for (let j = 0; j < 40; j++) for (let i = 0; i < 200; i++) {
      if (layer.cov[j * 200 + i] > 0) { inked++; if (i < 8 || i > 10 + w + 2 || j < 12) outside++; }
    }
    expect(inked).toBeGreaterThan(50);
    expect(outside).toBe(0);
  });
});
