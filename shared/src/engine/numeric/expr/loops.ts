import type { MathNode } from 'mathjs';
import { EngineError } from '../../errors.js';
import { MAX_TERMS } from '../../limits.js';
import { abs, add, cmp, div, fromInt, magnitude, mul, ONE, Real, sub, ZERO } from '../real.js';
import { integerValue } from './arith.js';
import { notDefined, PointFailure } from './failure.js';
import { arity, Compiled, Compiler, readsOf, Scope } from './types.js';

type Kind = 'sum' | 'prod';

/** Consecutive small, non-increasing terms that end an infinite sum or product. */
const QUIET_RUN = 3;
/** Extra bits of the running sum or product over the working precision. */
const ACC_GUARD = 20;

/** `inf` (1), `-inf` (-1) or null for a finite bound. */
function infinity(node: MathNode): 1 | -1 | null {
  const n = node as unknown as { type: string; name?: string; fn?: string; args?: MathNode[] };
  if (n.type === 'SymbolNode' && n.name === 'inf') return 1;
  if (n.type === 'ParenthesisNode')
    return infinity((node as unknown as { content: MathNode }).content);
  if (n.type === 'OperatorNode' && n.fn === 'unaryMinus' && infinity(n.args![0]!) === 1) return -1;
  return null;
}

/** A bound's integer value, or a failure saying which bound is not an integer. */
function bound(x: Real, what: string): number {
  const n = integerValue(x);
  if (n === null) throw notDefined(`${what} must be an integer`);
  return n;
}

/** Keeps, per loop of the expression, the most terms any evaluation used. */
function recorder(c: Compiler, what: string): (terms: number) => void {
  let entry: { what: string; terms: number } | null = null;
  return (terms) => {
    if (entry === null) {
      entry = { what, terms };
      c.truncations.push(entry);
    } else if (terms > entry.terms) entry.terms = terms;
  };
}

/**
 * An unbounded sum or product of at(k) over the runs given ([start, direction]). It stops once
 * QUIET_RUN consecutive terms are each below 2^-(prec+4) of the running sum (for a product:
 * |factor - 1| below 2^-(prec+4)) and do not increase in size; a zero factor ends a product, and
 * no term counts as small while the sum is still exactly 0. A
 * run that has not stopped after MAX_TERMS terms is a failure, never a hang. Returns the value
 * and the number of terms used; `release` unbinds the index before a failure is raised.
 */
function runInfinite(
  kind: Kind,
  at: (k: number) => Real,
  runs: readonly [number, 1 | -1][],
  c: Compiler,
  what: string,
  release: () => void = () => {},
): [Real, number] {
  const P = c.W + ACC_GUARD;
  const tol = c.prec + 4;
  let acc = kind === 'sum' ? ZERO : ONE;
  let used = 0;
  for (const [start, dir] of runs) {
    let quiet = 0;
    let prev: Real = ZERO;
    for (let k = start, steps = 0; ; k += dir, steps++) {
      if (steps >= MAX_TERMS) {
        release(); // the index value at the give-up point says nothing
        throw new PointFailure(
          `${what} does not converge`,
          `its ${kind === 'sum' ? 'terms are' : 'factors minus 1 are'} not yet below 2^-${tol}` +
            `${kind === 'sum' ? ' of the sum' : ''} after ${MAX_TERMS} terms`,
        );
      }
      if (steps % 64 === 63) c.tick?.();
      const t = at(k);
      used++;
      let size: Real;
      let small: boolean;
      if (kind === 'sum') {
        acc = add(acc, t, P);
        size = abs(t);
        // nothing is small against a sum that is still exactly 0 (leading zero terms)
        small = acc.m !== 0n && (t.m === 0n || magnitude(t) <= magnitude(acc) - tol - 1);
      } else {
        if (t.m === 0n) return [ZERO, used];
        acc = mul(acc, t, P);
        size = abs(sub(t, ONE, P));
        small = size.m === 0n || magnitude(size) <= -tol;
      }
      quiet = !small ? 0 : quiet > 0 && cmp(size, prev) > 0 ? 1 : quiet + 1;
      prev = size;
      if (quiet >= QUIET_RUN) break;
    }
  }
  return [acc, used];
}

