/**
 * FITS header cards: parsing one 80-character card into keyword, value and
 * comment, following the FITS Standard 4.0 (Pence et al. 2010, A&A 524, A42,
 * section 4: keyword records, value formats in 4.2, CONTINUE long strings in
 * 4.2.1.2 and appendix of the 4.0 text). HIERARCH cards (a widely used
 * convention, not part of the standard) are tolerated.
 */

/** A parsed header value; complex values are kept as null with a note. */
export type CardValue = string | number | boolean | null;

/** One keyword record. `value` is undefined for commentary cards. */
export interface Card {
  readonly keyword: string;
  readonly value: CardValue | undefined;
  readonly comment: string;
  /** Byte offset of the card in the file (or decompressed stream). */
  readonly byteOffset: number;
  /** Why the value could not be used, e.g. a complex number. */
  readonly note?: string;
  /** For strings: true when the text ends with '&' (a CONTINUE may follow). */
  readonly continues?: boolean;
}

/** Keywords whose cards carry no value indicator (commentary). */
const COMMENTARY = new Set(['COMMENT', 'HISTORY', '', 'END']);

const INT_RE = /^[+-]?\d+$/;
const FLOAT_RE = /^[+-]?(\d+\.?\d*|\.\d+)([EeDd][+-]?\d+)?$/;
const COMPLEX_RE = /^\(\s*[^,()]+\s*,\s*[^,()]+\s*\)$/;

/** Thrown by the card parser; header.ts turns it into an InputError with the location. */
export class CardSyntaxError extends Error {}

/**
 * Parses the value field (everything after `= `) into value and comment.
 * Strings: single-quoted, `''` stands for one quote, trailing blanks dropped
 * (Pence et al. 2010, section 4.2.1). Numbers: integers, and reals with E or D
 * exponents (section 4.2.4). Logical: T or F (section 4.2.2).
 */
export function parseValueField(field: string): { value: CardValue; comment: string; note?: string; continues?: boolean } {
  let i = 0;
  const n = field.length;
  while (i < n && field.charCodeAt(i) === 32) i++;
  if (i >= n) return { value: null, comment: '' };
  if (field[i] === '/') return { value: null, comment: field.slice(i + 1).trim() };
  if (field[i] === "'") {
    let text = '';
    let j = i + 1;
    for (;;) {
      if (j >= n) throw new CardSyntaxError('string value has no closing quote');
      const c = field[j];
      if (c === "'") {
        if (field[j + 1] === "'") { text += "'"; j += 2; continue; }
        j++;
        break;
      }
      text += c;
      j++;
    }
    const rest = field.slice(j);
    const slash = rest.indexOf('/');
    if (slash < 0 && rest.trim() !== '') throw new CardSyntaxError(`unexpected text after a string value: "${rest.trim()}"`);
    const comment = slash < 0 ? '' : rest.slice(slash + 1).trim();
    const trimmed = text.replace(/ +$/, '');
    return { value: trimmed, comment, continues: trimmed.endsWith('&') };
  }
  const slash = field.indexOf('/', i);
  const raw = (slash < 0 ? field.slice(i) : field.slice(i, slash)).trim();
  const comment = slash < 0 ? '' : field.slice(slash + 1).trim();
  if (raw === 'T') return { value: true, comment };
  if (raw === 'F') return { value: false, comment };
  if (INT_RE.test(raw)) return { value: Number(raw), comment };
  if (FLOAT_RE.test(raw)) return { value: Number(raw.replace(/[Dd]/, 'E')), comment };
  if (COMPLEX_RE.test(raw)) return { value: null, comment, note: 'complex value ignored' };
  throw new CardSyntaxError(`cannot read the value "${raw}"`);
}

/**
 * Parses one 80-character card (given as a latin1 string). Keywords are
 * columns 1-8; a value follows when columns 9-10 hold `= `. HIERARCH cards
 * (`HIERARCH A B C = value`) give the keyword `A B C`.
 */
