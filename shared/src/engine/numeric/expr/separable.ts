import type { MathNode } from 'mathjs';
import { ddAdd, ddDiv, ddExp, ddMul, R } from '../kernel/double-double.js';

/** A compiled part: writes its double-double value at r[k], r[k + 1] and returns k. */
export type Code = (v: Float64Array, r: Float64Array) => number;

/** What the double-double compiler (compile-dd.ts) lends the factorisation below. */
export interface SeparableContext {
  compile(n: MathNode): Code | null;
  /** Marks c as reading `mask` (bit i: the i-th value) and memoises it when one bit is set. */
  finish(c: Code | null, mask: number): Code | null;
  slot(): number;
  /** The values n reads (bit i: the i-th name), or -1 when it names anything unknown. */
  maskOf(n: MathNode): number;
  binary(fn: 'add' | 'multiply' | 'divide', a: Code, b: Code, k: number): Code;
  negate(a: Code, k: number): Code;
  exp(a: Code, k: number): Code;
}

/** One term of a sum: the values it reads (at most one bit) and how to compile it. */
interface Term {
  mask: number;
  build: () => Code | null;
}

const single = (mask: number): boolean => mask >= 0 && (mask & (mask - 1)) === 0;

/** n as a sum of terms that each read at most one value, or null when it is not one. */
function terms(n: MathNode, ctx: SeparableContext): Term[] | null {
  const mask = ctx.maskOf(n);
  if (mask < 0) return null;
  if (single(mask)) return [{ mask, build: () => ctx.compile(n) }];
  if (n.type === 'ParenthesisNode')
    return terms((n as unknown as { content: MathNode }).content, ctx);
  if (n.type !== 'OperatorNode') return null;
  const { fn, args } = n as unknown as { fn: string; args: MathNode[] };
  const [a, b] = args;
  const negated = (ts: Term[] | null): Term[] | null =>
    ts &&
    ts.map((t) => ({
      mask: t.mask,
      build: () => {
        const c = t.build();
        return c && ctx.finish(ctx.negate(c, ctx.slot()), t.mask);
      },
    }));
  const scaled = (ts: Term[] | null, op: 'multiply' | 'divide', by: MathNode): Term[] | null =>
    ts &&
    ts.map((t) => ({
      mask: t.mask,
      build: () => {
        const c = t.build();
        const s = ctx.compile(by);
        return c && s && ctx.finish(ctx.binary(op, c, s, ctx.slot()), t.mask);
      },
    }));
  const both = (x: Term[] | null, y: Term[] | null): Term[] | null => x && y && [...x, ...y];
  switch (fn) {
    case 'add':
      return both(terms(a!, ctx), terms(b!, ctx));
    case 'subtract':
      return both(terms(a!, ctx), negated(terms(b!, ctx)));
    case 'unaryMinus':
      return negated(terms(a!, ctx));
    case 'unaryPlus':
      return terms(a!, ctx);
    case 'multiply':
      if (ctx.maskOf(a!) === 0) return scaled(terms(b!, ctx), 'multiply', a!);
      if (ctx.maskOf(b!) === 0) return scaled(terms(a!, ctx), 'multiply', b!);
      return null;
    case 'divide':
      return ctx.maskOf(b!) === 0 ? scaled(terms(a!, ctx), 'divide', b!) : null;
    default:
      return null;
  }
}

/**
 * exp(u) or cosh(u) for an argument u = f(x) + g(y) + ... that is a sum of parts each reading one
 * value (such as (x - y)/2): exp(u) = exp(f(x)) exp(g(y)) ..., each factor memoised per value, so
 * that a Nystrom matrix takes one exponential per node instead of one per entry. Where a factor
 * leaves the floating-point range, exp of the summed argument is taken instead. Null when u is
 * not such a sum (the caller compiles the function as usual).
 */
export function factorised(
  name: 'exp' | 'cosh',
  arg: MathNode,
  ctx: SeparableContext,
): { code: Code; mask: number } | null {
  const ts = terms(arg, ctx);
  if (!ts) return null;
  const masks = [...new Set(ts.map((t) => t.mask))];
  if (masks.filter((m) => m !== 0).length < 2) return null;
  const sums: Code[] = [];
  const factors: Code[] = [];
  for (const m of masks) {
    let sum: Code | null = null;
    for (const t of ts.filter((u) => u.mask === m)) {
      const c = t.build();
      if (!c) return null;
      sum = sum ? ctx.finish(ctx.binary('add', sum, c, ctx.slot()), m) : c;
      if (!sum) return null;
    }
    const e = ctx.finish(ctx.exp(sum!, ctx.slot()), m);
    if (!e) return null;
    sums.push(sum!);
    factors.push(e);
  }
  const k = ctx.slot();
  const code: Code = (v, r) => {
    let ph = 1;
    let pl = 0;
    // indexed loops (called per matrix entry: an iterator allocates until optimised)
    for (let q = 0; q < factors.length; q++) {
      const i = factors[q]!(v, r);
      const h = r[i]!;
      // a factor whose low part would leave the normal floating-point range ends the product
      if (!(h > 1e-270 && h < 1e270)) {
        ph = NaN;
        break;
      }
      ddMul(ph, pl, h, r[i + 1]!);
      ph = R[0];
      pl = R[1];
    }
    if (!(ph > 1e-270 && ph < 1e270)) {
      // a factor or the product out of range: the exponential of the whole argument
      let sh = 0;
      let sl = 0;
      for (let q = 0; q < sums.length; q++) {
        const i = sums[q]!(v, r);
        ddAdd(sh, sl, r[i]!, r[i + 1]!);
        sh = R[0];
        sl = R[1];
      }
      // cosh(u) = cosh(|u|); NaN on overflow, which sends the caller to the Real evaluator
      if (name === 'cosh' && sh < 0) ddExp(-sh, -sl);
      else ddExp(sh, sl);
      ph = R[0];
      pl = R[1];
    }
    if (name === 'cosh' && ph < Infinity) {
      ddDiv(1, 0, ph, pl);
      ddAdd(ph, pl, R[0], R[1]);
      ph = 0.5 * R[0];
      pl = 0.5 * R[1];
    }
    r[k] = ph;
    r[k + 1] = pl;
    return k;
  };
  return { code, mask: masks.reduce((a, b) => a | b, 0) };
}
