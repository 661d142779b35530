import type { FunctionNode, MathNode } from 'mathjs';
import { EngineCancelled, EngineError, withField } from '../../errors.js';
import type { Truncation } from '../../expr/evaluate.js';
import { parseExpression } from '../../expr/sandbox.js';
import { parseDecimal } from '../decimal.js';
import { exp, pi } from '../elementary.js';
import { add, bitLength, ldexp, mul, neg, ONE, Real, round, sub } from '../real.js';
import { checked, divide, integerValue, power, powInteger } from './arith.js';
import { errorAtPoint } from './failure.js';
import { compileCall } from './functions.js';
import { Code, Compiled, Compiler, readsOf, Scope } from './types.js';

/** Bits carried beyond the caller's precision while an expression is evaluated. */
export const GUARD_BITS = 32;

/** How to compile one expression of the numeric mode. */
export interface NumericOptions {
  /** Names bound positionally to the values of each call (['x', 'y'] for a kernel). */
  names: readonly string[];
  /** Precision of the result in bits. */
  prec: number;
  /** The spec field the expression comes from; every error carries it. */
  field: string;
  /** Where infinite sums and products record the most terms any evaluation used. */
  truncations?: Truncation[];
  /** Called now and then inside long sums and products (progress, cancellation). */
  tick?: () => void;
}

const NO_READS: ReadonlySet<number> = new Set();

/** The exact decimal text of a literal, read to W bits (0.1 is 1/10 rounded once). */
function literal(node: MathNode, W: number): Real {
  const v = (node as unknown as { value: unknown }).value;
  let text: string;
  if (typeof v === 'number') text = String(v);
  else if (v && typeof (v as { isFinite?: unknown }).isFinite === 'function') {
    const d = v as { isFinite(): boolean; toString(): string };
    if (!d.isFinite()) throw new EngineError('number out of range');
    text = d.toString();
  } else throw new EngineError('only numbers are allowed as constants');
  return parseDecimal(text, W);
}

/** log2 |x| when |x| is a power of two (so that multiplying by it is exact), else null. */
function powerOfTwo(x: Real): number | null {
  const m = x.m < 0n ? -x.m : x.m;
  if (m === 0n || (m & (m - 1n)) !== 0n) return null;
  return x.e + bitLength(m) - 1;
}

/** A constant part evaluated once; a failure is kept and raised at every call instead. */
function fold(c: Compiled): Compiled {
  if (c.reads.size > 0) return c;
  try {
    const v = c.code([]);
    return { code: () => v, reads: NO_READS };
  } catch (e) {
    if (e instanceof EngineCancelled) throw e;
    return {
      code: () => {
        throw e;
      },
      reads: NO_READS,
    };
  }
}

/** Most values one memoised part keeps (a Nystrom grid has far fewer distinct points). */
const MEMO_LIMIT = 8192;

/**
 * A part that reads exactly one of the caller's values, in an expression of two or more (a
 * kernel rho(x, y)): its values are kept per bound Real object, so a Nystrom matrix, which meets
 * every grid point many times, evaluates sqrt(2*cosh(x/2)) once per point, not once per entry.
 */
function memo(c: Compiled, callerSlots: number): Compiled {
  if (callerSlots < 2 || c.reads.size !== 1) return c;
  const slot = c.reads.values().next().value as number;
  if (slot >= callerSlots) return c;
  const inner = c.code;
  const cache = new Map<Real, Real>();
  return {
    code: (env) => {
      const key = env[slot]!;
      const hit = cache.get(key);
      if (hit !== undefined) return hit;
      const v = inner(env);
      if (cache.size >= MEMO_LIMIT) cache.clear();
      cache.set(key, v);
      return v;
    },
    reads: c.reads,
  };
}

function constant(v: Real): Compiled {
  return { code: () => v, reads: NO_READS };
}

function symbol(name: string, scope: Scope, W: number): Compiled {
  const slot = scope.get(name);
  if (slot !== undefined) return { code: (env) => env[slot]!, reads: new Set([slot]) };
  if (name === 'pi') return constant(pi(W));
  if (name === 'e') return constant(exp(ONE, W));
  if (name === 'kappa') throw new EngineError('kappa has no meaning in numeric mode');
  if (name === 'inf') {
    throw new EngineError('inf is only allowed as a bound of sum or prod, or as n of qpoch');
  }
  throw new EngineError(`unknown symbol ${name}`);
}

/** x * c for a compile-time constant c: a shift when c is a power of two. */
function scaled(x: Code, k: Real, W: number): Code {
  const t = powerOfTwo(k);
  if (t === null) return (env) => mul(x(env), k, W);
  return k.m < 0n ? (env) => neg(ldexp(x(env), t)) : (env) => ldexp(x(env), t);
}