export function parseCard(text: string, byteOffset: number): Card {
  for (let k = 0; k < text.length; k++) {
    const c = text.charCodeAt(k);
    if (c < 32 || c > 126) throw new CardSyntaxError(`character code ${c} is not printable ASCII (column ${k + 1})`);
  }
  const keyword = text.slice(0, 8).trimEnd();
  if (keyword === 'HIERARCH') {
    const eq = text.indexOf('=', 8);
    if (eq < 0) return { keyword, value: undefined, comment: text.slice(8).trim(), byteOffset };
    const parsed = parseValueField(text.slice(eq + 1));
    return { keyword: text.slice(8, eq).trim().toUpperCase(), byteOffset, ...parsed };
  }
  if (!/^[A-Z0-9_-]*$/.test(keyword) || (keyword.length > 0 && text.slice(0, 8).trimEnd().includes(' '))) {
    throw new CardSyntaxError(`keyword "${keyword}" has characters other than A-Z, 0-9, _ and -`);
  }
  if (keyword === 'CONTINUE') {
    const parsed = parseValueField(text.slice(8));
    return { keyword, byteOffset, ...parsed };
  }
  if (COMMENTARY.has(keyword) || text.slice(8, 10) !== '= ') {
    return { keyword, value: undefined, comment: text.slice(8).trimEnd(), byteOffset };
  }
  const parsed = parseValueField(text.slice(10));
  return { keyword, byteOffset, ...parsed };
}

/** Formats a value for the value field of a card (right-justified numbers, quoted strings). */
export function formatValue(value: string | number | boolean): string {
  if (typeof value === 'boolean') return (value ? 'T' : 'F').padStart(20);
  if (typeof value === 'number') {
    if (Number.isInteger(value) && Math.abs(value) < 1e18) return String(value).padStart(20);
    if (!Number.isFinite(value)) throw new RangeError(`cannot write ${value} in a FITS header`);
    let s = value.toExponential(15).toUpperCase();
    if (Number(s) !== value) s = value.toExponential(16).toUpperCase();
    return s.padStart(20);
  }
  const quoted = `'${value.replace(/'/g, "''").padEnd(8)}'`;
  return quoted.padEnd(20);
}

/**
 * Formats a header card (or several, for strings too long for one card: the
 * CONTINUE convention of the FITS Standard 4.0, section 4.2.1.2). Every line
 * is exactly 80 ASCII characters.
 */
export function formatCards(keyword: string, value: string | number | boolean | undefined, comment = ''): string[] {
  if (!/^[A-Z0-9_-]{1,8}$/.test(keyword)) throw new RangeError(`"${keyword}" is not a FITS keyword (1-8 of A-Z 0-9 _ -)`);
  const clean = (s: string): string => s.replace(/[^\x20-\x7e]/g, '?');
  if (value === undefined) return [(keyword.padEnd(8) + clean(comment)).slice(0, 80).padEnd(80)];
  if (typeof value === 'string') {
    const v = clean(value);
    const first = `${keyword.padEnd(8)}= ${formatValue(v)}`;
    const withComment = comment ? `${first} / ${clean(comment)}` : first;
    if (first.length <= 80) return [withComment.slice(0, 80).padEnd(80)];
    // Long string: split into pieces that fit, each but the last ending in '&'.
    const cards: string[] = [];
    let rest = v;
    let head = `${keyword.padEnd(8)}= `;
    while (rest.length > 0) {
      const room = 80 - head.length - 3; // quotes and '&'
      let take = Math.min(rest.length, room);
      let piece = rest.slice(0, take);
      while (piece.replace(/'/g, "''").length > room) { take--; piece = rest.slice(0, take); }
      rest = rest.slice(take);
      const body = piece.replace(/'/g, "''") + (rest.length > 0 ? '&' : '');
      cards.push(`${head}'${body}'`.padEnd(80));
      head = 'CONTINUE  ';
    }
    return cards;
  }
  const line = `${keyword.padEnd(8)}= ${formatValue(value)}` + (comment ? ` / ${clean(comment)}` : '');
  return [line.slice(0, 80).padEnd(80)];
}
