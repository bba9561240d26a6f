/**
 * Text for PNG pictures: skyspan's own stroke font (strokeGlyphs.ts) rendered
 * with anti-aliased round-capped strokes into a coverage layer. A '^' starts a
 * superscript run (signs, digits and '.'; or '{...}'), as in 'cm^-2 s^-1'.
 */
import { GLYPHS } from './strokeGlyphs.js';
import { layerPolyline, type CoverageLayer } from './raster.js';

/** A glyph compiled to polylines in grid units. */
interface Glyph { advance: number; lines: Float64Array[] }

const compiled = new Map<string, Glyph>();

function compile(ch: string): Glyph {
  let g = compiled.get(ch);
  if (g) return g;
  const src = GLYPHS[ch] ?? GLYPHS['?'];
  const tok = src[1].trim() ? src[1].trim().split(/\s+|(?=[MLEe])|(?<=[MLEe])/).filter((s) => s !== '') : [];
  const lines: Float64Array[] = [];
  let cur: number[] = [];
  const flush = () => { if (cur.length >= 4) lines.push(Float64Array.from(cur)); cur = []; };
  let k = 0;
  const num = () => Number(tok[k++]);
  while (k < tok.length) {
    const cmd = tok[k++];
    if (cmd === 'M') { flush(); cur.push(num(), num()); }
    else if (cmd === 'L') cur.push(num(), num());
    else if (cmd === 'E' || cmd === 'e') {
      if (cmd === 'E') flush();
      const cx = num(), cy = num(), rx = num(), ry = num(), a0 = num(), a1 = num();
      const steps = Math.max(4, Math.ceil(Math.abs(a1 - a0) / 12));
      for (let s = 0; s <= steps; s++) {
        const a = ((a0 + ((a1 - a0) * s) / steps) * Math.PI) / 180;
        cur.push(cx + rx * Math.cos(a), cy + ry * Math.sin(a));
      }
    } else throw new Error(`bad glyph command '${cmd}' in '${ch}'`);
  }
  flush();
  g = { advance: src[0], lines };
  compiled.set(ch, g);
  return g;
}

/** A run of text at one size and raise. */
interface Run { text: string; sup: boolean }

function runs(text: string): Run[] {
  const out: Run[] = [];
  let buf = '';
  for (let i = 0; i < text.length; i++) {
    if (text[i] === '^') {
      if (buf) out.push({ text: buf, sup: false });
      buf = '';
      let j = i + 1, s = '';
      if (text[j] === '{') { j++; while (j < text.length && text[j] !== '}') s += text[j++]; j++; }
      else while (j < text.length && /[-+0-9.]/.test(text[j])) s += text[j++];
      out.push({ text: s, sup: true });
      i = j - 1;
    } else buf += text[i];
  }
  if (buf) out.push({ text: buf, sup: false });
  return out;
}

const GAP = 2.4; // grid units between glyphs
const SUP_SCALE = 0.64;

/** Width in pixels of text drawn with capital height `sizePx`. */
export function measureText(text: string, sizePx: number): number {
  let w = 0;
  for (const r of runs(text)) {
    const u = (sizePx / 12) * (r.sup ? SUP_SCALE : 1);
    for (const ch of r.text) w += (compile(ch).advance + GAP) * u;
  }
  return Math.max(0, w - GAP * (sizePx / 12));
}

/** Horizontal anchor of a text position. */
export type TextAnchor = 'start' | 'middle' | 'end';

/**
 * Adds text to a coverage layer with its baseline at y and its anchor at x
 * (pixels). sizePx is the capital height; strokes are ~1/9 of it wide
 * (at least 1 px), plus `extraWidthPx` (a halo when drawn under the text).
 */
export function layerText(
  layer: CoverageLayer, text: string, x: number, y: number, sizePx: number,
  anchor: TextAnchor = 'start', extraWidthPx = 0,
): void {
  const width = measureText(text, sizePx);
  let pen = anchor === 'start' ? x : anchor === 'middle' ? x - width / 2 : x - width;
  const stroke = Math.max(1, sizePx / 9) + extraWidthPx;
  const xs = new Float64Array(128), ys = new Float64Array(128);
  for (const r of runs(text)) {
    const u = (sizePx / 12) * (r.sup ? SUP_SCALE : 1);
    const top = r.sup ? y - sizePx * 1.02 : y - sizePx;
    const w = r.sup ? Math.max(1, stroke * 0.8) : stroke;
    for (const ch of r.text) {
      const g = compile(ch);
      for (const line of g.lines) {
        const n = line.length / 2;
        for (let i = 0; i < n; i++) { xs[i] = pen + line[2 * i] * u; ys[i] = top + line[2 * i + 1] * u; }
        layerPolyline(layer, xs, ys, n, w);
      }
      pen += (g.advance + GAP) * u;
    }
  }
}
