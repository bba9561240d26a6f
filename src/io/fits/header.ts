/**
 * A FITS header: the cards of one HDU read from 2880-byte blocks up to the END
 * card (Pence et al. 2010, A&A 524, A42, sections 3.3 and 4), with long
 * strings joined across CONTINUE cards and typed look-ups that throw
 * InputError naming the file and keyword.
 */
import { InputError } from '../../core/errors.js';
import { CardSyntaxError, parseCard, type Card, type CardValue } from './cards.js';

/** Size of a FITS logical record in bytes. */
export const BLOCK = 2880;
/** Size of one header card in bytes. */
export const CARD = 80;

/** The parsed header of one HDU. */
export class FitsHeader {
  readonly cards: Card[];
  readonly notes: string[];
  /** Byte offset of the first card and of the first byte after the header's last block. */
  readonly start: number;
  readonly end: number;
  readonly file: string;
  private readonly index = new Map<string, Card>();

  constructor(cards: Card[], start: number, end: number, file: string, notes: string[]) {
    this.cards = cards;
    this.start = start;
    this.end = end;
    this.file = file;
    this.notes = notes;
    for (const c of cards) {
      if (c.value !== undefined && !this.index.has(c.keyword)) this.index.set(c.keyword, c);
    }
  }

  /** True when the keyword has a value card. */
  has(keyword: string): boolean {
    return this.index.has(keyword);
  }

  /** The raw value, or undefined when absent. */
  get(keyword: string): CardValue | undefined {
    return this.index.get(keyword)?.value;
  }

  /** Byte offset of a keyword's card (for error messages), or the header start. */
  offsetOf(keyword: string): number {
    return this.index.get(keyword)?.byteOffset ?? this.start;
  }

  private fail(keyword: string, problem: string, hint?: string): never {
    throw new InputError(problem, { file: this.file, keyword, byteOffset: this.offsetOf(keyword) }, hint);
  }

  /** A string value (trimmed), or `fallback` when absent; a non-string is an error. */
  string(keyword: string, fallback?: string): string | undefined {
    const v = this.get(keyword);
    if (v === undefined || v === null) return fallback;
    if (typeof v !== 'string') this.fail(keyword, `expected a string value, found ${String(v)}`);
    return v.trim();
  }

  /** A numeric value, or `fallback` when absent. */
  number(keyword: string, fallback?: number): number | undefined {
    const v = this.get(keyword);
    if (v === undefined || v === null) return fallback;
    if (typeof v !== 'number') this.fail(keyword, `expected a number, found ${JSON.stringify(v)}`);
    return v;
  }

  /** A required integer within [min, max]. */
  int(keyword: string, min: number, max: number): number {
    const v = this.get(keyword);
    if (v === undefined || v === null) this.fail(keyword, 'required keyword is missing');
    if (typeof v !== 'number' || !Number.isInteger(v)) this.fail(keyword, `expected an integer, found ${JSON.stringify(v)}`);
    if (!(v >= min && v <= max)) this.fail(keyword, `value ${v} is outside ${min}..${max}`);
    return v;
  }

  /** An optional integer within [min, max], else `fallback`. */
  optInt(keyword: string, min: number, max: number, fallback: number): number {
    return this.has(keyword) && this.get(keyword) !== null ? this.int(keyword, min, max) : fallback;
  }
}

/** Joins string values continued over CONTINUE cards (FITS 4.0, section 4.2.1.2). */
function joinContinued(cards: Card[]): Card[] {
  const out: Card[] = [];
  for (let i = 0; i < cards.length; i++) {
    const c = cards[i];
    if (typeof c.value === 'string' && c.continues && c.keyword !== 'CONTINUE') {
      let text = c.value;
      let j = i + 1;
      while (text.endsWith('&') && j < cards.length && cards[j].keyword === 'CONTINUE' && typeof cards[j].value === 'string') {
        text = text.slice(0, -1) + (cards[j].value as string);
        j++;
      }
      out.push({ ...c, value: text });
      i = j - 1;
    } else if (c.keyword !== 'CONTINUE') {
      out.push(c);
    }
  }
  return out;
}

/**
 * Reads the header starting at `start` (a multiple of 2880) of `bytes`.
 * Throws InputError when the END card is missing before the end of the data
 * or a card cannot be parsed.
 */
export function readHeader(bytes: Uint8Array, start: number, file: string): FitsHeader {
  const cards: Card[] = [];
  const notes: string[] = [];
  let pos = start;
  for (;;) {
    if (pos + CARD > bytes.length) {
      throw new InputError(`header starting at byte ${start} has no END card before the end of the file`,
        { file, byteOffset: pos }, 'the file is truncated or not FITS');
    }
    const text = latin1(bytes, pos, CARD);
    let card: Card;
    try {
      card = parseCard(text, pos);
    } catch (e) {
      if (e instanceof CardSyntaxError) {
        if (/[^\x20-\x7e]/.test(text)) {
          throw new InputError(`header starting at byte ${start} has no END card before non-text bytes at byte ${pos}`,
            { file, byteOffset: pos }, 'the header is damaged or its END card is missing');
        }
        throw new InputError(`bad header card: ${e.message}`, { file, byteOffset: pos, keyword: text.slice(0, 8).trim() || undefined });
      }
      throw e;
    }
    pos += CARD;
    if (card.keyword === 'END') break;
    if (card.note) notes.push(`${card.keyword}: ${card.note}`);
    cards.push(card);
  }
  const end = Math.ceil((pos - start) / BLOCK) * BLOCK + start;
  return new FitsHeader(joinContinued(cards), start, end, file, notes);
}

/** Decodes `length` bytes as latin1 text without allocating a Buffer copy of the whole file. */
export function latin1(bytes: Uint8Array, offset: number, length: number): string {
  return String.fromCharCode.apply(null, bytes.subarray(offset, offset + length) as unknown as number[]);
}