function operator(node: MathNode, scope: Scope, c: Compiler): Compiled {
  const op = node as unknown as { fn: string; op: string; args: MathNode[] };
  const W = c.W;
  const parts = op.args.map((a) => c.compile(a, scope));
  const [a, b] = parts as [Compiled, Compiled];
  const reads = readsOf(...parts);
  const ca = a.code;
  const cb = b?.code;
  const valueOf = (p: Compiled): Real | null => (p.reads.size === 0 ? safe(p.code) : null);
  switch (op.fn) {
    case 'add':
      return { code: (env) => add(ca(env), cb!(env), W), reads };
    case 'subtract':
      return { code: (env) => sub(ca(env), cb!(env), W), reads };
    case 'multiply': {
      const kb = valueOf(b);
      if (kb) return { code: scaled(ca, kb, W), reads };
      const ka = valueOf(a);
      if (ka) return { code: scaled(cb!, ka, W), reads };
      return { code: (env) => mul(ca(env), cb!(env), W), reads };
    }
    case 'divide': {
      const kb = valueOf(b);
      const t = kb && kb.m !== 0n ? powerOfTwo(kb) : null;
      if (kb && t !== null) return { code: scaled(ca, ldexp(kb, -2 * t), W), reads };
      return { code: (env) => divide(ca(env), cb!(env), W), reads };
    }
    case 'pow': {
      const kb = valueOf(b);
      const n = kb ? integerValue(kb) : null;
      if (n !== null) return { code: (env) => powInteger(ca(env), n, W), reads };
      return { code: (env) => power(ca(env), cb!(env), W), reads };
    }
    case 'unaryMinus':
      return { code: (env) => neg(ca(env)), reads };
    case 'unaryPlus':
      return a;
    case 'factorial':
      return compileCall('factorial', op.args, scope, c);
    default:
      throw new EngineError(`operator ${op.op} is not supported`);
  }
}

/** The value of a folded constant, or null when it fails (it then fails at call time). */
function safe(code: Code): Real | null {
  try {
    return code([]);
  } catch {
    return null;
  }
}

function makeCompiler(opts: NumericOptions): Compiler {
  if (!Number.isInteger(opts.prec) || opts.prec < 2) throw new RangeError('prec must be >= 2 bits');
  const c: Compiler = {
    prec: opts.prec,
    W: opts.prec + GUARD_BITS,
    slotNames: [...opts.names],
    truncations: opts.truncations ?? [],
    tick: opts.tick,
    compile(node, scope) {
      switch (node.type) {
        case 'ConstantNode':
          return constant(literal(node, c.W));
        case 'ParenthesisNode':
          return c.compile((node as unknown as { content: MathNode }).content, scope);
        case 'SymbolNode':
          return symbol((node as unknown as { name: string }).name, scope, c.W);
        case 'OperatorNode':
          return memo(fold(operator(node, scope, c)), opts.names.length);
        case 'FunctionNode': {
          const fn = node as FunctionNode;
          if (fn.fn.type !== 'SymbolNode') {
            throw new EngineError('only named functions can be called');
          }
          const name = (fn.fn as unknown as { name: string }).name;
          return memo(fold(compileCall(name, fn.args, scope, c)), opts.names.length);
        }
        default:
          throw new EngineError(
            `${node.type.replace(/Node$/, '').toLowerCase()} syntax is not supported`,
          );
      }
    },
  };
  return c;
}

/**
 * Compile an expression of the numeric mode once into a function of the values bound to
 * `opts.names` (positionally). The result is rounded to `opts.prec` bits from an evaluation at
 * prec + GUARD_BITS (cancellation inside the expression is not tracked). Unknown names,
 * disabled functions, O(...) and kappa are EngineErrors (with `field`) here; poles, values
 * outside a function's domain, overflow and non-converging sums are EngineErrors at call time
 * naming the point ("has a pole at x = 0.5, y = 0.5: division by zero").
 */
export function compileNumeric(text: string, opts: NumericOptions): (values: Real[]) => Real {
  const node = parseExpression(text, opts.field);
  const c = makeCompiler(opts);
  const scope = new Map(opts.names.map((name, i) => [name, i] as const));
  let root: Compiled;
  try {
    root = c.compile(node, scope);
  } catch (e) {
    throw withField(e, opts.field);
  }
  const code = root.code;
  const n = opts.names.length;
  const slots = c.slotNames.length;
  const { prec, field } = opts;
  return (values) => {
    if (values.length !== n) throw new RangeError(`expected ${n} values, got ${values.length}`);
    const env: (Real | undefined)[] = values.slice();
    for (let i = n; i < slots; i++) env.push(undefined);
    try {
      return round(checked(code(env)), prec);
    } catch (e) {
      throw errorAtPoint(e, c.slotNames, env, field);
    }
  };
}

/** Compile and evaluate once: `evaluateNumeric('sqrt(2)', { names: [], values: [], prec, field })`. */
export function evaluateNumeric(text: string, opts: NumericOptions & { values: Real[] }): Real {
  return compileNumeric(text, opts)(opts.values);
}

const CONSTANTS = new Set(['pi', 'e', 'inf']);

/**
 * The names an expression reads that no sum or prod binds and that are not constants (pi, e,
 * inf), in order of first appearance: what a caller must bind (or reject) before compiling.
 */
export function freeSymbols(text: string, field?: string): string[] {
  const out = new Set<string>();
  const walk = (n: MathNode, bound: ReadonlySet<string>): void => {
    if (n.type === 'SymbolNode') {
      const name = (n as unknown as { name: string }).name;
      if (!bound.has(name) && !CONSTANTS.has(name)) out.add(name);
      return;
    }
    if (n.type === 'FunctionNode') {
      const fn = n as FunctionNode;
      const name = (fn.fn as unknown as { name?: string }).name;
      const index = fn.args[1] as unknown as { type: string; name: string } | undefined;
      if (
        (name === 'sum' || name === 'prod') &&
        fn.args.length === 4 &&
        index?.type === 'SymbolNode'
      ) {
        walk(fn.args[0]!, new Set(bound).add(index.name));
        walk(fn.args[2]!, bound);
        walk(fn.args[3]!, bound);
        return;
      }
      for (const a of fn.args) walk(a, bound);
      return;
    }
    n.forEach((child) => walk(child, bound));
  };
  walk(parseExpression(text, field), new Set());
  return [...out];
}
