/**
 * Template spec files: YAML (or JSON) describing a 3D emission model, checked
 * with zod. Every problem becomes one {@link InputError} line naming the key
 * path. See docs/templates.md for the keys.
 */
import { parse as parseYaml } from 'yaml';
import { z } from 'zod';
import { InputError } from '../core/errors.js';
import { compileExpression } from './userExpression.js';
import { RADIAL_LAW_NAMES } from './radialLaws.js';

const pos = z.number().positive();
const nonneg = z.number().nonnegative();
const factor = z.number().nonnegative().default(1);

const hiDisc = z.object({
  component: z.literal('hiDickeyLockman'), factor,
  holeRadiusKpc: nonneg.optional(), holeScaleKpc: pos.optional(),
  outerScaleKpc: pos.optional(), flareScaleKpc: pos.optional(),
}).strict();
const hiNs = z.object({ component: z.literal('hiNakanishiSofue2003'), factor }).strict();
const h2Fe = z.object({ component: z.literal('h2Ferriere2001'), factor }).strict();
const h2Ns = z.object({ component: z.literal('h2NakanishiSofue2006'), factor }).strict();
const uniform = z.object({ component: z.literal('uniform'), factor, densityCm3: nonneg }).strict();
const slab = z.object({
  component: z.literal('exponentialSlab'), factor, densityCm3: nonneg, scaleHeightKpc: pos,
}).strict();
const expr = z.object({ component: z.literal('expression'), factor, expression: z.string().min(1) }).strict();

const gasComponent = z.discriminatedUnion('component', [hiDisc, hiNs, h2Fe, h2Ns, uniform, slab, expr]);
const lawName = z.enum(RADIAL_LAW_NAMES);

const cosmicRays = z.object({
  distribution: z.enum([...RADIAL_LAW_NAMES, 'constant', 'expression']),
  haloHeightKpc: pos.optional(),
  verticalProfile: z.enum(['linear', 'exponential']).default('linear'),
  expression: z.string().min(1).optional(),
  indexGradientPerKpc: z.number().finite().default(0),
  pivotGeV: pos.default(1000),
}).strict();

const sources = z.object({
  distribution: lawName,
  scaleHeightKpc: pos,
  indexGradientPerKpc: z.number().finite().default(0),
  pivotGeV: pos.default(1000),
}).strict();

const schema = z.object({
  name: z.string().regex(/^[A-Za-z0-9._-]+$/, 'use letters, digits, dot, dash, underscore'),
  description: z.string().default(''),
  observer: z.object({ rSunKpc: pos.default(8.5), zSunKpc: z.number().finite().default(0) }).strict().default({ rSunKpc: 8.5, zSunKpc: 0 }),
  gas: z.array(gasComponent).min(1).optional(),
  cosmicRays: cosmicRays.optional(),
  sources: sources.optional(),
  energiesGeV: z.array(pos).min(1).optional(),
  integration: z.object({
    maxDistanceKpc: pos.default(30),
    stepKpc: pos.default(0.5),
    nodesPerSegment: z.number().int().min(1).max(32).default(6),
  }).strict().default({ maxDistanceKpc: 30, stepKpc: 0.5, nodesPerSegment: 6 }),
}).strict();

/** A checked template spec (defaults filled in). */
export type TemplateSpec = z.output<typeof schema>;
/** One gas component of a spec. */
export type GasComponentSpec = z.output<typeof gasComponent>;

function keyPathOf(path: readonly PropertyKey[]): string {
  let s = '';
  for (const p of path) s += typeof p === 'number' ? `[${p}]` : (s ? '.' : '') + String(p);
  return s || '(top level)';
}

