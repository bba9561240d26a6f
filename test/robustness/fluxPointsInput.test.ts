/**
 * Untrusted flux-point files: seeded random damage to an ECSV text and to a
 * FITS table gives either points or an InputError with a one-line message,
 * never another exception (project rule; common practice, no source).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import { formatFluxPointsEcsv, parseFluxPointsEcsv } from '../../src/physics/fluxPoints/ecsv.js';
import { fitsFluxTable, formatFluxPointsFits } from '../../src/physics/fluxPoints/fits.js';
import { pointsFromTable } from '../../src/physics/fluxPoints/table.js';
import type { SpectrumPoints } from '../../src/physics/points.js';

// invented points
const P: SpectrumPoints = {
  energyGeV: Float64Array.of(1e3, 1e4, 1e5), value: Float64Array.of(1e-12, 2e-15, 5e-18), errLow: Float64Array.of(1e-13, 3e-16, 0),
  errHigh: Float64Array.of(1.2e-13, 4e-16, 0), upperLimit: Uint8Array.of(0, 0, 1), ulConfidence: 0.95,
};

function onlyInputErrors(run: () => unknown): void {
  try { run(); } catch (e) {
    if (!(e instanceof InputError)) throw e;
    expect(e.message).not.toMatch(/\n/);
  }
}

describe('damaged flux-point files', () => {
  it('ECSV: replaced, deleted or inserted characters', () => {
    const text = formatFluxPointsEcsv(P);
    fc.assert(fc.property(fc.array(fc.tuple(fc.nat(text.length - 1), fc.constantFrom('', ' ', '"', ':', '#', '\n', 'x', '-', '{', '9')), { minLength: 1, maxLength: 4 }), (edits) => {
      let t = text;
      for (const [i, c] of edits) t = t.slice(0, i) + c + t.slice(i + 1);
      onlyInputErrors(() => parseFluxPointsEcsv(t, 'damaged.ecsv'));
    }), { seed: 21, numRuns: 400 });
  });

  it('FITS: replaced bytes and truncation', () => {
    const bytes = formatFluxPointsFits(P);
    fc.assert(fc.property(fc.array(fc.tuple(fc.nat(bytes.length - 1), fc.integer({ min: 0, max: 255 })), { minLength: 1, maxLength: 6 }), fc.nat(bytes.length),
      (edits, cut) => {
        const b = bytes.slice(0, Math.max(cut, 2880));
        for (const [i, v] of edits) if (i < b.length) b[i] = v;
        onlyInputErrors(() => pointsFromTable(fitsFluxTable(b, 'damaged.fits')));
      }), { seed: 22, numRuns: 1500 });
  });
});
