/**
 * Circular functions over Real: sin, cos, tan (reduction modulo pi/2 with as many extra bits as
 * the argument's size and the closeness to a multiple of pi/2 need), sin(pi x) and cos(pi x)
 * (reduced exactly), atan, atan2, asin, acos.
 */
import { EngineError } from '../../errors.js';
import { pi } from '../elementary.js';
import {
  abs,
  add,
  cmp,
  div,
  fromFixed,
  fromInt,
  ldexp,
  magnitude,
  mul,
  neg,
  ONE,
  Real,
  round,
  roundToBigInt,
  sign,
  sqrt,
  sub,
  toFixed,
  toNumber,
  ZERO,
} from '../real.js';

/** a - b without rounding (both exact binary numbers). */
export function exactSub(a: Real, b: Real): Real {
  if (b.m === 0n) return a;
  if (a.m === 0n) return neg(b);
  const lo = Math.min(a.e, b.e);
  const hi = Math.max(magnitude(a), magnitude(b));
  return sub(a, b, hi - lo + 2);
}

/**
 * sin and cos of r with |r| <= 1 at W bits, relative accuracy for both: Taylor series of
 * sin(a)/a and cos(a) in fixed point on a = r / 2^s, then s doublings
 * (sin 2a = 2 sin a cos a, cos 2a = 1 - 2 sin^2 a), each costing at most a few ulps.
 */
function sinCosSmall(r: Real, W: number): [Real, Real] {
  if (r.m === 0n) return [ZERO, ONE];
  const s = Math.max(0, Math.min(Math.floor(Math.sqrt(W) / 2), magnitude(r) + 40));
  const w = W + 8 + Math.ceil(Math.log2(s + 1));
  const a = ldexp(r, -s);
  const one = 1n << BigInt(w);
  const u = toFixed(mul(a, a, w), w); // a^2 in fixed point
  let sinOver = 0n;
  let cosSum = 0n;
  let term = one; // u^k / (2k)!
  for (let k = 0n; term !== 0n; k++) {
    cosSum += k % 2n === 0n ? term : -term;
    const t1 = term / (2n * k + 1n); // u^k / (2k+1)!
    sinOver += k % 2n === 0n ? t1 : -t1;
    term = ((t1 * u) >> BigInt(w)) / (2n * k + 2n);
  }
  let sn = mul(a, fromFixed(sinOver, w), w);
  let cs = fromFixed(cosSum, w);
  for (let i = 0; i < s; i++) {
    const s2 = ldexp(mul(sn, cs, w), 1);
    cs = sub(ONE, ldexp(mul(sn, sn, w), 1), w);
    sn = s2;
  }
  return [sn, cs];
}

/** x = n pi/2 + r with |r| <= pi/4 (about), r with prec bits of relative accuracy; n mod 4. */
function reduceHalfPi(x: Real, prec: number): { n: number; r: Real } {
  if (Math.abs(toNumber(x)) <= 0.785) return { n: 0, r: x };
  const mx = magnitude(x);
  let P = prec + Math.max(0, mx) + 32;
  for (let tries = 0; ; tries++) {
    const halfPi = ldexp(pi(P), -1);
    const nBig = roundToBigInt(div(x, halfPi, Math.max(mx, 0) + 16));
    const r = sub(x, mul(fromInt(nBig), halfPi, P), P);
    // absolute error of r is about 2^(mx - P + 2); need prec + 8 bits below r's leading bit
    const lost = mx - P + 2 + prec + 8 - magnitude(r);
    if (lost <= 0 || tries >= 6 || r.m === 0n) {
      return { n: Number(((nBig % 4n) + 4n) % 4n), r };
    }
    P += lost + 16;
  }
}

function sinCos(x: Real, prec: number): { n: number; s: Real; c: Real } {
  const W = prec + 12;
  const { n, r } = reduceHalfPi(x, W);
  const [s, c] = sinCosSmall(r, W);
  return { n, s, c };
}

/** sin x rounded to prec bits (relative accuracy also next to the zeros k pi). */
export function sin(x: Real, prec: number): Real {
  if (x.m === 0n) return ZERO;
  const { n, s, c } = sinCos(x, prec);
  return round([s, c, neg(s), neg(c)][n]!, prec);
}

/** cos x rounded to prec bits (relative accuracy also next to the zeros pi/2 + k pi). */
export function cos(x: Real, prec: number): Real {
  if (x.m === 0n) return ONE;
  const { n, s, c } = sinCos(x, prec);
  return round([c, neg(s), neg(c), s][n]!, prec);
}

