import type { MathNode } from 'mathjs';
import { EngineError } from '../../errors.js';
import { MAX_TERMS } from '../../limits.js';
import { DISABLED_FUNCTIONS } from '../../expr/sandbox.js';
import { cosh, exp, log, sinh, tanh } from '../elementary.js';
import { abs, cmp, div, fromInt, mul, mulInt, ONE, Real, sign, sqrt, sub, ZERO } from '../real.js';
import { integerValue } from './arith.js';
import { notDefined, overflow, pole } from './failure.js';
import { compileIndexed, compileQpoch } from './loops.js';
import * as special from '../special/index.js';
import { arity, Compiled, Compiler, readsOf, Scope } from './types.js';

type Fn1 = (x: Real, W: number) => Real;
type Fn2 = (x: Real, y: Real, W: number) => Real;

const disabled = new Set<string>(DISABLED_FUNCTIONS);

function exponential(x: Real, W: number): Real {
  try {
    return exp(x, W);
  } catch (e) {
    if (e instanceof EngineError) throw overflow(e.message);
    throw e;
  }
}

/** Where exp grows past the accepted range, cosh and sinh do too. */
const viaExp =
  (f: Fn1): Fn1 =>
  (x, W) => {
    try {
      return f(x, W);
    } catch (e) {
      if (e instanceof EngineError) throw overflow(e.message);
      throw e;
    }
  };

function logarithm(x: Real, W: number): Real {
  const s = sign(x);
  if (s === 0) throw pole('log of 0');
  if (s < 0) throw notDefined('log of a negative number');
  return log(x, W);
}

function squareRoot(x: Real, W: number): Real {
  if (sign(x) < 0) throw notDefined('sqrt of a negative number');
  return sqrt(x, W);
}

/** n! for an integer 0 <= n <= 10000, rounded products carrying 16 extra bits. */
function factorial(x: Real, W: number): Real {
  const n = integerValue(x);
  if (n === null || n < 0 || n > 10000) {
    throw notDefined('factorial takes an integer 0..10000 (gamma(x + 1) takes any other x)');
  }
  let r = ONE;
  for (let i = 2; i <= n; i++) r = mulInt(r, i, W + 16);
  return r;
}

/** Generalised binomial coefficient x(x-1)...(x-k+1)/k! for real x and integer k (0 for k < 0). */
function binom(x: Real, kr: Real, W: number): Real {
  const k = integerValue(kr);
  if (k === null) throw notDefined('binom: the second argument must be an integer');
  if (k < 0) return ZERO;
  if (k > MAX_TERMS) throw notDefined(`binom: the second argument must be at most ${MAX_TERMS}`);
  const p = W + 20;
  let r = ONE;
  for (let i = 0; i < k; i++) r = div(mul(r, sub(x, fromInt(i), p), p), fromInt(i + 1), p);
  return r;
}

/** gamma, refusing its poles at 0, -1, -2, ... */
function gammaFn(x: Real, W: number): Real {
  const n = integerValue(x);
  if (n !== null && n <= 0) throw pole('gamma at a non-positive integer');
  return special.gamma(x, W);
}

/** zeta, refusing its pole at 1. */
function zetaFn(x: Real, W: number): Real {
  if (cmp(x, ONE) === 0) throw pole('zeta at 1');
  return special.zeta(x, W);
}

/** K(k), refusing its logarithmic pole at k = 1. */
function ellipticK(k: Real, W: number): Real {
  if (cmp(k, ONE) === 0) throw pole('ellk at modulus 1');
  return special.ellipticK(k, W);
}

/** Functions of one argument. */
const UNARY: Record<string, Fn1> = {
  sqrt: squareRoot,
  exp: exponential,
  log: logarithm,
  sinh: viaExp(sinh),
  cosh: viaExp(cosh),
  tanh,
  abs: (x) => abs(x),
  factorial,
  sin: special.sin,
  cos: special.cos,
  tan: special.tan,
  atan: special.atan,
  gamma: gammaFn,
  zeta: zetaFn,
  ai: special.airyAi,
  ellk: ellipticK,
  elle: special.ellipticE,
  nome: special.nomeOfModulus,
  modulus: special.modulusOfNome,
};

const theta =
  (which: 1 | 2 | 3 | 4): Fn2 =>
  (z, q, W) =>
    special.theta(which, z, q, W);

/** Functions of two arguments. */
const BINARY: Record<string, Fn2> = {
  binom,
  theta1: theta(1),
  theta2: theta(2),
  theta3: theta(3),
  theta4: theta(4),
};

/** Every function name the numeric expression language knows. */
export const NUMERIC_FUNCTIONS: readonly string[] = [
  ...Object.keys(UNARY),
  ...Object.keys(BINARY),
  'sum',
  'prod',
  'qpoch',
];

/** Compile one call `name(args...)` of the numeric expression language. */
export function compileCall(
  name: string,
  args: readonly MathNode[],
  scope: Scope,
  c: Compiler,
): Compiled {
  if (disabled.has(name)) throw new EngineError(`function ${name} is disabled`);
  if (name === 'O') {
    throw new EngineError(
      'O(...) has no meaning in numeric mode: the values are numbers, not series',
    );
  }
  if (name === 'sum' || name === 'prod') return compileIndexed(name, args, scope, c);
  if (name === 'qpoch') return compileQpoch(args, scope, c);
  const W = c.W;
  const unary = UNARY[name];
  if (unary) {
    arity(name, args, 1);
    const f = unary;
    const a = c.compile(args[0]!, scope);
    const code = a.code;
    return { code: (env) => f(code(env), W), reads: a.reads };
  }
  const binary = BINARY[name];
  if (binary) {
    arity(name, args, 2);
    const f = binary;
    const a = c.compile(args[0]!, scope);
    const b = c.compile(args[1]!, scope);
    const ca = a.code;
    const cb = b.code;
    return { code: (env) => f(ca(env), cb(env), W), reads: readsOf(a, b) };
  }
  throw new EngineError(`unknown function ${name}`);
}
