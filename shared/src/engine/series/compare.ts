import { align, Series } from './series.js';

/** First coefficient where two values differ, as exact rational strings. */
export interface Mismatch {
  exponent: string;
  expected: string;
  found: string;
}

/** Outcome of comparing two values within their common known range. */
export interface Verdict {
  agrees: boolean;
  /** Exponent below which every coefficient agrees; null when both are exact and equal. */
  agreesBelow: string | null;
  firstMismatch: Mismatch | null;
}

/**
 * Compare `found` with `expected` coefficient by coefficient, only where both are determined.
 */
export function compareSeries(expected: Series, found: Series): Verdict {
  const [a, b] = align(expected, found);
  const order =
    a.order === null ? b.order : b.order === null ? a.order : Math.min(a.order, b.order);
  const lo = Math.min(
    a.num.length ? a.start : Infinity,
    b.num.length ? b.start : Infinity,
    order ?? Infinity,
  );
  let hi = Math.max(a.start + a.num.length, b.start + b.num.length);
  if (order !== null) hi = Math.min(hi, order);
  for (let i = lo; i < hi; i++) {
    const x = a.coeffAt(i)!;
    const y = b.coeffAt(i)!;
    if (!x.equals(y)) {
      return {
        agrees: false,
        agreesBelow: a.step.mul(i).toFraction(),
        firstMismatch: {
          exponent: a.step.mul(i).toFraction(),
          expected: x.toFraction(),
          found: y.toFraction(),
        },
      };
    }
  }
  return {
    agrees: true,
    agreesBelow: order === null ? null : a.step.mul(order).toFraction(),
    firstMismatch: null,
  };
}

/** True when the two agree wherever both are determined. */
export function agreeWhereKnown(a: Series, b: Series): boolean {
  return compareSeries(a, b).agrees;
}
