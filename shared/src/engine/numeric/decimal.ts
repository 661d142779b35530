import { EngineError } from '../errors.js';
import { div, fromInt, magnitude, Real, ZERO } from './real.js';

const DECIMAL = /^\s*([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?\s*$/;

/** 10^k as a Real (exact for k >= 0, rounded to prec bits for k < 0). */
export function pow10(k: number, prec: number): Real {
  if (k >= 0) return fromInt(10n ** BigInt(k));
  return div(fromInt(1), fromInt(10n ** BigInt(-k)), prec);
}

/** Read a decimal text such as "1.25e-3" rounded to prec bits; EngineError when it is not one. */
export function parseDecimal(text: string, prec: number): Real {
  const m = DECIMAL.exec(text);
  if (!m || (m[2] === '' && (m[3] ?? '') === ''))
    throw new EngineError(`cannot read the number ${text}`);
  const frac = m[3] ?? '';
  const digits = BigInt((m[2] || '0') + frac);
  const exp = Number(m[4] ?? '0') - frac.length;
  if (!Number.isFinite(exp) || Math.abs(exp) > 100000) throw new EngineError('number out of range');
  const signed = m[1] === '-' ? -digits : digits;
  if (signed === 0n) return ZERO;
  if (exp >= 0) return new Real(signed * 10n ** BigInt(exp), 0);
  return div(new Real(signed, 0), new Real(10n ** BigInt(-exp), 0), prec);
}

/** floor(log10 |x|) for x != 0 (exact, by a float estimate corrected against powers of ten). */
export function decimalExponent(x: Real): number {
  const mag = magnitude(x);
  let k = Math.floor((mag - 1) * 0.3010299956639812);
  const a = x.m < 0n ? -x.m : x.m;
  // compare |x| = a * 2^e with 10^k, exactly
  const ge = (j: number): boolean => {
    // a * 2^e >= 10^j
    let lhs = a;
    let rhs = 1n;
    if (x.e >= 0) lhs <<= BigInt(x.e);
    else rhs <<= BigInt(-x.e);
    if (j >= 0) rhs *= 10n ** BigInt(j);
    else lhs *= 10n ** BigInt(-j);
    return lhs >= rhs;
  };
  while (!ge(k)) k--;
  while (ge(k + 1)) k++;
  return k;
}

/**
 * x rounded to `digits` significant decimal digits, in the result format's scientific notation
 * ("1.98943678864869169711104704e-2"; "0" for zero). Only call with digits that are determined.
 */
export function formatDecimal(x: Real, digits: number): string {
  if (x.m === 0n) return '0';
  if (digits < 1) throw new RangeError('at least one digit');
  let k = decimalExponent(x);
  // n = round(|x| * 10^(digits - 1 - k)), exactly
  const scaled = (kk: number): bigint => {
    const a = x.m < 0n ? -x.m : x.m;
    const s = digits - 1 - kk;
    let num = a;
    let den = 1n;
    if (s >= 0) num *= 10n ** BigInt(s);
    else den *= 10n ** BigInt(-s);
    if (x.e >= 0) num <<= BigInt(x.e);
    else den <<= BigInt(-x.e);
    return (2n * num + den) / (2n * den);
  };
  let n = scaled(k);
  if (n >= 10n ** BigInt(digits)) {
    k++;
    n = scaled(k);
  }
  const s = n.toString();
  const mant = s.length > 1 ? `${s[0]}.${s.slice(1)}` : s;
  return `${x.m < 0n ? '-' : ''}${mant}${k === 0 ? '' : `e${k}`}`;
}

/** A float64 error bound written with two significant digits, rounded up ("3.1e-30"). */
export function formatError(err: number): string {
  if (err === 0) return '0';
  if (!Number.isFinite(err)) return 'Infinity';
  const k = Math.floor(Math.log10(err));
  let m = Math.ceil((err / 10 ** k) * 10) / 10;
  let kk = k;
  if (m >= 10) {
    m /= 10;
    kk++;
  }
  return `${m.toFixed(1).replace(/\.0$/, '')}e${kk}`;
}

/**
 * Significant digits of x that an absolute error `err` leaves determined: the count d such that
 * err <= half a unit of the d-th digit, at most `cap`. 0 when not even the first digit is known.
 */
export function determinedDigits(x: Real, err: number, cap: number): number {
  if (x.m === 0n) return 0;
  if (err === 0) return cap;
  const k = decimalExponent(x);
  const d = Math.floor(k - Math.log10(2 * err)) + 1;
  return Math.max(0, Math.min(cap, d));
}
