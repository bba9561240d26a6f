/**
 * User components as mathjs expressions in Galactocentric R and z (kpc). An
 * expression is parsed and checked once (syntax, variables), compiled, and then
 * only tabulated on the model grid: it is never evaluated in the hot loop.
 */
import type { MathNode } from 'mathjs';
import { InputError, type InputLocation } from '../core/errors.js';
import { lazyRequire } from '../core/lazyRequire.js';

/** mathjs, loaded at the first expression: reading a spec without one does not pay for it. */
const mathjs = lazyRequire<typeof import('mathjs')>('mathjs');

/** Variables an expression may use: R and z in kpc. */
export const EXPRESSION_VARIABLES = ['R', 'z'] as const;
const CONSTANTS = new Set(['pi', 'e', 'PI', 'E', 'Infinity']);

/** A checked, compiled expression f(R, z). */
export interface UserExpression {
  readonly text: string;
  /** Evaluates at one point (for tabulation only; slow, allocates). */
  evaluate(rKpc: number, zKpc: number): number;
}

/**
 * Parses and checks `text`; throws {@link InputError} at `where` on a syntax
 * error or an unknown variable (anything but R, z, pi, e and function names).
 */
export function compileExpression(text: string, where: InputLocation): UserExpression {
  let node: MathNode;
  try {
    node = mathjs().parse(text);
  } catch (e) {
    throw new InputError(`expression '${text}' has a syntax error: ${(e as Error).message}`, where,
      'write a mathjs expression in R and z (kpc), e.g. "exp(-R/3) * exp(-abs(z)/0.1)"');
  }
  const unknown: string[] = [];
  node.traverse((n: MathNode, _path: string, parent: MathNode | null) => {
    const sym = n as MathNode & { isSymbolNode?: boolean; name?: string };
    if (!sym.isSymbolNode) return;
    const p = parent as (MathNode & { isFunctionNode?: boolean; fn?: MathNode }) | null;
    if (p && p.isFunctionNode && p.fn === n) return;
    const name = sym.name ?? '';
    if (!(EXPRESSION_VARIABLES as readonly string[]).includes(name) && !CONSTANTS.has(name) && !unknown.includes(name)) {
      unknown.push(name);
    }
  });
  if (unknown.length > 0) {
    throw new InputError(`expression '${text}' uses unknown variable ${unknown.map((u) => `'${u}'`).join(', ')}`, where,
      `only ${EXPRESSION_VARIABLES.join(' and ')} (kpc) are defined`);
  }
  const code = node.compile();
  const scope = { R: 0, z: 0 };
  const evaluate = (rKpc: number, zKpc: number): number => {
    scope.R = rKpc;
    scope.z = zKpc;
    const v = code.evaluate(scope);
    return typeof v === 'number' ? v : Number(v);
  };
  // One trial evaluation catches unknown functions and non-numeric results early.
  let trial: number;
  try {
    trial = evaluate(8.5, 0);
  } catch (e) {
    throw new InputError(`expression '${text}' cannot be evaluated: ${(e as Error).message}`, where);
  }
  if (typeof trial !== 'number' || Number.isNaN(trial)) {
    throw new InputError(`expression '${text}' does not give a real number at R = 8.5, z = 0`, where);
  }
  return { text, evaluate };
}
