import { decimalExponent, formatDecimal, formatError } from './decimal.js';
import { abs, add, cmp, div, fromNumber, isZero, mul, neg, Real, sub, toNumber } from './real.js';

/** A computed number with an estimated absolute error (float64; an estimate, not a proof). */
export interface Estimate {
  value: Real;
  error: number;
}

/**
 * A numeric value in the result format: only determined digits, and the error estimate (the one
 * declaration; `@traceloom/shared/format` re-exports it, and its `isNumericValue` tells it apart).
 */
export interface NumericValueJson {
  real: string;
  error: string;
}

/** |x| as a float64 (0 below the float64 range). */
export function size(x: Real): number {
  return Math.abs(toNumber(x));
}

/** Relative rounding unit of `prec` bits. */
export function ulp(prec: number): number {
  return 2 ** -prec;
}

/** a + b (sign s = +1) or a - b (s = -1), errors added, plus the rounding of the sum. */
export function addEstimates(a: Estimate, b: Estimate, prec: number, s: 1 | -1 = 1): Estimate {
  const value = add(a.value, s > 0 ? b.value : neg(b.value), prec);
  return { value, error: a.error + b.error + size(value) * ulp(prec) };
}

/** a * b with first-order error propagation plus rounding. */
export function mulEstimates(a: Estimate, b: Estimate, prec: number): Estimate {
  const value = mul(a.value, b.value, prec);
  const error =
    size(a.value) * b.error + size(b.value) * a.error + a.error * b.error + size(value) * ulp(prec);
  return { value, error };
}

/** a / b (|b| well above its error). */
export function divEstimates(a: Estimate, b: Estimate, prec: number): Estimate {
  const value = div(a.value, b.value, prec);
  const bb = size(b.value);
  const error =
    (a.error + size(value) * b.error) / Math.max(bb - b.error, bb * 1e-300) +
    size(value) * ulp(prec);
  return { value, error };
}

/** True when a and b agree within their combined error (and a relative slack of `slack`). */
export function agreeWithin(a: Estimate, b: Estimate, slack = 0): boolean {
  const d = size(sub(a.value, b.value, 64));
  return d <= (a.error + b.error) * (1 + 1e-9) + slack * Math.max(size(a.value), size(b.value));
}

/** The more accurate of several estimates of one number. */
export function best(list: readonly Estimate[]): Estimate {
  let b = list[0]!;
  for (const e of list) if (e.error < b.error) b = e;
  return b;
}

/**
 * The largest digit count d <= cap at which both ends of [value - error, value + error] round to
 * the same d significant digits: those digits are then the correct rounding of the true value.
 */
export function shownDigits(e: Estimate, cap: number): number {
  if (isZero(e.value)) return 0;
  if (e.error === 0) return cap;
  const k = decimalExponent(e.value);
  let d = Math.min(cap, Math.floor(k + 1 - Math.log10(2 * e.error)));
  if (d <= 0) return 0;
  const err = fromNumber(e.error);
  const lo = sub(e.value, err, 4096);
  const hi = add(e.value, err, 4096);
  if (cmp(lo, neg(lo)) * cmp(hi, neg(hi)) <= 0) return 0; // the interval holds 0
  for (; d > 0; d--) if (formatDecimal(lo, d) === formatDecimal(hi, d)) return d;
  return 0;
}

/** The result-format text of an estimate, with at most `cap` significant digits. */
export function toNumericJson(e: Estimate, cap: number): NumericValueJson {
  if (isZero(e.value) && e.error === 0) return { real: '0', error: '0' };
  const d = shownDigits(e, cap);
  if (d === 0) return { real: '0', error: formatError(Math.max(e.error, size(abs(e.value)))) };
  return { real: formatDecimal(e.value, d), error: formatError(e.error) };
}

/** An exact number as an estimate with no error. */
export function exact(value: Real): Estimate {
  return { value, error: 0 };
}

/** Value shown to people: `real ± error`. */
export function estimateText(v: NumericValueJson): string {
  return v.error === '0' ? v.real : `${v.real} ± ${v.error}`;
}
