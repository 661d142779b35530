import { EngineError } from '../../errors.js';
import { powReal } from '../elementary.js';
import { div, magnitude, ONE, powInt, Real, sign, ZERO } from '../real.js';
import { notDefined, overflow, pole } from './failure.js';

/** Largest binary magnitude a value may reach (|x| < 2^MAX_MAGNITUDE) before it counts as overflow. */
export const MAX_MAGNITUDE = 1 << 24;

/** The value of x when it is an integer of safe size, else null. */
export function integerValue(x: Real): number | null {
  if (x.m === 0n) return 0;
  if (x.e >= 0) {
    if (magnitude(x) > 53) return null;
    return Number(x.m) * 2 ** x.e;
  }
  const k = BigInt(-x.e);
  if ((x.m & ((1n << k) - 1n)) !== 0n) return null;
  const n = x.m >> k;
  return n > BigInt(Number.MAX_SAFE_INTEGER) || -n > BigInt(Number.MAX_SAFE_INTEGER)
    ? null
    : Number(n);
}

/** x itself, or an overflow failure when |x| is beyond 2^MAX_MAGNITUDE. */
export function checked(x: Real): Real {
  if (magnitude(x) > MAX_MAGNITUDE) throw overflow(`the value exceeds 2^${MAX_MAGNITUDE}`);
  return x;
}

/** a / b; division by zero is a pole. */
export function divide(a: Real, b: Real, W: number): Real {
  if (b.m === 0n) throw pole('division by zero');
  return div(a, b, W);
}

/** a^n for an integer n (squaring); 0 to a negative power is a pole. */
export function powInteger(a: Real, n: number, W: number): Real {
  if (n === 0) return ONE;
  if (a.m === 0n) {
    if (n > 0) return ZERO;
    throw pole('0 to a negative power');
  }
  const mag = magnitude(a);
  // log2 |a^n| is at least n (mag - 1) for n > 0 and n mag for n < 0
  const low = n > 0 ? n * (mag - 1) : n * mag;
  if (low > MAX_MAGNITUDE) throw overflow(`the power exceeds 2^${MAX_MAGNITUDE}`);
  return powInt(a, n, W);
}

/** a^b: integer exponents by squaring, other exponents as exp(b log a) for a > 0. */
export function power(a: Real, b: Real, W: number): Real {
  const n = integerValue(b);
  if (n !== null) return powInteger(a, n, W);
  const s = sign(a);
  if (s === 0) {
    if (sign(b) > 0) return ZERO;
    throw pole('0 to a negative power');
  }
  if (s < 0) throw notDefined('a negative number to a non-integer power');
  try {
    return powReal(a, b, W);
  } catch (e) {
    if (e instanceof EngineError) throw overflow(`the power is too large (${e.message})`);
    throw e;
  }
}
