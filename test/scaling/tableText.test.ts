/**
 * Table text and sparse region weights: CSV quoting (RFC 4180), LaTeX escaping
 * and booktabs rules, validation of pixel weights. Common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { computeFactorsWith } from '../../src/scaling/ensembleFactors.js';
import { buildProvenance } from '../../src/scaling/provenance.js';
import { renderFactorTables } from '../../src/scaling/tableText.js';
import { toRegionPixels } from '../../src/scaling/regionPixels.js';
import { analyticTemplate, fixedEvaluator, weightsFromPredicate, wholeSky } from './fixtures.js';

const box = weightsFromPredicate(8, 'a', (th, ph) => Math.abs(Math.PI / 2 - th) < 0.3 && ph < 1);
const result = computeFactorsWith({ templates: [{ name: 'odd_name, "x" & 100%', map: analyticTemplate(8) }],
  measured: 'a', targets: ['sky'], mode: 'centre' }, fixedEvaluator([box, wholeSky(8)]));
const prov = buildProvenance(result, { inputs: [{ role: 'template', path: 'x.fits', sha256: 'ab'.repeat(32) }],
  regionSpec: { regions: {} }, date: new Date('2026-01-02T03:04:05Z') });

describe('factor table text', () => {
  it('CSV quotes fields with commas and quotes, and starts with the provenance comment', () => {
    const [rows] = renderFactorTables(result, prov, 'csv');
    expect(rows.text.startsWith('# made by skyspan 0.1.0 on 2026-01-02T03:04:05.000Z\n')).toBe(true);
    expect(rows.text).toContain('"odd_name, ""x"" & 100%",1,,sky,');
    expect(rows.text).toContain(`# input (template): x.fits sha256 ${'ab'.repeat(32)}`);
  });
  it('LaTeX escapes special characters and uses booktabs rules', () => {
    const [t] = renderFactorTables(result, prov, 'tex');
    expect(t.text).toContain('odd\\_name, "x" \\& 100\\%');
    expect(t.text).not.toMatch(/\\hline/);
    expect(t.text.match(/\\toprule/g)).toHaveLength(2);
  });
  it('JSON round-trips the rows at full precision with the provenance', () => {
    const [j] = renderFactorTables(result, prov, 'json');
    const o = JSON.parse(j.text);
    expect(o.rows[0].kI).toBe(result.rows[0].kI);
    expect(o.provenance.assumption).toMatch(/assumed to look like each template/);
  });
});

describe('sparse region weights', () => {
  it('rejects fractions outside 0..1 and negative exposure', () => {
    const bad = { ...box, fraction: box.fraction.slice() };
    bad.fraction[3] = 1.5;
    expect(() => toRegionPixels(bad)).toThrow(/covered fraction 1.5 at RING pixel 3/);
    bad.fraction[3] = NaN;
    expect(() => toRegionPixels(bad)).toThrow(/covered fraction NaN/);
    const e = { ...box, exposure: new Float32Array(box.fraction.length).fill(-1) };
    expect(() => toRegionPixels(e)).toThrow(/exposure -1/);
    expect(toRegionPixels(e, false).exposure).toBeNull();
  });
  it('lists covered pixels in increasing RING order and flags the whole sky', () => {
    const r = toRegionPixels(box);
    expect(r.full).toBe(false);
    for (let k = 1; k < r.index.length; k++) expect(r.index[k]).toBeGreaterThan(r.index[k - 1]);
    expect(toRegionPixels(wholeSky(8)).full).toBe(true);
  });
});
