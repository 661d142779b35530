import type { FunctionNode, MathNode } from 'mathjs';
import { parseExpression } from '../../expr/sandbox.js';
import { parseDecimal } from '../decimal.js';
import { exp as expReal, pi } from '../elementary.js';
import { ONE } from '../real.js';
import {
  ddAdd,
  ddDiv,
  ddExp,
  ddFromReal,
  ddLog,
  ddMul,
  ddSinh,
  ddSqrt,
  R,
} from '../kernel/double-double.js';
import { type Code, factorised, type SeparableContext } from './separable.js';

/**
 * A fast evaluator of the elementary part of the expression language in double-double (about 104
 * bits): numbers, the bound names, + - * / ^, sqrt, exp, log, cosh, sinh, tanh, abs, pi, e. It
 * exists for kernels, whose Nystrom matrices need tens of thousands of values; an expression
 * with anything else compiles to null and the caller keeps the Real evaluator. A value the fast
 * path cannot give (a pole, a domain error, overflow) is `NaN` in `hi`: the caller then asks the
 * Real evaluator, which names the fault. Cancellation inside the expression is not tracked here
 * any more than in the Real evaluator: callers compare a sample of values with it first.
 */
/** Evaluates into `out[0]` (hi) and `out[1]` (lo) from `values` = [hi_0, lo_0, hi_1, lo_1, ...]. */
export interface FastCompiled {
  evaluate(values: Float64Array, out: Float64Array): void;
}

const UNARY = new Set(['sqrt', 'exp', 'log', 'cosh', 'sinh', 'tanh', 'abs']);

