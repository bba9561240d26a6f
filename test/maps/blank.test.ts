/**
 * Blank detection (src/maps/blank.ts) and plane statistics (src/maps/stats.ts).
 * The sentinel -1.6375e30 is healpy's UNSEEN (healpy.UNSEEN, printed by scripts/healpy_reference.py
 * "spot" and checked in test/sphere/healpixGeometry.test.ts);
 * the float32 tolerance and NaN handling are common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { isBlank, countBlanks } from '../../src/maps/blank.js';
import { finishStats, newStatsState, planeStats, statsBlock } from '../../src/maps/stats.js';
import { BLANK } from '../../src/maps/skyMap.js';

describe('isBlank / countBlanks', () => {
  it('recognises the sentinel in float64 and float32, and NaN', () => {
    expect(isBlank(BLANK)).toBe(true);
    expect(isBlank(new Float32Array([BLANK])[0])).toBe(true);
    expect(isBlank(NaN)).toBe(true);
    expect(isBlank(-1.6375e30 * (1 + 2e-5))).toBe(false);
    expect(isBlank(0)).toBe(false);
    expect(isBlank(-Infinity)).toBe(false);
    expect(isBlank(1.6375e30)).toBe(false);
  });
  it('counts blanks in a plane', () => {
    expect(countBlanks(new Float32Array([1, BLANK, NaN, 0, -1.6375e30]))).toBe(3);
    expect(countBlanks(new Float64Array(5))).toBe(0);
  });
});

describe('planeStats', () => {
  it('excludes and counts blanks', () => {
    const s = planeStats(new Float64Array([1, 2, NaN, BLANK, 6]));
    expect(s).toEqual({ min: 1, max: 6, mean: 3, validCount: 3, blankCount: 2, nonZeroCount: 3 });
  });
  it('counts the valid non-zero values (a mask\'s covered pixels), in one call or in pieces', () => {
    const p = new Float64Array([0, 0.5, BLANK, 0, 1, NaN, -0, 2]);
    expect(planeStats(p).nonZeroCount).toBe(3);
    const st = newStatsState();
    statsBlock(p, 0, 3, st); statsBlock(p, 3, p.length, st);
    expect(finishStats(st)).toEqual(planeStats(p));
  });
  it('gives NaN statistics for an all-blank plane', () => {
    const s = planeStats(new Float32Array([BLANK, NaN]));
    expect(s.validCount).toBe(0);
    expect(s.blankCount).toBe(2);
    expect(Number.isNaN(s.mean) && Number.isNaN(s.min) && Number.isNaN(s.max)).toBe(true);
  });
  it('keeps the mean exact where a naive sum loses it (compensated sum, Neumaier 1974)', () => {
    const p = new Float64Array(1001);
    p[0] = 1e16;
    for (let i = 1; i < p.length; i++) p[i] = 1;
    // Exact mean: (1e16 + 1000) / 1001; a naive left-to-right sum would lose every 1.
    expect(planeStats(p).mean).toBe((1e16 + 1000) / 1001);
  });
});
