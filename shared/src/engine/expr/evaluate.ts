import Fraction from 'fraction.js';
import type { FunctionNode, MathNode } from 'mathjs';
import { EngineError, withField } from '../errors.js';
import { KSeries } from '../grand/kseries.js';
import { Series, truncate } from '../series/series.js';
import { callFunction } from './functions.js';
import { parseExpression } from './sandbox.js';
import { Ring, Value, vAdd, vDiv, vMul, vNeg, vPow, vSub } from './values.js';

/** A record of an infinite sum or product cut off at the order. */
export interface Truncation {
  what: string;
  terms: number;
}

/** Everything an expression may refer to while it is evaluated. */
export interface EvalContext extends Ring {
  /** Name of the series variable (default q). */
  variable: string;
  /** Index variables (L, N, p, k, ...) and kappa, when allowed. */
  bindings: ReadonlyMap<string, Value>;
  /** Where infinite sums and products record how many terms they used. */
  truncations: Truncation[];
  /** Called now and then inside long loops (progress, cancellation). */
  tick?: () => void;
}

/** Symbol names with a fixed meaning of their own. */
export const RESERVED = new Set(['inf', 'kappa']);

/** Exact rational of a numeric literal, read from its decimal text (0.1 = 1/10). */
function literal(node: MathNode): Value {
  const v = (node as unknown as { value: unknown }).value;
  let text: string;
  if (typeof v === 'number') text = String(v);
  else if (v && typeof (v as { toFixed?: unknown }).toFixed === 'function') {
    const d = v as { isFinite(): boolean; toFixed(): string; e?: number };
    if (!d.isFinite() || Math.abs(d.e ?? 0) > 1000) throw new EngineError('number out of range');
    text = d.toFixed();
  } else throw new EngineError('only numbers are allowed as constants');
  try {
    return Series.constant(new Fraction(text));
  } catch {
    throw new EngineError(`cannot read the number ${text}`);
  }
}

/** Evaluate a parsed expression over the engine's exact values. */
export function evaluateNode(node: MathNode, ctx: EvalContext): Value {
  switch (node.type) {
    case 'ConstantNode':
      return literal(node);
    case 'ParenthesisNode':
      return evaluateNode((node as unknown as { content: MathNode }).content, ctx);
    case 'SymbolNode': {
      const name = (node as unknown as { name: string }).name;
      if (name === ctx.variable) return Series.monomial(new Fraction(1), new Fraction(1));
      const bound = ctx.bindings.get(name);
      if (bound !== undefined) return bound;
      if (name === 'kappa') throw new EngineError('kappa is only allowed in a grand function');
      if (name === 'inf')
        throw new EngineError('inf is only allowed as an upper bound of sum, prod or qpoch');
      throw new EngineError(`unknown symbol ${name}`);
    }
    case 'OperatorNode': {
      const op = node as unknown as { fn: string; op: string; args: MathNode[] };
      const args = op.args.map((a) => evaluateNode(a, ctx));
      switch (op.fn) {
        case 'add':
          return vAdd(args[0]!, args[1]!, ctx);
        case 'subtract':
          return vSub(args[0]!, args[1]!, ctx);
        case 'multiply':
          return vMul(args[0]!, args[1]!, ctx);
        case 'divide':
          return vDiv(args[0]!, args[1]!, ctx);
        case 'pow':
          return vPow(args[0]!, args[1]!, ctx);
        case 'unaryMinus':
          return vNeg(args[0]!);
        case 'unaryPlus':
          return args[0]!;
        case 'factorial':
          return callFunction('factorial', [op.args[0]!], ctx, evaluateNode);
        default:
          throw new EngineError(`operator ${op.op} is not supported`);
      }
    }
    case 'FunctionNode': {
      const fn = node as FunctionNode;
      if (fn.fn.type !== 'SymbolNode') throw new EngineError('only named functions can be called');
      return callFunction((fn.fn as unknown as { name: string }).name, fn.args, ctx, evaluateNode);
    }
    default:
      throw new EngineError(
        `${node.type.replace(/Node$/, '').toLowerCase()} syntax is not supported`,
      );
  }
}

/** Options for evaluating one expression of a gas spec. */
export interface ExpressionOptions {
  variable: string;
  cap: Fraction | null;
  nMax?: number;
  bindings?: Record<string, Value | Fraction | number>;
  allowKappa?: boolean;
  field?: string;
  truncations?: Truncation[];
  tick?: () => void;
}

/** Context for repeated evaluation of one parsed expression. */
export function makeContext(opts: ExpressionOptions): EvalContext {
  const bindings = new Map<string, Value>();
  for (const [k, v] of Object.entries(opts.bindings ?? {})) bindings.set(k, toValue(v));
  if (opts.allowKappa) bindings.set('kappa', KSeries.kappa(opts.nMax ?? 0));
  const ctx: EvalContext = {
    variable: opts.variable,
    cap: opts.cap,
    nMax: opts.nMax ?? 0,
    bindings,
    truncations: opts.truncations ?? [],
  };
  if (opts.tick) ctx.tick = opts.tick;
  return ctx;
}

/** An index value as an engine value. */
export function toValue(v: Value | Fraction | number): Value {
  if (v instanceof Series || v instanceof KSeries) return v;
  return Series.constant(new Fraction(v));
}

/** Evaluate a parsed expression, truncated at the cap; errors carry `field`. */
export function evaluateAt(node: MathNode, ctx: EvalContext, field?: string): Value {
  try {
    const v = evaluateNode(node, ctx);
    if (v instanceof Series) return truncate(v, ctx.cap);
    return new KSeries(
      v.coeffs.map((c) => truncate(c, ctx.cap)),
      v.nMax,
    );
  } catch (e) {
    throw field === undefined ? e : withField(e, field);
  }
}

/** Parse and evaluate an expression text in one go. */
export function evaluateExpression(text: string, opts: ExpressionOptions): Value {
  const node = parseExpression(text, opts.field);
  return evaluateAt(node, makeContext(opts), opts.field);
}

/** Evaluate to a q-series; a result containing kappa is an error. */
export function evaluateSeries(text: string, opts: ExpressionOptions): Series {
  const v = evaluateExpression(text, opts);
  if (v instanceof Series) return v;
  throw new EngineError('expected a series in the variable, not in kappa', opts.field);
}
