/**
 * Binary-table column formats: TFORMn = rTa (Pence et al. 2010, A&A 524, A42,
 * section 7.3.1, table 18). skyspan decodes L, B, I, J, K, E and D (and A as
 * text); X, C, M, P and Q are recognised, listed and skipped with a note.
 */
import type { ElementType } from './decode.js';

/** A parsed TFORM. */
export interface ColumnFormat {
  readonly repeat: number;
  readonly code: string;
  /** Bytes the field takes in each row. */
  readonly width: number;
  /** Element type when the column can be decoded as numbers; null otherwise. */
  readonly element: ElementType | null;
  /** Why the column is not decoded as numbers, when element is null. */
  readonly skipNote?: string;
}

const NUMERIC: Record<string, { bytes: number; element: ElementType }> = {
  L: { bytes: 1, element: 'uint8' },
  B: { bytes: 1, element: 'uint8' },
  I: { bytes: 2, element: 'int16' },
  J: { bytes: 4, element: 'int32' },
  K: { bytes: 8, element: 'int64' },
  E: { bytes: 4, element: 'float32' },
  D: { bytes: 8, element: 'float64' },
};

/**
 * Parses a TFORM value; returns null for a format the standard does not
 * define (the caller reports it with the keyword and file).
 */
export function parseTform(tform: string): ColumnFormat | null {
  const m = /^\s*(\d*)\s*([LXBIJKAEDCMPQ])(.*)$/.exec(tform.toUpperCase());
  if (!m) return null;
  const repeat = m[1] === '' ? 1 : Number(m[1]);
  if (!Number.isSafeInteger(repeat)) return null;
  const code = m[2];
  const rest = m[3].trim();
  const numeric = NUMERIC[code];
  if (numeric) {
    if (rest !== '' ) return null;
    return { repeat, code, width: repeat * numeric.bytes, element: numeric.element };
  }
  switch (code) {
    case 'A': return { repeat, code, width: repeat, element: null, skipNote: 'character column' };
    case 'X': if (rest !== '') return null; return { repeat, code, width: Math.ceil(repeat / 8), element: null, skipNote: 'bit column skipped' };
    case 'C': if (rest !== '') return null; return { repeat, code, width: 8 * repeat, element: null, skipNote: 'complex column skipped' };
    case 'M': if (rest !== '') return null; return { repeat, code, width: 16 * repeat, element: null, skipNote: 'complex column skipped' };
    case 'P': return { repeat, code, width: 8 * repeat, element: null, skipNote: 'variable-length column skipped' };
    case 'Q': return { repeat, code, width: 16 * repeat, element: null, skipNote: 'variable-length column skipped' };
  }
  return null;
}
