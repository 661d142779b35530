import type { ComputeResult, ValueJson } from '@traceloom/shared/engine';

/** A value of a result: a series `{order, terms}` or (numeric mode) a number `{real, error}`. */
export type AnyValue = ComputeResult['canonical'][number]['value'];

/** A numeric value: `real` holds only determined digits, `error` the estimated absolute error. */
export type NumericValue = Exclude<AnyValue, ValueJson>;

/** A row verdict of a result's checks, series or numeric. */
export type AnyRowVerdict = NonNullable<ComputeResult['grandCheck']>[number];
export type AnyWeightVerdict = NonNullable<ComputeResult['impliedWeights']>[number];

export { isNumericResult, isNumericValue, isNumericVerdict } from '@traceloom/shared/format';

const DECIMAL = /^\s*([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?\s*$/;

/** A decimal text as an exact scaled integer: value = mantissa * 10^exponent. */
export interface ScaledDecimal {
  mantissa: bigint;
  exponent: number;
}

/** Reads a decimal literal ("1.25e-3", "-0.5", "42") exactly; null when it is not one. */
export function parseDecimal(text: string): ScaledDecimal | null {
  const m = DECIMAL.exec(text);
  if (!m || (m[2] === '' && (m[3] ?? '') === '')) return null;
  const frac = m[3] ?? '';
  const digits = `${m[2]}${frac}`.replace(/^0+(?=\d)/, '');
  const exp = Number(m[4] ?? '0') - frac.length;
  if (!Number.isSafeInteger(exp) || Math.abs(exp) > 10_000) return null;
  const mantissa = BigInt(digits || '0');
  return { mantissa: m[1] === '-' ? -mantissa : mantissa, exponent: exp };
}

/** a and b brought to one exponent (the smaller), as integers. */
function aligned(a: ScaledDecimal, b: ScaledDecimal): [bigint, bigint] {
  const e = Math.min(a.exponent, b.exponent);
  return [a.mantissa * 10n ** BigInt(a.exponent - e), b.mantissa * 10n ** BigInt(b.exponent - e)];
}

const abs = (x: bigint): bigint => (x < 0n ? -x : x);

/** Half a unit of the last printed digit of a decimal: its rounding to the digits shown. */
function halfUnit(d: ScaledDecimal): ScaledDecimal {
  return { mantissa: 5n, exponent: d.exponent - 1 };
}

/** a + b exactly. */
function plus(a: ScaledDecimal, b: ScaledDecimal): ScaledDecimal {
  const [x, y] = aligned(a, b);
  return { mantissa: x + y, exponent: Math.min(a.exponent, b.exponent) };
}

/**
 * True when two numeric values agree within their combined error. A value's `real` is its
 * digits rounded to the last one shown, so each side is known to its error plus half a unit of
 * its last printed digit; |a - b| is computed exactly on the decimal texts (a relative slack of
 * 1e-9 allows for the rounding of the error estimates to one or two digits).
 */
export function agreeWithinError(a: NumericValue, b: NumericValue): boolean {
  const [ra, rb, ea, eb] = [a.real, b.real, a.error, b.error].map(parseDecimal);
  if (!ra || !rb || !ea || !eb) return a.real === b.real && a.error === b.error;
  const [x, y] = aligned(ra, rb);
  const diff: ScaledDecimal = {
    mantissa: abs(x - y),
    exponent: Math.min(ra.exponent, rb.exponent),
  };
  const tol = plus(plus(ea, eb), plus(halfUnit(ra), halfUnit(rb)));
  const [d, tl] = aligned(diff, tol);
  return d * 1_000_000_000n <= tl * 1_000_000_001n;
}

/** Significant digits a numeric value shows (its determined digits). */
export function shownDigits(v: NumericValue): number {
  const mant = v.real
    .replace(/^[+-]/, '')
    .replace(/[eE].*$/, '')
    .replace('.', '');
  return mant.replace(/^0+/, '').length;
}
