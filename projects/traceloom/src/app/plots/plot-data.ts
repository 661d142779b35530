import type { CanonicalRowJson } from '@traceloom/shared/engine';
import { isNumericValue, rationalNumber } from '@traceloom/shared/format';

/** A point of a plot. */
export interface Point {
  x: number;
  y: number;
}

/**
 * log10 |coefficient| against exponent for one Z(N): the growth of the q-series coefficients.
 * Logarithms of exact rationals are taken from the numerator and denominator separately, so huge
 * integers do not overflow to Infinity.
 */
export function coefficientPoints(row: CanonicalRowJson): Point[] {
  if (isNumericValue(row.value)) return [];
  return row.value.terms.map(([e, c]) => ({ x: rationalNumber(e), y: log10Abs(c) }));
}

/** Valuation (lowest exponent with a non-zero coefficient) of Z(N) against N. */
export function valuationPoints(rows: readonly CanonicalRowJson[]): Point[] {
  return rows.flatMap((r) =>
    !isNumericValue(r.value) && r.value.terms.length > 0
      ? [{ x: r.N, y: rationalNumber(r.value.terms[0]![0]) }]
      : [],
  );
}

/** log10 of |p/q| for a rational string of any size. */
export function log10Abs(text: string): number {
  const [num, den = '1'] = text.replace(/^[-+]/, '').split('/');
  return log10Digits(num!) - log10Digits(den);
}

function log10Digits(digits: string): number {
  const d = digits.replace(/^0+/, '') || '0';
  if (d === '0') return -Infinity;
  const head = Number(`${d.slice(0, 15)}`);
  return Math.log10(head) + Math.max(0, d.length - 15);
}