function describeIssue(issue: z.core.$ZodIssue): string {
  const input = (issue as { input?: unknown }).input;
  switch (issue.code) {
    case 'too_small': return `must be ${issue.inclusive ? '>=' : '>'} ${String(issue.minimum)}, got ${JSON.stringify(input)}`;
    case 'too_big': return `must be ${issue.inclusive ? '<=' : '<'} ${String(issue.maximum)}, got ${JSON.stringify(input)}`;
    case 'unrecognized_keys': return `unknown key${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => `'${k}'`).join(', ')}`;
    case 'invalid_union': {
      const u = issue as { discriminator?: string; options?: unknown[] };
      if (u.options) {
        const d = u.discriminator ?? 'value';
        const given = input !== null && typeof input === 'object' ? (input as Record<string, unknown>)[d] : input;
        return `unknown ${d} ${JSON.stringify(given)}, expected one of ${u.options.join(', ')}`;
      }
      return issue.message;
    }
    case 'invalid_value': return `is ${JSON.stringify(input)}, expected one of ${issue.values.map(String).join(', ')}`;
    case 'invalid_type': return input === undefined ? `is missing (expected ${issue.expected})` : `is ${JSON.stringify(input)}, expected ${issue.expected}`;
    default: return issue.message;
  }
}

/**
 * Parses and checks a template spec given as YAML/JSON text or as an object.
 * Throws one {@link InputError} naming `file` and the key path of the first
 * problem: unknown component or key, non-positive scale height, an expression
 * with a syntax error or an unknown variable, a missing model part.
 */
export function parseTemplateSpec(input: string | unknown, file?: string): TemplateSpec {
  let data: unknown = input;
  if (typeof input === 'string') {
    try {
      data = parseYaml(input);
    } catch (e) {
      throw new InputError(`not valid YAML: ${(e as Error).message.split('\n')[0]}`, { file });
    }
  }
  const r = schema.safeParse(data, { reportInput: true });
  if (!r.success) {
    const issue = r.error.issues[0];
    throw new InputError(describeIssue(issue), { file, keyPath: keyPathOf(issue.path) });
  }
  const spec = r.data;
  const hasGas = spec.gas !== undefined, hasSources = spec.sources !== undefined;
  if (hasGas === hasSources) {
    throw new InputError(hasGas ? 'gives both gas and sources' : 'needs either gas (with cosmicRays) or sources', { file, keyPath: hasGas ? 'sources' : 'gas' },
      'a template is gas x cosmic rays, or a source density');
  }
  if (hasGas && !spec.cosmicRays) throw new InputError('is missing (gas needs a cosmic-ray distribution)', { file, keyPath: 'cosmicRays' });
  if (hasSources && spec.cosmicRays) throw new InputError('is not used with sources', { file, keyPath: 'cosmicRays' });
  spec.gas?.forEach((g, i) => {
    if (g.component === 'expression') compileExpression(g.expression, { file, keyPath: `gas[${i}].expression` });
  });
  const cr = spec.cosmicRays;
  if (cr) {
    if (cr.distribution === 'expression') {
      if (!cr.expression) throw new InputError('is missing (distribution is expression)', { file, keyPath: 'cosmicRays.expression' });
      compileExpression(cr.expression, { file, keyPath: 'cosmicRays.expression' });
    } else if (cr.expression !== undefined) {
      throw new InputError(`is only used with distribution: expression (got ${cr.distribution})`, { file, keyPath: 'cosmicRays.expression' });
    }
    if ((RADIAL_LAW_NAMES as readonly string[]).includes(cr.distribution) && cr.haloHeightKpc === undefined) {
      throw new InputError(`is missing (a source-law cosmic-ray density needs a halo height)`, { file, keyPath: 'cosmicRays.haloHeightKpc' });
    }
  }
  if (spec.integration.stepKpc > spec.integration.maxDistanceKpc) {
    throw new InputError(`step ${spec.integration.stepKpc} kpc exceeds maxDistanceKpc ${spec.integration.maxDistanceKpc}`, { file, keyPath: 'integration.stepKpc' });
  }
  return spec;
}
