import { EngineError } from '../errors.js';
import {
  add,
  div,
  fromFixed,
  fromInt,
  ldexp,
  magnitude,
  mul,
  ONE,
  Real,
  round,
  sign,
  sub,
  toFixed,
  toNumber,
  ZERO,
} from './real.js';

/** sum_k (-1)^k / ((2k+1) n^(2k+1)) * 2^W (alternating) or without signs (hyperbolic). */
function arctanInverse(n: bigint, W: number, hyperbolic: boolean): bigint {
  const n2 = n * n;
  let power = (1n << BigInt(W)) / n; // 2^W / n^(2k+1)
  let sum = 0n;
  for (let k = 0n; power !== 0n; k++) {
    const term = power / (2n * k + 1n);
    sum += hyperbolic || k % 2n === 0n ? term : -term;
    power /= n2;
  }
  return sum;
}

function cached(compute: (W: number) => bigint): (prec: number) => Real {
  let bits = 0;
  let value = 0n;
  return (prec: number): Real => {
    if (prec + 16 > bits) {
      bits = Math.max(prec + 32, 2 * bits);
      value = compute(bits + 16) >> 16n;
    }
    return round(fromFixed(value, bits), prec);
  };
}

/** pi to prec bits (Machin: 16 atan(1/5) - 4 atan(1/239)); cached. */
export const pi = cached(
  (W) => 16n * arctanInverse(5n, W, false) - 4n * arctanInverse(239n, W, false),
);

/** log 2 to prec bits (2 atanh(1/3)); cached. */
export const ln2 = cached((W) => 2n * arctanInverse(3n, W, true));

/** Largest |x| accepted by exp (beyond it the value leaves any sensible range). */
const EXP_LIMIT = 1e6;

/** e^x rounded to prec bits. */
export function exp(x: Real, prec: number): Real {
  if (x.m === 0n) return ONE;
  const xf = toNumber(x);
  if (Math.abs(xf) > EXP_LIMIT) throw new EngineError('exp: the argument is too large');
  const k = Math.round(xf / Math.LN2);
  const s = Math.max(4, Math.ceil(Math.sqrt(prec) / 2));
  const W = prec + s + 24;
  const r = k === 0 ? x : sub(x, mul(fromInt(k), ln2(W + 32), W + 32), W + 32);
  if (magnitude(r) < -W) return round(ldexp(ONE, k), prec);
  const one = 1n << BigInt(W);
  const bw = BigInt(W);
  const t = toFixed(r, W) >> BigInt(s);
  let term = one;
  let sum = one;
  for (let i = 1n; term !== 0n; i++) {
    term = ((term * t) >> bw) / i;
    sum += term;
  }
  for (let i = 0; i < s; i++) sum = (sum * sum) >> bw;
  return round(ldexp(fromFixed(sum, W), k), prec);
}

/** Natural logarithm of x > 0 rounded to prec bits (Newton-Halley on exp); RangeError otherwise. */
export function log(x: Real, prec: number): Real {
  if (sign(x) <= 0) throw new RangeError('logarithm of a non-positive number');
  if (x.m === 1n << BigInt(-x.e) || (x.e === 0 && x.m === 1n)) return ZERO;
  // x = f * 2^j with f in [1/2, 1)
  const j = magnitude(x);
  const f = ldexp(x, -j);
  let y = fromNumber53(Math.log(toNumber(f)));
  let p = 50;
  const W = prec + 16;
  for (;;) {
    p = Math.min(3 * p, W);
    const ey = exp(y, p + 8);
    y = add(y, div(ldexp(sub(f, ey, p + 8), 1), add(f, ey, p + 8), p + 8), p + 8);
    if (p >= W) break;
  }
  const lj = j === 0 ? ZERO : mul(fromInt(j), ln2(W + 32), W + 32);
  return round(add(y, lj, W), prec);
}

function fromNumber53(v: number): Real {
  if (v === 0) return ZERO;
  const e = Math.floor(Math.log2(Math.abs(v))) - 52;
  return new Real(BigInt(Math.round(v * 2 ** -e)), e);
}

/** Extra bits that cancellation near zero needs (sinh, tanh, expm1-like differences). */
function nearZeroGuard(x: Real): number {
  const m = magnitude(x);
  return m < 0 ? -m + 8 : 8;
}

/** cosh x. */
export function cosh(x: Real, prec: number): Real {
  const w = prec + 8;
  const e = exp(x, w);
  return round(ldexp(add(e, div(ONE, e, w), w), -1), prec);
}

/** sinh x (accurate near 0). */
export function sinh(x: Real, prec: number): Real {
  if (x.m === 0n) return ZERO;
  const w = prec + nearZeroGuard(x);
  const e = exp(x, w);
  return round(ldexp(sub(e, div(ONE, e, w), w), -1), prec);
}

/** tanh x. */
export function tanh(x: Real, prec: number): Real {
  if (x.m === 0n) return ZERO;
  if (Math.abs(toNumber(x)) > prec) return sign(x) > 0 ? ONE : fromInt(-1); // |1 - tanh| < 2^-prec
  const w = prec + nearZeroGuard(x);
  const e2 = exp(ldexp(x, 1), w);
  return round(div(sub(e2, ONE, w), add(e2, ONE, w), w), prec);
}

/** a^b for a > 0 and real b (exp(b log a)). */
export function powReal(a: Real, b: Real, prec: number): Real {
  if (b.m === 0n) return ONE;
  const l = log(a, prec + 16 + Math.max(0, magnitude(b)));
  return exp(mul(b, l, prec + 16 + Math.max(0, magnitude(b))), prec);
}
