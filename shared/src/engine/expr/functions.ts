import Fraction from 'fraction.js';
import type { MathNode } from 'mathjs';
import { EngineError } from '../errors.js';
import { plethysticExp, plethysticLog } from '../largen/plethystic.js';
import { MAX_TERMS } from '../limits.js';
import { factorial } from '../integers.js';
import { frac } from '../rational.js';
import { Series } from '../series/series.js';
import type { EvalContext } from './evaluate.js';
import { runInfinite, runFinite } from './loops.js';
import { DISABLED_FUNCTIONS } from './sandbox.js';
import {
  asInteger,
  asRational,
  Value,
  vAdd,
  vMul,
  vPow,
  vSub,
  vExp,
  vLog,
  vNeg,
} from './values.js';

type Evaluate = (node: MathNode, ctx: EvalContext) => Value;

const disabled = new Set<string>(DISABLED_FUNCTIONS);
const one = (): Series => Series.constant(frac(1));

function arity(name: string, args: readonly MathNode[], n: number): void {
  if (args.length !== n) {
    throw new EngineError(`${name} takes ${n} argument${n === 1 ? '' : 's'}, got ${args.length}`);
  }
}

/** `inf`, `-inf` or null (a finite bound). */
function infinity(node: MathNode): 1 | -1 | null {
  const n = node as unknown as {
    type: string;
    name?: string;
    fn?: string;
    args?: MathNode[];
    content?: MathNode;
  };
  if (n.type === 'SymbolNode' && n.name === 'inf') return 1;
  if (n.type === 'ParenthesisNode') return infinity(n.content!);
  if (n.type === 'OperatorNode' && n.fn === 'unaryMinus' && infinity(n.args![0]!) === 1) return -1;
  return null;
}

/** sum(term, k, from, to) and prod(term, k, from, to). */
function indexed(
  kind: 'sum' | 'prod',
  args: readonly MathNode[],
  ctx: EvalContext,
  evaluate: Evaluate,
): Value {
  arity(kind, args, 4);
  const [term, index, fromNode, toNode] = args as [MathNode, MathNode, MathNode, MathNode];
  const name = (index as unknown as { name?: string }).name;
  if (
    index.type !== 'SymbolNode' ||
    !name ||
    name === ctx.variable ||
    name === 'kappa' ||
    name === 'inf'
  ) {
    throw new EngineError(`${kind}: the second argument must be a new index name`);
  }
  const lo = infinity(fromNode);
  const hi = infinity(toNode);
  if (lo === 1 || hi === -1) throw new EngineError(`${kind}: bounds must run upwards`);
  const from = lo === null ? asInteger(evaluate(fromNode, ctx), `${kind}: the lower bound`) : null;
  const to = hi === null ? asInteger(evaluate(toNode, ctx), `${kind}: the upper bound`) : null;
  const at = (k: number): Value => {
    const bindings = new Map(ctx.bindings);
    bindings.set(name, Series.constant(frac(k)));
    return evaluate(term, { ...ctx, bindings });
  };
  const what = `${kind} over ${name}`;
  if (from !== null && to !== null) return runFinite(kind, at, from, to, ctx);
  return runInfinite(kind, at, from, to, ctx, what);
}

/** (a; x)_n = prod_(k=0..n-1) (1 - a x^k), DLMF 17.2.1; n may be inf or negative (17.2.3). */
function qpoch(args: readonly MathNode[], ctx: EvalContext, evaluate: Evaluate): Value {
  arity('qpoch', args, 3);
  const a = evaluate(args[0]!, ctx);
  const x = evaluate(args[1]!, ctx);
  const inf = infinity(args[2]!);
  if (inf === -1) throw new EngineError('qpoch: n must be an integer or inf');
  const factor = (k: number): Value =>
    vSub(one(), vMul(a, vPow(x, Series.constant(frac(k)), ctx), ctx), ctx);
  if (inf === 1) {
    if (!(x instanceof Series) || (x.valExponent()?.compare(0) ?? 1) <= 0) {
      throw new EngineError('qpoch(a, x, inf) needs a base x with positive valuation');
    }
    return runInfinite('prod', factor, 0, null, ctx, 'qpoch');
  }
  const n = asInteger(evaluate(args[2]!, ctx), 'qpoch: n');
  if (n >= 0) return runFinite('prod', factor, 0, n - 1, ctx);
  // (a;x)_(-m) = 1 / prod_(k=1..m) (1 - a x^(-k))
  const p = runFinite('prod', (k) => factor(-k), 1, -n, ctx);
  return vPow(p, Series.constant(frac(-1)), ctx);
}

