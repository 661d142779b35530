import mathjs from 'mathjs/lib/browser/math.js';
import type { MathNode } from 'mathjs';
import { EngineError } from '../errors.js';
import { MAX_EXPRESSION_LENGTH } from '../limits.js';

/** The six mathjs functions that must never be reachable from a user expression. */
export const DISABLED_FUNCTIONS = [
  'import',
  'createUnit',
  'evaluate',
  'parse',
  'simplify',
  'derivative',
] as const;

const math = mathjs.create(mathjs.all);
// numbers are read as decimals so that 0.1 becomes exactly 1/10
math.config({ number: 'BigNumber', precision: 64 });
const privateParse = math.parse;
const disabled = (name: string) => () => {
  throw new EngineError(`function ${name} is disabled`);
};
math.import(Object.fromEntries(DISABLED_FUNCTIONS.map((name) => [name, disabled(name)])), {
  override: true,
});

/** The limited instance (its six dangerous functions throw "disabled"). */
export const limitedMath = math;

/**
 * Parse a user expression with the private parser. Only parsing happens in mathjs; evaluation is
 * ours (see evaluate.ts). Errors name the field when given.
 */
export function parseExpression(text: string, field?: string): MathNode {
  if (typeof text !== 'string') throw new EngineError('expected an expression (a string)', field);
  if (text.length > MAX_EXPRESSION_LENGTH) {
    throw new EngineError(
      `expression is ${text.length} characters long; the limit is ${MAX_EXPRESSION_LENGTH}`,
      field,
    );
  }
  if (text.trim() === '') throw new EngineError('expression is empty', field);
  try {
    return privateParse(text);
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e);
    throw new EngineError(`cannot read the expression: ${msg}`, field);
  }
}