/** Compile `text` over `names` to double-double, or null when it uses anything else. */
export function compileFast(text: string, names: readonly string[]): FastCompiled | null {
  let node: MathNode;
  try {
    node = parseExpression(text);
  } catch {
    return null;
  }
  let slots = 0;
  const slot = (): number => 2 * slots++;
  // which of the caller's values each compiled part reads (bit i: names[i])
  const reads = new Map<Code, number>();
  const readsOf = (c: Code): number => reads.get(c) ?? 0;
  const scratch = new Float64Array(2 * names.length);
  /** A part reading nothing is evaluated once; one reading a single value of several is memoised. */
  const finish = (c: Code | null, mask: number): Code | null => {
    if (!c) return null;
    if (mask === 0) {
      const probe = new Float64Array(2 * (slots + 1));
      const k = c(scratch, probe);
      if (Number.isNaN(probe[k]!)) return c;
      return constant(probe[k]!, probe[k + 1]!, slot());
    }
    const out =
      names.length >= 2 && (mask & (mask - 1)) === 0 ? memo(c, Math.log2(mask), slot()) : c;
    reads.set(out, mask);
    return out;
  };
  const compile = (n: MathNode): Code | null => {
    // each compiled node writes its value at r[k], r[k + 1] and returns k
    switch (n.type) {
      case 'ParenthesisNode':
        return compile((n as unknown as { content: MathNode }).content);
      case 'ConstantNode': {
        const v = (n as unknown as { value: unknown }).value;
        const text = typeof v === 'number' ? String(v) : String(v);
        if (!/^[0-9.eE+-]+$/.test(text)) return null;
        ddFromReal(parseDecimal(text, 220));
        return constant(R[0], R[1], slot());
      }
      case 'SymbolNode': {
        const name = (n as unknown as { name: string }).name;
        const i = names.indexOf(name);
        if (i >= 0) {
          const k = slot();
          const c: Code = (v, r) => {
            r[k] = v[2 * i]!;
            r[k + 1] = v[2 * i + 1]!;
            return k;
          };
          reads.set(c, 1 << i);
          return c;
        }
        if (name === 'pi') ddFromReal(pi(220));
        else if (name === 'e') ddFromReal(expReal(ONE, 220));
        else return null;
        return constant(R[0], R[1], slot());
      }
      case 'OperatorNode': {
        const op = n as unknown as { fn: string; args: MathNode[] };
        const parts = op.args.map(compile);
        if (parts.some((p) => p === null)) return null;
        const [ca, cb] = parts as Code[];
        const mask = (parts as Code[]).reduce((m, p) => m | readsOf(p), 0);
        const k = slot();
        switch (op.fn) {
          case 'add':
          case 'subtract':
          case 'multiply':
          case 'divide':
            return finish(binary(op.fn, ca!, cb!, k), mask);
          case 'pow':
            return finish(power(ca!, cb!, k), mask);
          case 'unaryMinus':
            return finish((v, r) => {
              const i = ca!(v, r);
              r[k] = -r[i]!;
              r[k + 1] = -r[i + 1]!;
              return k;
            }, mask);
          case 'unaryPlus':
            return ca!;
          default:
            return null;
        }
      }
      case 'FunctionNode': {
        const fn = n as FunctionNode;
        const name = (fn.fn as unknown as { name?: string }).name ?? '';
        if (!UNARY.has(name) || fn.args.length !== 1) return null;
        if ((name === 'exp' || name === 'cosh') && names.length >= 2) {
          const f = factorised(name, fn.args[0]!, separable);
          if (f) {
            reads.set(f.code, f.mask);
            return f.code;
          }
        }
        const a = compile(fn.args[0]!);
        if (!a) return null;
        return finish(unary(name, a, slot()), readsOf(a));
      }
      default:
        return null;
    }
  };
  const maskOf = (n: MathNode): number => {
    let mask = 0;
    let unknown = false;
    n.traverse((c) => {
      if (c.type !== 'SymbolNode') return;
      const i = names.indexOf((c as unknown as { name: string }).name);
      if (i >= 0) mask |= 1 << i;
      else if (!['pi', 'e', ...UNARY].includes((c as unknown as { name: string }).name))
        unknown = true;
    });
    return unknown ? -1 : mask;
  };
  const separable: SeparableContext = {
    compile,
    finish,
    slot,
    maskOf,
    binary: (fn, a, b, k) => binary(fn, a, b, k),
    negate: (a, k) => (v, r) => {
      const i = a(v, r);
      r[k] = -r[i]!;
      r[k + 1] = -r[i + 1]!;
      return k;
    },
    exp: (a, k) => unary('exp', a, k),
  };
  const root = compile(node);
  if (!root) return null;
  const regs = new Float64Array(2 * slots);
  return {
    evaluate(values, out) {
      const k = root(values, regs);
      out[0] = regs[k]!;
      out[1] = regs[k + 1]!;
    },
  };
}

/** Most values one memoised part keeps (a Nystrom grid has far fewer distinct points). */
const MEMO_LIMIT = 8192;

/** c's value kept per value of the one caller's value it reads (slot `i`), copied to slot k. */
function memo(c: Code, i: number, k: number): Code {
  const cache = new Map<number, Float64Array>();
  // the last value asked for (a matrix row repeats its x), then the map
  const last = new Float64Array([NaN, NaN, 0, 0]);
  return (v, r) => {
    const xh = v[2 * i]!;
    const xl = v[2 * i + 1]!;
    if (xh === last[0] && xl === last[1]) {
      r[k] = last[2]!;
      r[k + 1] = last[3]!;
      return k;
    }
    const hit = cache.get(xh);
    let h: number;
    let l: number;
    if (hit !== undefined && hit[0] === xl) {
      h = hit[1]!;
      l = hit[2]!;
    } else {
      const j = c(v, r);
      h = r[j]!;
      l = r[j + 1]!;
      if (cache.size >= MEMO_LIMIT) cache.clear();
      cache.set(xh, Float64Array.of(xl, h, l));
    }
    last[0] = xh;
    last[1] = xl;
    last[2] = h;
    last[3] = l;
    r[k] = h;
    r[k + 1] = l;
    return k;
  };
}

