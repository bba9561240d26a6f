/**
 * Header cards per the FITS Standard 4.0 (Pence et al. 2010, A&A 524, A42):
 * value formats of section 4.2 (strings with '' for a quote and trailing
 * blanks dropped, logical T/F, integers, reals with E or D exponents, complex
 * values), CONTINUE long strings (section 4.2.1.2), HIERARCH (common practice,
 * no source), and the writer's cards read back by the parser (fast-check).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseCard, formatCards } from '../../../src/io/fits/cards.js';
import { readHeader } from '../../../src/io/fits/header.js';
import { headerBytes } from '../../../src/io/fits/writer.js';

const card = (s: string) => parseCard(s.padEnd(80), 0);

describe('parseCard', () => {
  it('reads strings with doubled quotes and drops trailing blanks (section 4.2.1.1)', () => {
    expect(card("OBJECT  = 'O''HARA  '           / a name").value).toBe("O'HARA");
    expect(card("OBJECT  = 'O''HARA  '           / a name").comment).toBe('a name');
    expect(card("EMPTY   = ''").value).toBe('');
    expect(card("LEAD    = '  x'").value).toBe('  x');
  });
  it('reads logical, integer and real values, with D exponents (sections 4.2.2-4.2.4)', () => {
    expect(card('SIMPLE  =                    T').value).toBe(true);
    expect(card('FLAG    =                    F / no').value).toBe(false);
    expect(card('NAXIS2  =        1099511627776').value).toBe(2 ** 40);
    expect(card('NEG     =                  -12').value).toBe(-12);
    expect(card('X       =              1.5D-03').value).toBe(1.5e-3);
    expect(card('Y       =               -2.E+5').value).toBe(-2e5);
    expect(card('Z       =                  .25').value).toBe(0.25);
  });
  it('keeps a complex value as null with a note', () => {
    const c = card('CPLX    =         (1.0, -2.5) / complex');
    expect(c.value).toBeNull();
    expect(c.note).toMatch(/complex/);
  });
  it('treats COMMENT, HISTORY, blank keywords and cards without "= " as commentary', () => {
    expect(card('COMMENT = not a value').value).toBeUndefined();
    expect(card('HISTORY made up').value).toBeUndefined();
    expect(card('NOVALUE  x').value).toBeUndefined();
  });
  it('tolerates HIERARCH keywords', () => {
    const c = card('HIERARCH ESO DET CHIP = 3.5 / long keyword');
    expect(c.keyword).toBe('ESO DET CHIP');
    expect(c.value).toBe(3.5);
  });
  it('rejects unreadable values, unclosed strings and non-ASCII characters', () => {
    expect(() => card('BAD     = what')).toThrow(/cannot read the value/);
    expect(() => card("BAD     = 'open")).toThrow(/closing quote/);
    expect(() => card('BAD     = 1\u00e9')).toThrow(/printable ASCII/);
  });
});

describe('header reading', () => {
  it('joins CONTINUE long strings (section 4.2.1.2)', () => {
    const long = 'abc'.repeat(60) + "it's";
    const bytes = headerBytes([['SIMPLE', true], ['LONG', long, 'a long one'], ['AFTER', 1]]);
    const h = readHeader(bytes, 0, 'mem.fits');
    expect(h.get('LONG')).toBe(long);
    expect(h.get('AFTER')).toBe(1);
    expect(bytes.length % 2880).toBe(0);
  });
  it('reports a missing END card with file and byte offset', () => {
    const bytes = headerBytes([['SIMPLE', true], ['BITPIX', 8], ['NAXIS', 0]]);
    const noEnd = bytes.slice();
    for (let i = 0; i < noEnd.length - 2; i++) if (noEnd[i] === 69 && noEnd[i + 1] === 78 && noEnd[i + 2] === 68) noEnd.fill(32, i, i + 3);
    expect(() => readHeader(noEnd, 0, 'x.fits')).toThrow(/x\.fits, byte 2880: header starting at byte 0 has no END card/);
  });
  it('writer cards parse back to the same values (property, seeded)', () => {
    const value = fc.oneof(
      fc.boolean(),
      fc.integer({ min: -(2 ** 40), max: 2 ** 40 }),
      fc.double({ noNaN: true, noDefaultInfinity: true }).filter((x) => !Object.is(x, -0)),
      fc.string({ unit: fc.constantFrom(...' abcXYZ09\'&/=-_.'.split('')), maxLength: 150 }).map((s) => s.replace(/ +$/, '')),
    );
    fc.assert(fc.property(value, (v) => {
      const lines = formatCards('KEY', v, 'c');
      lines.forEach((l) => expect(l).toHaveLength(80));
      const h = readHeader(headerBytes([['KEY', v, 'c']]), 0, 'm');
      expect(h.get('KEY')).toBe(v);
    }), { seed: 20261202, numRuns: 400 });
  });
});