/** Jacobi theta functions at z = 0 with nome x (DLMF 20.2.1-20.2.4). */
function theta(
  which: number,
  args: readonly MathNode[],
  ctx: EvalContext,
  evaluate: Evaluate,
): Value {
  const name = `theta${which}`;
  arity(name, args, 2);
  const z = evaluate(args[0]!, ctx);
  if (!(z instanceof Series) || !z.isConstant() || !z.toFraction().equals(0)) {
    throw new EngineError(`${name}: the argument z must be 0 (other values are not q-series)`);
  }
  const x = evaluate(args[1]!, ctx);
  if (!(x instanceof Series) || (x.valExponent()?.compare(0) ?? 1) <= 0) {
    throw new EngineError(`${name}: the nome must be a series with positive valuation`);
  }
  if (which === 1) return Series.constant(frac(0));
  const pw = (e: Fraction | number): Value => vPow(x, Series.constant(new Fraction(e)), ctx);
  const two = Series.constant(frac(2));
  if (which === 2) {
    // 2 sum_(n>=0) x^((n+1/2)^2)
    const s = runInfinite('sum', (n) => pw(n * n + n), 0, null, ctx, name);
    return vMul(two, vMul(pw(frac(1, 4)), s, ctx), ctx);
  }
  const sign = which === 4;
  const s = runInfinite(
    'sum',
    (n) => {
      const t = pw(n * n);
      return sign && n % 2 === 1 ? vNeg(t) : t;
    },
    1,
    null,
    ctx,
    name,
  );
  return vAdd(one(), vMul(two, s, ctx), ctx);
}

/** Generalised binomial coefficient x(x-1)...(x-k+1)/k! for rational x and integer k >= 0. */
function binom(x: Fraction, k: number): Fraction {
  if (k < 0) return frac(0);
  if (k > MAX_TERMS)
    throw new EngineError(`binom: the second argument must be at most ${MAX_TERMS}`);
  let r = frac(1);
  for (let i = 0; i < k; i++) r = r.mul(x.sub(i)).div(i + 1);
  return r;
}

/**
 * Every function name the exact expression language knows. It is the gate of `callFunction`: a
 * name outside it is an unknown function, so a cheap check of names (before a gas is stored)
 * and the engine agree.
 */
export const EXACT_FUNCTIONS: readonly string[] = [
  'sum',
  'prod',
  'qpoch',
  'theta1',
  'theta2',
  'theta3',
  'theta4',
  'abs',
  'binom',
  'factorial',
  'exp',
  'log',
  'pexp',
  'plog',
  'O',
];
const known = new Set(EXACT_FUNCTIONS);

/** Dispatch one function call of the expression language. */
export function callFunction(
  name: string,
  args: readonly MathNode[],
  ctx: EvalContext,
  evaluate: Evaluate,
): Value {
  if (disabled.has(name)) throw new EngineError(`function ${name} is disabled`);
  if (!known.has(name)) throw new EngineError(`unknown function ${name}`);
  const ev = (i: number): Value => evaluate(args[i]!, ctx);
  switch (name) {
    case 'sum':
    case 'prod':
      return indexed(name, args, ctx, evaluate);
    case 'qpoch':
      return qpoch(args, ctx, evaluate);
    case 'theta1':
    case 'theta2':
    case 'theta3':
    case 'theta4':
      return theta(Number(name.slice(5)), args, ctx, evaluate);
    case 'abs':
      arity(name, args, 1);
      return Series.constant(asRational(ev(0), 'abs: the argument').abs());
    case 'binom':
      arity(name, args, 2);
      return Series.constant(
        binom(
          asRational(ev(0), 'binom: the first argument'),
          asInteger(ev(1), 'binom: the second argument'),
        ),
      );
    case 'factorial': {
      arity(name, args, 1);
      const n = asInteger(ev(0), 'factorial: the argument');
      if (n < 0 || n > 10000) throw new EngineError('factorial: the argument must be in 0..10000');
      return Series.constant(new Fraction(factorial(n)));
    }
    case 'exp':
      arity(name, args, 1);
      return vExp(ev(0), ctx);
    case 'log':
      arity(name, args, 1);
      return vLog(ev(0), ctx);
    case 'pexp':
      arity(name, args, 1);
      return plethysticExp(ev(0), ctx);
    case 'plog':
      arity(name, args, 1);
      return plethysticLog(ev(0), ctx);
    case 'O': {
      arity(name, args, 1);
      const m = evaluate(args[0]!, { ...ctx, cap: null }); // the bound itself is never truncated
      if (!(m instanceof Series) || m.order !== null || m.num.length !== 1) {
        throw new EngineError(
          `O(...) takes a single power of ${ctx.variable}, e.g. O(${ctx.variable}^5)`,
        );
      }
      return Series.bigO(m.step.mul(m.start));
    }
    default:
      throw new EngineError(`unknown function ${name}`);
  }
}