function constant(hi: number, lo: number, k: number) {
  return (_v: Float64Array, r: Float64Array): number => {
    r[k] = hi;
    r[k + 1] = lo;
    return k;
  };
}

function binary(fn: string, a: Code, b: Code, k: number): Code {
  return (v, r) => {
    const i = a(v, r);
    const j = b(v, r);
    const ah = r[i]!;
    const al = r[i + 1]!;
    const bh = r[j]!;
    const bl = r[j + 1]!;
    if (fn === 'add') ddAdd(ah, al, bh, bl);
    else if (fn === 'subtract') ddAdd(ah, al, -bh, -bl);
    else if (fn === 'multiply') ddMul(ah, al, bh, bl);
    else if (bh === 0) {
      r[k] = NaN;
      r[k + 1] = 0;
      return k;
    } else ddDiv(ah, al, bh, bl);
    r[k] = R[0];
    r[k + 1] = R[1];
    return k;
  };
}

function power(a: Code, b: Code, k: number): Code {
  return (v, r) => {
    const i = a(v, r);
    const j = b(v, r);
    let ah = r[i]!;
    let al = r[i + 1]!;
    const bh = r[j]!;
    if (r[j + 1] === 0 && Number.isInteger(bh) && Math.abs(bh) <= 64) {
      // integer power by squaring (a negative one inverted at the end)
      let n = Math.abs(bh);
      let ph = 1;
      let pl = 0;
      while (n > 0) {
        if (n & 1) {
          ddMul(ph, pl, ah, al);
          ph = R[0];
          pl = R[1];
        }
        n >>= 1;
        if (n > 0) {
          ddMul(ah, al, ah, al);
          ah = R[0];
          al = R[1];
        }
      }
      if (bh < 0) {
        if (ph === 0) {
          r[k] = NaN;
          r[k + 1] = 0;
          return k;
        }
        ddDiv(1, 0, ph, pl);
        ph = R[0];
        pl = R[1];
      }
      r[k] = ph;
      r[k + 1] = pl;
      return k;
    }
    if (!(ah > 0)) {
      r[k] = NaN;
      r[k + 1] = 0;
      return k;
    }
    ddLog(ah, al);
    ddMul(R[0], R[1], bh, r[j + 1]!);
    ddExp(R[0], R[1]);
    r[k] = R[0];
    r[k + 1] = R[1];
    return k;
  };
}

function unary(name: string, a: Code, k: number): Code {
  return (v, r) => {
    const i = a(v, r);
    const xh = r[i]!;
    const xl = r[i + 1]!;
    if ((name === 'sqrt' && xh < 0) || (name === 'log' && !(xh > 0))) {
      r[k] = NaN;
      r[k + 1] = 0;
      return k;
    }
    if (name === 'abs') {
      r[k] = xh < 0 ? -xh : xh;
      r[k + 1] = xh < 0 ? -xl : xl;
      return k;
    }
    if (name === 'sqrt') ddSqrt(xh, xl);
    else if (name === 'exp') ddExp(xh, xl);
    else if (name === 'log') ddLog(xh, xl);
    else hyperbolic(name as 'cosh' | 'sinh' | 'tanh', xh, xl);
    r[k] = R[0];
    r[k + 1] = R[1];
    return k;
  };
}

/** cosh, sinh, tanh into R (sinh by its series near 0, where e^x - e^-x cancels). */
function hyperbolic(name: 'cosh' | 'sinh' | 'tanh', xh: number, xl: number): void {
  if (name === 'cosh') {
    ddExp(xh, xl);
    const eh = R[0];
    const el = R[1];
    ddDiv(1, 0, eh, el);
    ddAdd(eh, el, R[0], R[1]);
    ddMul(R[0], R[1], 0.5, 0);
    return;
  }
  ddSinh(xh, xl);
  if (name === 'sinh') return;
  const sh = R[0];
  const sl = R[1];
  hyperbolic('cosh', xh, xl);
  ddDiv(sh, sl, R[0], R[1]);
}
