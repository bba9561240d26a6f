/**
 * Value scales for colouring: linear, logarithmic and inverse hyperbolic sine
 * (asinh, Lupton, Gunn & Szalay 1999, AJ 118, 1406, eq. 2: linear near zero,
 * logarithmic far from it, defined for negative values). Each maps a value to
 * t in [0, 1]; values outside [min, max] clamp, non-positive values on a log
 * scale map to 0.
 */
import { InputError } from '../core/errors.js';
import { BLANK, type MapArray } from '../maps/skyMap.js';

/** Values at or below this are the blank sentinel (within isBlank's 1e-5 relative tolerance) or beyond. */
const BLANK_EDGE = BLANK * (1 - 1e-5);

/** Scale kinds. */
export type ScaleKind = 'linear' | 'log' | 'asinh';

/** A resolved scale: kind, range and (asinh) softening, all in map units. */
export interface ValueScale {
  readonly kind: ScaleKind;
  readonly min: number;
  readonly max: number;
  /** asinh softening beta (map units); ignored by the other kinds. */
  readonly softening: number;
}

/** Forward transform s(v) of a scale before normalisation; NaN for v <= 0 on log. */
export function scaleTransform(kind: ScaleKind, v: number, softening: number): number {
  if (kind === 'log') return v > 0 ? Math.log(v) : NaN;
  if (kind === 'asinh') return Math.asinh(v / softening);
  return v;
}

/**
 * t = (s(v) - s(min)) / (s(max) - s(min)) clamped to [0, 1]. Non-finite s(v)
 * (log of a non-positive value) gives 0. Callers handle blanks before this.
 */
export function normalise(scale: ValueScale, v: number): number {
  const s0 = scaleTransform(scale.kind, scale.min, scale.softening);
  const s1 = scaleTransform(scale.kind, scale.max, scale.softening);
  const s = scaleTransform(scale.kind, v, scale.softening);
  if (!(s === s)) return 0;
  const t = (s - s0) / (s1 - s0);
  return t < 0 ? 0 : t > 1 ? 1 : t;
}

/** Smallest and largest non-blank finite value, and the smallest positive one. */
export function valueRange(plane: MapArray): { min: number; max: number; minPositive: number } {
  let min = Infinity, max = -Infinity, minPos = Infinity;
  const n = plane.length;
  for (let i = 0; i < n; i++) {
    const v = plane[i];
    // NaN, the blank sentinel (isBlank's tolerance) and anything below it, and +-Infinity are left out.
    if (!(v > BLANK_EDGE && v < Infinity && v > -Infinity)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
    if (v > 0 && v < minPos) minPos = v;
  }
  return { min, max, minPositive: minPos };
}

/**
 * Resolves a scale from user choices and the data. Defaults: the data range;
 * on a log scale the lower end defaults to max(smallest positive value,
 * max / 1e4); the asinh softening defaults to 1/20 of the larger of |min|,
 * |max| (common practice, no source). Throws InputError when no range exists.
 */
export function resolveScale(
  plane: MapArray, kind: ScaleKind, opts: { min?: number; max?: number; softening?: number } = {},
): ValueScale {
  const r = valueRange(plane);
  let max = opts.max ?? r.max;
  let min = opts.min ?? (kind === 'log' ? Math.max(r.minPositive, max / 1e4) : r.min);
  if (!Number.isFinite(min) || !Number.isFinite(max)) {
    throw new InputError('the map has no finite, non-blank value to set a colour range from', {},
      'give the range with --min and --max');
  }
  if (kind === 'log' && !(min > 0)) {
    throw new InputError(`a log scale needs a positive lower end, got ${min}`, {}, 'give a positive --min or use --scale asinh');
  }
  if (min === max) { const d = min === 0 ? 1 : Math.abs(min) * 0.01; min -= d; max += d; if (kind === 'log') min = Math.max(min, max / 1.1); }
  if (!(max > min)) throw new InputError(`the colour range is empty: min ${min}, max ${max}`, {}, 'give --max above --min');
  const softening = opts.softening ?? Math.max(Math.abs(min), Math.abs(max)) / 20;
  if (kind === 'asinh' && !(softening > 0)) throw new InputError(`asinh softening must be positive, got ${softening}`);
  return { kind, min, max, softening };
}

function niceSteps(lo: number, hi: number): number[] {
  const out: number[] = [];
  const span = hi - lo;
  const step0 = Math.pow(10, Math.floor(Math.log10(span / 5)));
  const step = [1, 2, 5, 10].map((m) => m * step0).find((s) => span / s <= 7) ?? 10 * step0;
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi * (1 + 1e-12) + 1e-300; k++) out.push(k * step === 0 ? 0 : k * step);
  return out;
}

/**
 * Tick values for a colour bar: about 5 round numbers inside [min, max].
 * Linear: 1-2-5 steps; log: powers of ten (with 2 and 5 when the range is
 * under two decades); asinh: 0 and signed 1-2-5 values; log and asinh thinned so that
 * neighbours sit at least 0.1 apart in t, preferring 0 and powers of ten.
 */
export function scaleTicks(scale: ValueScale): number[] {
  const { kind, min, max } = scale;
  let cand: number[];
  if (kind === 'linear') return niceSteps(min, max);
  if (kind === 'log') {
    cand = [];
    const few = Math.log10(max / min) < 2;
    for (let e = Math.floor(Math.log10(min)); e <= Math.ceil(Math.log10(max)); e++) {
      for (const m of few ? [1, 2, 5] : [1]) cand.push(m * Math.pow(10, e));
    }
  } else {
    cand = [0];
    const top = Math.max(Math.abs(min), Math.abs(max));
    for (let e = Math.floor(Math.log10(scale.softening)) - 1; e <= Math.ceil(Math.log10(top)); e++) {
      for (const m of [1, 2, 5]) { const v = m * Math.pow(10, e); cand.push(v, -v); }
    }
    cand.sort((a, b) => a - b);
  }
  const lo = min - 1e-12 * Math.abs(min), hi = max + 1e-12 * Math.abs(max);
  const inside = cand.filter((v) => v >= lo && v <= hi);
  // Zero first, then powers of ten, then 2 and 5 multiples: keep a value when it
  // sits at least 0.1 (in t) from every value kept so far.
  const rank = (v: number) => (v === 0 ? 0 : Math.abs(Math.log10(Math.abs(v)) - Math.round(Math.log10(Math.abs(v)))) < 1e-9 ? 1 : 2);
  const kept: number[] = [];
  for (const v of [...inside].sort((a, b) => rank(a) - rank(b))) {
    const t = normalise(scale, v);
    if (kept.every((w) => Math.abs(normalise(scale, w) - t) >= 0.1)) kept.push(v);
  }
  return kept.sort((a, b) => a - b);
}

/**
 * Short label of a tick value for the stroke font: plain decimals for
 * 1e-3 <= |v| < 1e4, otherwise 'm×10^e' (or '10^e' when m = 1); '^' marks a
 * superscript run for the text renderer.
 */
export function formatTick(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e-3 && a < 1e4) return String(Number(v.toPrecision(3)));
  const e = Math.floor(Math.log10(a) + 1e-12);
  const m = Number((v / Math.pow(10, e)).toPrecision(3));
  return (m === 1 ? '' : m === -1 ? '-' : `${m}×`) + `10^${e}`;
}
