import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import {
  KSeries,
  kAdd,
  kExp,
  kInverse,
  kLog,
  kMul,
  kNeg,
  kPowInt,
  kPowRational,
  kValuation,
} from '../grand/kseries.js';
import { add, div, mul, neg, powInt, sub } from '../series/arith.js';
import { Series } from '../series/series.js';
import { exp, log, powRational } from '../series/transcendental.js';

/** What an expression evaluates to: a q-series (rationals included) or a series in kappa. */
export type Value = Series | KSeries;

/** Evaluation settings shared by every operation of one expression. */
export interface Ring {
  /** Exponent at which every series is truncated (the spec's order); null = exact. */
  cap: Fraction | null;
  /** Highest power of kappa kept. */
  nMax: number;
}

const lift = (x: Value, r: Ring): KSeries => (x instanceof KSeries ? x : KSeries.lift(x, r.nMax));

/** x + y. */
export function vAdd(x: Value, y: Value, r: Ring): Value {
  if (x instanceof Series && y instanceof Series) return add(x, y);
  return kAdd(lift(x, r), lift(y, r));
}

/** x - y. */
export function vSub(x: Value, y: Value, r: Ring): Value {
  if (x instanceof Series && y instanceof Series) return sub(x, y);
  return kAdd(lift(x, r), kNeg(lift(y, r)));
}

/** -x. */
export function vNeg(x: Value): Value {
  return x instanceof Series ? neg(x) : kNeg(x);
}

/** x * y. */
export function vMul(x: Value, y: Value, r: Ring): Value {
  if (x instanceof Series && y instanceof Series) return mul(x, y, r.cap);
  return kMul(lift(x, r), lift(y, r), r.cap);
}

/** x / y. */
export function vDiv(x: Value, y: Value, r: Ring): Value {
  if (x instanceof Series && y instanceof Series) return div(x, y, r.cap);
  return kMul(lift(x, r), kInverse(lift(y, r), r.cap), r.cap);
}

/** x ^ y; y must be an exact rational. */
export function vPow(x: Value, y: Value, r: Ring): Value {
  if (!(y instanceof Series) || !y.isConstant()) {
    throw new EngineError('an exponent must be an exact number (not a series)');
  }
  const e = y.toFraction();
  if (x instanceof Series) {
    return e.d === 1n ? powInt(x, Number(e.s * e.n), r.cap) : powRational(x, e, r.cap);
  }
  return e.d === 1n ? kPowInt(x, Number(e.s * e.n), r.cap) : kPowRational(x, e, r.cap);
}

/** exp(x). */
export function vExp(x: Value, r: Ring): Value {
  return x instanceof Series ? exp(x, r.cap) : kExp(x, r.cap);
}

/** log(x). */
export function vLog(x: Value, r: Ring): Value {
  return x instanceof Series ? log(x, r.cap) : kLog(x, r.cap);
}

/** Lowest exponent present (null: exact zero). */
export function vValuation(x: Value): Fraction | null {
  return x instanceof Series ? x.valExponent() : kValuation(x);
}

/** The exact rational a value stands for, or an error naming what was expected. */
export function asRational(x: Value, what: string): Fraction {
  if (x instanceof Series && x.isConstant()) return x.toFraction();
  throw new EngineError(`${what} must be an exact number`);
}

/** The exact integer a value stands for. */
export function asInteger(x: Value, what: string): number {
  const f = asRational(x, what);
  if (f.d !== 1n) throw new EngineError(`${what} must be an integer`);
  const n = f.s * f.n;
  if (n > BigInt(Number.MAX_SAFE_INTEGER) || -n > BigInt(Number.MAX_SAFE_INTEGER)) {
    throw new EngineError(`${what} is too large`);
  }
  return Number(n);
}
