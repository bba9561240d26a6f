/**
 * The one CSV writer: RFC 4180 quoting (Shafranovich 2005, section 2 rules 5-7:
 * fields with commas, quotes or line breaks in double quotes, a quote doubled),
 * comment lines above the header, and a round trip through skyspan's reader.
 */
import { describe, expect, it } from 'vitest';
import { csvField, formatCsv } from '../../src/io/csvWrite.js';
import { parseCsv } from '../../src/io/csv.js';

describe('CSV writer', () => {
  it('quotes only the fields that need it (RFC 4180 section 2)', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a, b')).toBe('"a, b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField('cr\rhere')).toBe('"cr\rhere"');
    expect(csvField(null)).toBe('');
    expect(csvField(undefined)).toBe('');
    expect(csvField(0.1 + 0.2)).toBe('0.30000000000000004'); // full double precision by default
    expect(csvField(1 / 3, (x) => x.toPrecision(3))).toBe('0.333');
  });
  it('writes comments, header and rows that read back unchanged', () => {
    const rows = [['odd_name, "x" & 100%', 1.5e-19, null], ['multi\nline', -0, 'ok']];
    const text = formatCsv(['name', 'valueGeV', 'note'], rows, { comments: ['made up\nfor the test'] });
    expect(text.startsWith('# made up for the test\nname,valueGeV,note\n')).toBe(true);
    expect(text.endsWith('\n')).toBe(true);
    const back = parseCsv(text, 't.csv');
    expect(back.header).toEqual(['name', 'valueGeV', 'note']);
    expect(back.headerLine).toBe(2);
    expect(back.rows).toEqual([['odd_name, "x" & 100%', '1.5e-19', ''], ['multi\nline', '0', 'ok']]);
    expect(back.rowNumbers).toEqual([3, 4]); // the line where each row starts
  });
});
