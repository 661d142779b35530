/**
 * Numeric-mode values of the result format (`{real, error}`) and how the screens print them,
 * without the engine. `real` holds only determined digits; the screens never add one.
 */

import type { NumericValueJson } from '../engine/numeric/estimate.js';

/** A numeric value: determined digits in `real` ("0" when none), estimated absolute `error`. */
export type { NumericValueJson };

/** The route names of a numeric canonical row. */
export type NumericRoute = 'recursion' | 'fredholm' | 'product' | 'classSum';

/** A closed form found for Z(N) by integer-relation search over the spec's basis. */
export interface RecognizedJson {
  expression: string;
  latex: string;
  height: number;
  digitsToSpare: number;
}

/** What a numeric canonical row carries beyond N, value, routes and agrees. */
export interface NumericRowExtras {
  routeValues?: Partial<Record<NumericRoute, NumericValueJson>>;
  recognized?: RecognizedJson | null;
  recognizeNote?: string;
}

/** `result.numeric`: the precision and how the errors were estimated. */
export interface NumericInfoJson {
  precision: number;
  workingBits?: number;
  errorEstimate?: string;
  rule?: string;
  points?: number | number[];
  parity?: boolean | string;
}

/**
 * True for the numeric value form `{real, error}` (as opposed to the series form `{order,
 * terms}`). The one guard the client uses wherever it renders a value.
 */
export function isNumericValue(v: unknown): v is NumericValueJson {
  return (
    typeof v === 'object' &&
    v !== null &&
    typeof (v as { real?: unknown }).real === 'string' &&
    typeof (v as { error?: unknown }).error === 'string'
  );
}

interface Decimal {
  sign: '' | '-';
  /** All significant digits, no point. */
  digits: string;
  /** Decimal exponent of the first digit. */
  exp: number;
}

const DECIMAL = /^\s*([-+]?)(\d*)(?:\.(\d*))?(?:[eE]([-+]?\d+))?\s*$/;

function parseDecimal(text: string): Decimal | null {
  const m = DECIMAL.exec(text);
  if (!m || (m[2] === '' && (m[3] ?? '') === '')) return null;
  const intPart = m[2] ?? '';
  const frac = m[3] ?? '';
  const all = intPart + frac;
  const lead = all.search(/[1-9]/);
  if (lead < 0) return { sign: '', digits: '', exp: 0 };
  const digits = all.slice(lead);
  const exp = Number(m[4] ?? '0') + intPart.length - 1 - lead;
  return { sign: m[1] === '-' ? '-' : '', digits, exp };
}

/** Rounds a digit string to `keep` digits (half up); returns the digits and an exponent bump. */
function roundDigits(digits: string, keep: number): { digits: string; bump: number } {
  if (keep >= digits.length) return { digits, bump: 0 };
  const head = digits.slice(0, keep).split('').map(Number);
  if (Number(digits[keep]) >= 5) {
    let i = keep - 1;
    while (i >= 0 && head[i] === 9) head[i--] = 0;
    if (i < 0) return { digits: `1${head.join('')}`, bump: 1 };
    head[i]! += 1;
  }
  return { digits: head.join(''), bump: 0 };
}

/**
 * The digits of `v.real` that `v.error` leaves determined (a digit of unit u is kept while
 * error <= u/2, the engine's rule), rounded; normally `v.real` itself, since the engine sends
 * only determined digits, but the screens check rather than trust. Returns the decimal parts or
 * null for zero / no determined digit.
 */
function determined(v: NumericValueJson): Decimal | null {
  const d = parseDecimal(v.real);
  if (!d || d.digits === '') return null;
  const err = Number(v.error);
  if (!(err > 0)) return d;
  if (!Number.isFinite(err)) return null;
  const keep = Math.min(d.digits.length, Math.floor(d.exp - Math.log10(2 * err)) + 1);
  if (keep <= 0) return null;
  const r = roundDigits(d.digits, keep);
  return { sign: d.sign, digits: r.digits, exp: d.exp + r.bump };
}

/** Groups of five from the decimal point outwards: `98943 67886 4`. */
function groupFives(s: string, fromRight: boolean, sep: string): string {
  const out: string[] = [];
  if (fromRight) {
    for (let end = s.length; end > 0; end -= 5) out.unshift(s.slice(Math.max(0, end - 5), end));
  } else {
    for (let i = 0; i < s.length; i += 5) out.push(s.slice(i, i + 5));
  }
  return out.join(sep);
}

