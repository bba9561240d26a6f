/**
 * zod schemas of the shape parameters in a region file, and the translation of
 * a zod issue into one line naming the key path, what was found and what was
 * expected. Angles are in degrees here (the file's unit); document.ts converts.
 */
import { z } from 'zod';
import { didYouMean } from '../core/didYouMean.js';
import { InputError } from '../core/errors.js';

const finite = z.number();
const lat = finite.min(-90).max(90);
const lon = finite.min(-360).max(360);
const frame = z.enum(['galactic', 'equatorial']);
const radius = finite.gt(0).max(180);

/** Two numbers [low, high] with low < high (strictly). */
function range(item: z.ZodNumber) {
  return z.tuple([item, item]).refine((r) => r[0] < r[1], { message: 'inverted range' });
}

/** Shape parameter schemas, one per shape key of a region. */
export const shapeSchemas = {
  sky: z.literal(true),
  site: z.strictObject({
    latDeg: lat,
    maxZenithDeg: finite.gt(0).max(90),
    weight: z.union([z.enum(['none', 'zenith', 'time']),
      z.strictObject({ map: z.string().min(1), column: z.union([z.string(), z.number().int().min(0)]).optional(), frame: frame.optional() })]).optional(),
  }),
  box: z.strictObject({
    frame: frame.optional(),
    lonDeg: z.tuple([lon, lon]).refine((r) => r[0] !== r[1] && Math.abs(r[1] - r[0]) <= 360,
      { message: 'empty or over-full longitude range' }).optional(),
    latDeg: range(lat).optional(),
  }),
  band: z.strictObject({ frame: frame.optional(), absLatDeg: range(finite.min(0).max(90)) }),
  disc: z.strictObject({ frame: frame.optional(), atDeg: z.tuple([lon, lat]), radiusDeg: radius }),
  ring: z.strictObject({ frame: frame.optional(), atDeg: z.tuple([lon, lat]), radiiDeg: range(finite.min(0).max(180)) }),
  sources: z.strictObject({
    file: z.string().min(1),
    frame: frame.optional(),
    radiusDeg: radius.optional(),
    psfDeg: finite.min(0).max(30).optional(),
    psfTimes: finite.min(0).max(100).optional(),
    columns: z.strictObject({
      name: z.string().min(1).optional(), lon: z.string().min(1).optional(), lat: z.string().min(1).optional(),
      frame: z.string().min(1).optional(), radius: z.string().min(1).optional(),
    }).optional(),
  }),
} as const;

/** Top level of a region file. */
export const documentSchema = z.strictObject({
  frame: frame.optional(),
  regions: z.record(z.string().regex(/^[A-Za-z][A-Za-z0-9_-]*$/), z.unknown()),
});

/** Keys allowed on a region besides its one shape key. */
export const REGION_EXTRA_KEYS = ['except', 'about'] as const;
/** Combinator keys (their value is a list of regions). */
export const COMBINATOR_KEYS = ['all', 'any'] as const;

/** Short description of a value for messages: `"abc"`, `5`, `NaN`, `a list of 3`, `an object`. */
export function describeValue(v: unknown): string {
  if (typeof v === 'number') return Number.isNaN(v) ? 'NaN' : String(v);
  if (typeof v === 'string') return JSON.stringify(v.length > 40 ? v.slice(0, 40) + '...' : v);
  if (v === null) return 'null';
  if (v === undefined) return 'nothing';
  if (Array.isArray(v)) return v.length <= 4 && v.every((x) => typeof x !== 'object') ? `[${v.map(describeValue).join(', ')}]` : `a list of ${v.length}`;
  if (typeof v === 'object') return 'an object';
  return String(v);
}

function joinPath(base: string, path: readonly PropertyKey[]): string {
  let s = base;
  for (const p of path) s += typeof p === 'number' ? `[${p}]` : (s ? '.' : '') + String(p);
  return s;
}

function bound(op: string, v: unknown): string {
  return `${op} ${String(v)}`;
}

/**
 * Validates `value` against `schema`; on failure throws one {@link InputError}
 * for the first issue, located at `basePath` plus the issue's path.
 */
export function checkWith<T extends z.ZodType>(schema: T, value: unknown, basePath: string, file: string | undefined): z.infer<T> {
  const r = schema.safeParse(value, { reportInput: true });
  if (r.success) return r.data;
  // An unknown key is named first: a misspelt key also shows up as the missing key it was meant to be.
  const issue = (r.error.issues.find((i) => i.code === 'unrecognized_keys') ?? r.error.issues[0]) as z.core.$ZodIssue & { input?: unknown; received?: string };
  let hint: string | undefined;
  let keyPath = joinPath(basePath, issue.path);
  let found = issue.received === 'NaN' || issue.received === 'Infinity' ? issue.received : describeValue(issue.input);
  if (typeof issue.input === 'number' && !Number.isFinite(issue.input)) found = String(issue.input);
  let expected: string;
  switch (issue.code) {
    case 'invalid_type':
      expected = issue.expected === 'number' ? 'a finite number' : issue.expected === 'tuple' ? 'a list [a, b] of two numbers'
        : issue.expected === 'record' ? 'a map of named regions' : `a ${issue.expected}`;
      if (issue.input === undefined && issue.received === undefined) found = 'nothing (missing key)';
      break;
    case 'unrecognized_keys':
      keyPath = joinPath(keyPath, [issue.keys[0]]);
      found = `unknown key '${issue.keys[0]}'`;
      expected = `one of: ${allowedKeys(schema, issue.path).join(', ')}`;
      hint = didYouMean(issue.keys[0], allowedKeys(schema, issue.path)) || undefined;
      break;
    case 'too_small':
      expected = issue.origin === 'array' ? `a list of ${issue.minimum} values` : issue.origin === 'string' ? 'a non-empty text'
        : bound(issue.inclusive ? '>=' : '>', issue.minimum);
      break;
    case 'too_big':
      expected = issue.origin === 'array' ? `a list of ${issue.maximum} values` : bound(issue.inclusive ? '<=' : '<', issue.maximum);
      break;
    case 'invalid_value':
      expected = `one of: ${issue.values.map((x) => String(x)).join(', ')}`;
      break;
    case 'invalid_union':
      expected = 'one of the allowed forms (see docs/regions.md)';
      break;
    case 'custom':
      expected = issue.message === 'inverted range' ? 'a range [low, high] with low < high'
        : issue.message === 'empty or over-full longitude range' ? '[from, to] with from != to, at most 360 deg apart' : issue.message;
      if (issue.message === 'inverted range') found = `inverted range ${found}`;
      break;
    case 'invalid_format':
      expected = 'a name of letters, digits, _ or -, starting with a letter';
      break;
    default:
      expected = issue.message;
  }
  throw new InputError(`found ${found}, expected ${expected}`, { file, keyPath }, hint);
}

function allowedKeys(schema: z.ZodType, path: readonly PropertyKey[]): string[] {
  let s: unknown = schema;
  for (const p of path) {
    const shape = (s as { shape?: Record<string, unknown> }).shape;
    s = shape?.[String(p)];
    while (s && (s as { unwrap?: () => unknown }).unwrap && !(s as { shape?: unknown }).shape) s = (s as { unwrap: () => unknown }).unwrap();
  }
  const shape = (s as { shape?: Record<string, unknown> }).shape;
  return shape ? Object.keys(shape) : [];
}
