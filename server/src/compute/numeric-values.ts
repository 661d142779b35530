import Fraction from 'fraction.js';
import { rowsText, type ComputeResult, type ValueJson } from '@traceloom/shared/engine';

/** A value of a result: a series `{order, terms}` or (numeric mode) a number `{real, error}`. */
export type AnyValue = ComputeResult['canonical'][number]['value'];

/** A numeric value: `real` holds only determined digits, `error` the estimated absolute error. */
export type NumericValue = Exclude<AnyValue, ValueJson>;

/** A row verdict of a result's checks, series or numeric. */
export type AnyRowVerdict = NonNullable<ComputeResult['grandCheck']>[number];
export type AnyWeightVerdict = NonNullable<ComputeResult['impliedWeights']>[number];

/** A numeric verdict: compared within `tolerance`, the combined error of both sides. */
export type NumericVerdict = Extract<AnyRowVerdict | AnyWeightVerdict, { tolerance: string }>;

/** True for `{real, error}` (numeric mode) as opposed to a series `{order, terms}`. */
export function isNumericValue(v: unknown): v is NumericValue {
  return typeof v === 'object' && v !== null && 'real' in v && 'error' in v;
}

/** True for a verdict of the numeric checks (it states its tolerance). */
export function isNumericVerdict(v: object): v is NumericVerdict {
  return 'tolerance' in v;
}

/** True when a result was computed in numeric mode. */
export function isNumericResult(r: Pick<ComputeResult, 'spec' | 'numeric'>): boolean {
  return r.numeric !== undefined || r.spec.precision !== undefined;
}

/** A numeric value for people: `real ± error` (the error left out when it is 0). */
export function numericText(v: NumericValue): string {
  return v.error === '0' ? v.real : `${v.real} ± ${v.error}`;
}

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

/** "a", "a and b", "a, b and c". */
function listText(items: string[]): string {
  return items.length < 2
    ? (items[0] ?? '')
    : `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`;
}

/**
 * The order a series table is truncated at: the spec's order when any row is truncated, null when
 * every row is exact (or the table is numeric).
 */
export function seriesOrder(r: Pick<ComputeResult, 'spec' | 'canonical'>): string | null {
  const truncated = r.canonical.some((c) => !isNumericValue(c.value) && c.value.order !== null);
  return truncated ? (r.spec.order ?? null) : null;
}

/**
 * One sentence of what is known about a result's values, for dataset headers and exports:
 * exact, a series to O(x^k) (with the rows not determined), or numeric with the requested digits and how errors were estimated.
 */
export function knownSentence(r: Pick<ComputeResult, 'spec' | 'numeric' | 'canonical'>): string {
  if (isNumericResult(r)) {
    const n = r.numeric;
    const digits = n?.precision ?? r.spec.precision;
    const at = Object.entries(r.spec.at ?? {})
      .map(([k, v]) => `${k} = ${v}`)
      .join(', ');
    const how =
      n && n.points.length > 0
        ? `comparing resolutions of the kernel (${listText(n.points.map(String))} points; ${n.rule}) and the rounding of every operation`
        : 'evaluating at two working precisions and the rounding of every operation';
    return `numeric${at ? ` at ${at}` : ''}, ${digits} digits requested, errors estimated by ${how} (an estimate, not a bound)`;
  }
  const cut = seriesOrder(r);
  if (cut === null) return 'exact (every coefficient determined)';
  const x = r.spec.variable;
  const pw = (e: string): string => `${x}^${/^\d+$/.test(e) ? e : `(${e})`}`;
  // the lowest order of any row: a row's order may lie below the spec's (negative exponents)
  const orders = r.canonical.flatMap((c) =>
    !isNumericValue(c.value) && c.value.order !== null ? [c.value.order] : [],
  );
  const low = orders.reduce((a, b) => (new Fraction(b).compare(a) < 0 ? b : a), cut);
  const reach =
    low === cut
      ? `series to O(${pw(cut)}): every coefficient below ${pw(cut)} determined`
      : `series to O(${pw(cut)}), some rows only to O(${pw(low)}): each row says its own order`;
  const open = r.canonical.filter((c) => c.determined === false).map((c) => c.N);
  return open.length > 0
    ? `${reach}; Z(N) for N = ${rowsText(open)} not determined at this order`
    : reach;
}