/** Mantissa and exponent of a determined value: `1.98943…` and -2 (scientific form). */
function mantissa(d: Decimal, sep: string | null): string {
  const first = d.digits[0] ?? '0';
  const rest = d.digits.slice(1);
  if (rest === '') return `${d.sign}${first}`;
  return `${d.sign}${first}.${sep === null ? rest : groupFives(rest, false, sep)}`;
}

/** Numbers of moderate size are written without an exponent (`12.5`, `0.0412`). */
function positional(d: Decimal, sep: string | null): string | null {
  if (d.exp < -3 || d.exp > 5) return null;
  const g = (s: string, right: boolean) => (sep === null ? s : groupFives(s, right, sep));
  if (d.exp < 0) {
    return `${d.sign}0.${g('0'.repeat(-d.exp - 1) + d.digits, false)}`;
  }
  const intPart = d.digits.slice(0, d.exp + 1).padEnd(d.exp + 1, '0');
  const frac = d.digits.slice(d.exp + 1);
  return `${d.sign}${g(intPart, true)}${frac ? `.${g(frac, false)}` : ''}`;
}

/**
 * The determined digits of a numeric value as plain text, without the error:
 * `1.98943678864869169711104704e-2`, `0.25`, or `0` when not even the first digit is known.
 * `group` puts a space between groups of five digits (for reading, not for pasting).
 */
export function numericDigits(v: NumericValueJson, group = false): string {
  const d = determined(v);
  if (!d) return '0';
  const sep = group ? ' ' : null;
  const plain = positional(d, sep);
  if (plain !== null) return plain;
  return `${mantissa(d, sep)}e${d.exp}`;
}

/** The error as written in the result (`3e-30`), or `0` for an exact value. */
export function numericError(v: NumericValueJson): string {
  return v.error.trim() === '' ? '0' : v.error.trim();
}

/**
 * A numeric value as plain text with its error: `1.98943 67886 48691 69711 10470 4e-2 ± 3e-30`
 * (grouped) or ungrouped for pasting; `0 ± 3e-30` when no digit is determined; the digits alone
 * when the error is 0 (exact).
 */
export function numericText(v: NumericValueJson, group = false): string {
  const err = numericError(v);
  const digits = numericDigits(v, group);
  return Number(err) === 0 ? digits : `${digits} ± ${err}`;
}

function texExp(exp: string | number): string {
  return `10^{${Number(exp)}}`;
}

/** An error `3e-30` in LaTeX: `3 \times 10^{-30}`. */
export function errorTex(err: string): string {
  const m = /^([\d.]+)[eE]([-+]?\d+)$/.exec(err);
  if (!m) return err;
  return m[1] === '1' ? texExp(m[2]!) : `${m[1]} \\times ${texExp(m[2]!)}`;
}

/**
 * A numeric value in LaTeX with thin spaces between groups of five:
 * `1.98943\,67886 \times 10^{-2} \pm 3 \times 10^{-30}`; `maxDigits` cuts the shown digits
 * (with `\ldots`, never rounding up a digit that was not determined); `withError` false leaves
 * out the `\pm` part (for a table with an error column).
 */
export function numericTex(v: NumericValueJson, maxDigits = Infinity, withError = true): string {
  const d = determined(v);
  const err = numericError(v);
  const pm = Number(err) === 0 || !withError ? '' : ` \\pm ${errorTex(err)}`;
  if (!d) return `0${pm}`;
  const cut = d.digits.length > maxDigits;
  const shown: Decimal = cut ? { ...d, digits: d.digits.slice(0, maxDigits) } : d;
  const body = (positional(shown, '\\,') ?? mantissa(shown, '\\,')) + (cut ? '\\ldots' : '');
  const exp = positional(shown, null) === null ? ` \\times ${texExp(shown.exp)}` : '';
  return `${body}${exp}${pm}`;
}

/**
 * Natural log of |real| for plots, from the decimal text (so 1e-500 does not underflow);
 * NaN when no digit is determined.
 */
export function numericLog(v: NumericValueJson): number {
  const d = determined(v);
  if (!d) return NaN;
  const head = Number(`${d.digits[0]}.${d.digits.slice(1, 17) || '0'}`);
  return Math.log(head) + d.exp * Math.LN10;
}

/** The value as a float64 (NaN when undetermined), for sorting and plots only. */
export function numericNumber(v: NumericValueJson): number {
  const d = determined(v);
  if (!d) return NaN;
  return Number(`${d.sign}${d.digits[0]}.${d.digits.slice(1) || '0'}e${d.exp}`);
}