/** tan x rounded to prec bits; EngineError only if x is exactly a pole (never for a binary x). */
export function tan(x: Real, prec: number): Real {
  if (x.m === 0n) return ZERO;
  const { n, s, c } = sinCos(x, prec + 4);
  const [num, den] = n % 2 === 0 ? [s, c] : [c, neg(s)];
  if (den.m === 0n) throw new EngineError('tan: pole');
  return div(num, den, prec);
}

/** sin(pi x): x is first reduced exactly to |f| <= 1/2, so zeros at integers stay relative. */
export function sinPi(x: Real, prec: number): Real {
  const n = roundToBigInt(x);
  const f = exactSub(x, fromInt(n));
  if (f.m === 0n) return ZERO;
  const w = prec + 8;
  const v = sin(mul(pi(w), f, w), prec);
  return n % 2n === 0n ? v : neg(v);
}

/** cos(pi x) = sin(pi (x + 1/2)), the shift exact. */
export function cosPi(x: Real, prec: number): Real {
  return sinPi(exactSub(x, new Real(-1n, -1)), prec);
}

/** atan y for |y| <= 1/8 by the series y * sum (-1)^k y^(2k) / (2k+1) in fixed point. */
function atanSmall(y: Real, W: number): Real {
  const w = W + 8;
  const u = toFixed(mul(y, y, w), w);
  let term = 1n << BigInt(w);
  let sum = 0n;
  for (let k = 0n; term !== 0n; k++) {
    const t = term / (2n * k + 1n);
    sum += k % 2n === 0n ? t : -t;
    term = (term * u) >> BigInt(w);
  }
  return mul(y, fromFixed(sum, w), W);
}

/**
 * atan x rounded to prec bits. |x| > 1 uses atan x = ±pi/2 - atan(1/x); then the half-angle step
 * y -> y / (1 + sqrt(1 + y^2)) brings |y| below 2^-j before the series (j about sqrt(prec)/2).
 */
export function atan(x: Real, prec: number): Real {
  if (x.m === 0n) return ZERO;
  const W = prec + 16;
  if (magnitude(x) > 1 || cmp(abs(x), ONE) > 0) {
    if (magnitude(x) > W + 4) return round(ldexp(sign(x) > 0 ? pi(W) : neg(pi(W)), -1), prec);
    const inner = atan(div(ONE, x, W + 4), W + 4);
    const hp = ldexp(pi(W + 4), -1);
    return round(sub(sign(x) > 0 ? hp : neg(hp), inner, W + 4), prec);
  }
  const target = Math.max(3, Math.floor(Math.sqrt(W) / 2));
  let y = x;
  let halvings = 0;
  const w = W + 8;
  while (magnitude(y) > -target) {
    y = div(y, add(ONE, sqrt(add(ONE, mul(y, y, w), w), w), w), w);
    halvings++;
  }
  return round(ldexp(atanSmall(y, w), halvings), prec);
}

/** atan2(y, x): the angle of the point (x, y) in (-pi, pi]; EngineError at (0, 0). */
export function atan2(y: Real, x: Real, prec: number): Real {
  if (x.m === 0n && y.m === 0n) throw new EngineError('atan2: undefined at (0, 0)');
  const W = prec + 8;
  if (x.m === 0n) return round(ldexp(sign(y) > 0 ? pi(W) : neg(pi(W)), -1), prec);
  if (y.m === 0n) return sign(x) > 0 ? ZERO : pi(prec);
  if (sign(x) > 0) return atan(div(y, x, W), prec);
  const a = atan(div(y, x, W), W);
  return round(sign(y) > 0 ? add(a, pi(W), W) : sub(a, pi(W), W), prec);
}

/** asin x for |x| <= 1 (atan x / sqrt((1 - x)(1 + x)), the factors exact). */
export function asin(x: Real, prec: number): Real {
  if (cmp(abs(x), ONE) > 0) throw new EngineError('asin: the argument must satisfy |x| <= 1');
  const W = prec + 8;
  const d = sqrt(mul(exactSub(ONE, x), exactSub(ONE, neg(x)), W), W);
  if (d.m === 0n) return round(ldexp(sign(x) > 0 ? pi(W) : neg(pi(W)), -1), prec);
  return atan(div(x, d, W), prec);
}

/** acos x for |x| <= 1 (2 atan sqrt((1 - x)/(1 + x)), relative near x = 1). */
export function acos(x: Real, prec: number): Real {
  if (cmp(abs(x), ONE) > 0) throw new EngineError('acos: the argument must satisfy |x| <= 1');
  const W = prec + 8;
  const den = exactSub(ONE, neg(x));
  if (den.m === 0n) return pi(prec);
  return ldexp(atan(sqrt(div(exactSub(ONE, x), den, W), W), prec), 1);
}
