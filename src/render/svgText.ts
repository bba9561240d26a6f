/** Small helpers for hand-written SVG and HTML: escaping and number formatting. */

/** Escapes text for XML/HTML element content and attribute values. */
export function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

const SUP: Record<string, string> = { '-': '\u207b', '+': '\u207a', '0': '\u2070', '1': '\u00b9', '2': '\u00b2', '3': '\u00b3', '4': '\u2074', '5': '\u2075', '6': '\u2076', '7': '\u2077', '8': '\u2078', '9': '\u2079' };

/** Integer as Unicode superscript digits, e.g. -7 -> '⁻⁷'. */
export function superscript(n: number): string {
  return String(n).split('').map((c) => SUP[c] ?? c).join('');
}

/** Coordinate with at most 2 decimals, for compact SVG. */
export function fmt(x: number): string {
  return String(Math.round(x * 100) / 100);
}