/** sum(term, k, from, to) and prod(term, k, from, to); either bound may be infinite. */
export function compileIndexed(
  kind: Kind,
  args: readonly MathNode[],
  scope: Scope,
  c: Compiler,
): Compiled {
  arity(kind, args, 4);
  const [termNode, index, fromNode, toNode] = args as [MathNode, MathNode, MathNode, MathNode];
  const name = (index as unknown as { name?: string }).name;
  if (
    index.type !== 'SymbolNode' ||
    !name ||
    scope.has(name) ||
    ['inf', 'kappa', 'pi', 'e'].includes(name)
  ) {
    throw new EngineError(`${kind}: the second argument must be a new index name`);
  }
  const lo = infinity(fromNode);
  const hi = infinity(toNode);
  if (lo === 1 || hi === -1) throw new EngineError(`${kind}: bounds must run upwards`);
  const slot = c.slotNames.length;
  c.slotNames.push(name);
  const term = c.compile(termNode, new Map(scope).set(name, slot));
  const from = lo === null ? c.compile(fromNode, scope) : null;
  const to = hi === null ? c.compile(toNode, scope) : null;
  const inner = new Set(term.reads);
  inner.delete(slot);
  const reads = readsOf(
    { code: term.code, reads: inner },
    ...(from ? [from] : []),
    ...(to ? [to] : []),
  );
  const tc = term.code;
  const P = c.W + ACC_GUARD;
  const what = `${kind} over ${name}`;
  if (from && to) {
    const fc = from.code;
    const toc = to.code;
    const code: Compiled['code'] = (env) => {
      const a = bound(fc(env), `${kind}: the lower bound`);
      const b = bound(toc(env), `${kind}: the upper bound`);
      if (b - a + 1 > MAX_TERMS) throw notDefined(`${what}: more than ${MAX_TERMS} terms`);
      let acc = kind === 'sum' ? ZERO : ONE;
      for (let k = a; k <= b; k++) {
        if ((k - a) % 64 === 63) c.tick?.();
        env[slot] = fromInt(k);
        const t = tc(env);
        acc = kind === 'sum' ? add(acc, t, P) : mul(acc, t, P);
      }
      env[slot] = undefined;
      return acc;
    };
    return { code, reads };
  }
  const record = recorder(c, what);
  const fc = from?.code;
  const toc = to?.code;
  const code: Compiled['code'] = (env) => {
    const runs: [number, 1 | -1][] = fc
      ? [[bound(fc(env), `${kind}: the lower bound`), 1]]
      : toc
        ? [[bound(toc(env), `${kind}: the upper bound`), -1]]
        : [
            [0, 1],
            [-1, -1],
          ];
    const at = (k: number): Real => {
      env[slot] = fromInt(k);
      return tc(env);
    };
    const release = (): void => {
      env[slot] = undefined;
    };
    const [value, used] = runInfinite(kind, at, runs, c, what, release);
    release();
    record(used);
    return value;
  };
  return { code, reads };
}

/**
 * qpoch(a, x, n) = (a; x)_n = prod_(k=0..n-1) (1 - a x^k) (DLMF 17.2.1); n may be inf (|x| < 1,
 * stopped like prod) or negative: (a; x)_(-m) = 1 / prod_(k=1..m) (1 - a x^(-k)) (DLMF 17.2.3).
 */
export function compileQpoch(args: readonly MathNode[], scope: Scope, c: Compiler): Compiled {
  arity('qpoch', args, 3);
  const a = c.compile(args[0]!, scope);
  const x = c.compile(args[1]!, scope);
  const inf = infinity(args[2]!);
  if (inf === -1) throw new EngineError('qpoch: n must be an integer or inf');
  const P = c.W + ACC_GUARD;
  const ac = a.code;
  const xc = x.code;
  if (inf === 1) {
    const record = recorder(c, 'qpoch');
    const code: Compiled['code'] = (env) => {
      const av = ac(env);
      const xv = xc(env);
      if (cmp(abs(xv), ONE) >= 0) {
        throw new PointFailure('qpoch does not converge', 'qpoch(a, x, inf) needs |x| < 1');
      }
      let xk = ONE;
      const at = (): Real => {
        const f = sub(ONE, mul(av, xk, P), P);
        xk = mul(xk, xv, P);
        return f;
      };
      const [value, used] = runInfinite('prod', at, [[0, 1]], c, 'qpoch');
      record(used);
      return value;
    };
    return { code, reads: readsOf(a, x) };
  }
  const n = c.compile(args[2]!, scope);
  const nc = n.code;
  const code: Compiled['code'] = (env) => {
    const av = ac(env);
    const xv = xc(env);
    const m = bound(nc(env), 'qpoch: n');
    if (Math.abs(m) > MAX_TERMS) throw notDefined(`qpoch: more than ${MAX_TERMS} factors`);
    if (m < 0 && xv.m === 0n) throw new PointFailure('has a pole', 'qpoch with x = 0 and n < 0');
    const step = m >= 0 ? xv : div(ONE, xv, P);
    let xk = m >= 0 ? ONE : step;
    let acc = ONE;
    for (let k = 0; k < Math.abs(m); k++) {
      if (k % 64 === 63) c.tick?.();
      acc = mul(acc, sub(ONE, mul(av, xk, P), P), P);
      xk = mul(xk, step, P);
    }
    if (m >= 0) return acc;
    if (acc.m === 0n) throw new PointFailure('has a pole', 'division by zero');
    return div(ONE, acc, P);
  };
  return { code, reads: readsOf(a, x, n) };
}
