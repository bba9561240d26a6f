/**
 * CSV reading (RFC 4180 quoting, Shafranovich 2005; '#' comments and 1-based
 * row numbers are skyspan's own rules) and SHA-256 of files (FIPS 180-4
 * test vector "abc", from memory, cross-checked with /usr/bin/sha256sum when present).
 */
import { describe, expect, it } from 'vitest';
import { existsSync, writeFileSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import { parseCsv, readCsv } from '../../src/io/csv.js';
import { sha256File } from '../../src/io/hash.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-csv-');

describe('parseCsv', () => {
  it('reads header, rows, quoted fields and file line numbers', () => {
    const t = parseCsv('# a comment\nname, l_deg ,b_deg\n"src, one",10,-1\n\n# between\nB,"2""x","multi\nline"\r\nC , 3 ,4\n', 'c.csv');
    expect(t.header).toEqual(['name', 'l_deg', 'b_deg']);
    expect(t.rows).toEqual([['src, one', '10', '-1'], ['B', '2"x', 'multi\nline'], ['C', '3', '4']]);
    expect(t.rowNumbers).toEqual([3, 6, 8]);
  });
  it('names the line of a row with the wrong field count, and an unclosed quote', () => {
    expect(() => parseCsv('a,b\n1,2\n3\n', 'c.csv')).toThrow(/c\.csv, line 3: has 1 fields, the header has 2/);
    expect(() => parseCsv('a,b\n"1,2\n', 'c.csv')).toThrow(/c\.csv, line 2: a quoted field has no closing quote/);
    expect(() => parseCsv('# only\n', 'c.csv')).toThrow(/has no header line/);
  });
  it('reads a file, dropping a byte-order mark', () => {
    const p = join(dir, 'x.csv');
    writeFileSync(p, '\ufeffx,y\n1,2\n');
    expect(readCsv(p).header).toEqual(['x', 'y']);
    expect(() => readCsv(join(dir, 'missing.csv'))).toThrow(/missing\.csv: cannot read the file \(ENOENT\)/);
  });
});

describe('sha256File', () => {
  it('matches the FIPS 180-4 "abc" vector and sha256sum', () => {
    const p = join(dir, 'abc.txt');
    writeFileSync(p, 'abc');
    expect(sha256File(p)).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    const big = join(dir, 'big.bin');
    writeFileSync(big, Buffer.alloc(3 * 1024 * 1024 + 17, 7));
    if (existsSync('/usr/bin/sha256sum')) {
      expect(sha256File(big)).toBe(execFileSync('/usr/bin/sha256sum', [big], { encoding: 'utf8' }).split(' ')[0]);
    }
  });
});
