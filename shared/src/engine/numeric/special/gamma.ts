/**
 * The gamma function for real x: Stirling's series for log Gamma (DLMF 5.11.1) with exact
 * Bernoulli numbers, after shifting the argument up to z >= 0.12 W (so that the smallest term of
 * the asymptotic series, about e^(-2 pi z), lies below 2^-W), the recurrence Gamma(x + 1) =
 * x Gamma(x) back down (DLMF 5.5.1), and reflection Gamma(x) Gamma(1 - x) = pi / sin(pi x)
 * (DLMF 5.5.3) for x < 1/2.
 */
import { EngineError } from '../../errors.js';
import { exp, log, pi } from '../elementary.js';
import {
  abs,
  add,
  cmp,
  div,
  fromFraction,
  fromInt,
  ldexp,
  magnitude,
  mul,
  ONE,
  Real,
  round,
  sub,
  toNumber,
  ZERO,
} from '../real.js';
import { bernoulli2n } from './bernoulli.js';
import { exactSub, sinPi } from './trig.js';

/** x as a BigInt when it is an integer, else null. */
export function asInteger(x: Real): bigint | null {
  if (x.e >= 0) return x.m << BigInt(x.e);
  const k = BigInt(-x.e);
  return x.m % (1n << k) === 0n ? x.m >> k : null;
}

const HALF = new Real(1n, -1);
let logTwoPiCache: { bits: number; value: Real } = { bits: 0, value: ZERO };

/** log(2 pi)/2, cached at the largest precision asked. */
function halfLogTwoPi(W: number): Real {
  if (logTwoPiCache.bits < W) {
    const bits = Math.max(W + 32, 2 * logTwoPiCache.bits);
    logTwoPiCache = { bits, value: ldexp(log(ldexp(pi(bits + 8), 1), bits), -1) };
  }
  return round(logTwoPiCache.value, W);
}

/**
 * Stirling's series log Gamma(z) = (z - 1/2) log z - z + log(2 pi)/2 + sum_k B_2k / (2k (2k-1)
 * z^(2k-1)) for z >= 0.12 abs + 2, with absolute error below 2^-abs.
 */
function stirling(z: Real, abs: number): Real {
  const zf = toNumber(z);
  const W = abs + 8 + Math.ceil(Math.log2(zf * Math.log(zf) + 2));
  let sum = add(sub(mul(sub(z, HALF, W), log(z, W), W), z, W), halfLogTwoPi(W), W);
  const zinv = div(ONE, z, W);
  const zinv2 = mul(zinv, zinv, W);
  let power = zinv; // z^-(2k-1)
  for (let k = 1; ; k++) {
    const [bn, bd] = bernoulli2n(k);
    const term = mul(fromFraction(bn, bd * BigInt(2 * k * (2 * k - 1)), W), power, W);
    sum = add(sum, term, W);
    if (magnitude(term) < -abs - 4) break;
    power = mul(power, zinv2, W);
  }
  return sum;
}

/** The shift N that brings x up to the range of Stirling's series at abs bits. */
function shiftFor(x: Real, abs: number): number {
  const z0 = Math.ceil(0.12 * abs) + 2;
  const xf = toNumber(x);
  return xf >= z0 ? 0 : Math.ceil(z0 - xf);
}

/** x (x+1) ... (x+N-1) at W bits. */
function rising(x: Real, N: number, W: number): Real {
  let p = ONE;
  for (let i = 0; i < N; i++) p = mul(p, add(x, fromInt(i), W), W);
  return p;
}

/** Gamma(x) for x >= 1/2 at prec bits. */
function gammaPositive(x: Real, prec: number): Real {
  const W = prec + 12;
  const N = shiftFor(x, W);
  const z = N === 0 ? x : add(x, fromInt(N), W + magnitude(x) + 8);
  const g = exp(stirling(z, W), W);
  return N === 0 ? round(g, prec) : div(g, rising(x, N, W + 8), prec);
}

/** (n - 1)! exactly, for small positive integers. */
function factorial(n: bigint): bigint {
  let f = 1n;
  for (let i = 2n; i < n; i++) f *= i;
  return f;
}

function checkPole(x: Real, name: string): bigint | null {
  const n = asInteger(x);
  if (n !== null && n <= 0n) throw new EngineError(`${name}: pole at x = ${n}`);
  return n;
}

/**
 * Gamma(x) for real x, rounded to prec bits; EngineError 'gamma: pole at x = -2' at the poles
 * 0, -1, -2, ... Positive integers up to 3000 are exact factorials rounded once.
 */
export function gamma(x: Real, prec: number): Real {
  const n = checkPole(x, 'gamma');
  if (n !== null && n <= 3000n) return round(fromInt(factorial(n)), prec);
  if (cmp(x, HALF) >= 0) return gammaPositive(x, prec);
  const W = prec + 10;
  const s = sinPi(x, W);
  const g = gammaPositive(exactSub(ONE, x), W);
  return div(pi(W), mul(s, g, W), prec);
}

/**
 * log |Gamma(x)| for real x (not a pole), rounded to prec bits; accurate in absolute terms next
 * to its zeros x = 1, 2 (where it returns 0 exactly), relative elsewhere.
 */
export function lgamma(x: Real, prec: number): Real {
  const n = checkPole(x, 'lgamma');
  if (n === 1n || n === 2n) return ZERO;
  const W = prec + 12 + Math.max(0, Math.ceil(Math.log2(Math.abs(toNumber(x)) + 1)) + 4);
  if (cmp(x, HALF) >= 0) {
    const N = shiftFor(x, W);
    const z = N === 0 ? x : add(x, fromInt(N), W + magnitude(x) + 8);
    const l = stirling(z, W);
    return N === 0 ? round(l, prec) : sub(l, log(rising(x, N, W + 8), W), prec);
  }
  // log|Gamma(x)| = log pi - log|sin(pi x)| - log Gamma(1 - x)
  const s = abs(sinPi(x, W));
  const rest = lgamma(exactSub(ONE, x), W);
  return sub(sub(log(pi(W), W), log(s, W), W), rest, prec);
}
