/** Test helpers: building small HEALPix FITS files in memory and editing their header cards. */
import { readFileSync, writeFileSync } from 'node:fs';
import { BLANK, type SkyMap } from '../../src/maps/skyMap.js';

/** Byte offset of the card whose keyword is `keyword` in the HDU header starting at or after `from`, or -1. */
export function findCard(bytes: Uint8Array, keyword: string, from = 0): number {
  const key = keyword.padEnd(8);
  for (let p = from; p + 80 <= bytes.length; p += 80) {
    let ok = true;
    for (let k = 0; k < 8; k++) if (bytes[p + k] !== key.charCodeAt(k)) { ok = false; break; }
    if (ok) return p;
  }
  return -1;
}

/** Replaces the value field of a card (keeps 80 columns); returns a copy. */
export function setCard(bytes: Uint8Array, keyword: string, value: string, from = 0): Uint8Array {
  const out = bytes.slice();
  const p = findCard(out, keyword, from);
  if (p < 0) throw new Error(`no ${keyword} card`);
  const text = `${keyword.padEnd(8)}= ${value.padStart(20)}`.padEnd(80).slice(0, 80);
  for (let k = 0; k < 80; k++) out[p + k] = text.charCodeAt(k);
  return out;
}

/** Blanks the END card (or all of them). */
export function removeEnd(bytes: Uint8Array): Uint8Array {
  const out = bytes.slice();
  for (let p = 0; p + 80 <= out.length; p += 80) {
    if (out[p] === 69 && out[p + 1] === 78 && out[p + 2] === 68 && out[p + 3] === 32) out.fill(32, p, p + 80);
  }
  return out;
}

/** A made-up smooth map for tests. */
export function testMap(nside: number, opts: Partial<SkyMap> & { f64?: boolean; blankEvery?: number; k?: number } = {}): SkyMap {
  const n = 12 * nside * nside;
  const a = opts.f64 ? new Float64Array(n) : new Float32Array(n);
  for (let i = 0; i < n; i++) a[i] = opts.blankEvery && i % opts.blankEvery === 0 ? BLANK : Math.sin(0.3 * i + (opts.k ?? 0)) + 2;
  return {
    nside, ordering: opts.ordering ?? 'RING', frame: opts.frame ?? 'galactic', column: opts.column ?? 'I',
    unit: opts.unit ?? 'cm^-2 s^-1 sr^-1', planes: opts.planes ?? [a], energiesGeV: opts.energiesGeV ?? null,
  };
}

export const read = (p: string): Uint8Array => new Uint8Array(readFileSync(p));
export const write = (p: string, b: Uint8Array): void => writeFileSync(p, b);
