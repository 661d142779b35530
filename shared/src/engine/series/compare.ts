import { align, Series } from './series.js';

/** First coefficient where the computed and the supplied value differ, as rational strings. */
export interface Mismatch {
  exponent: string;
  computed: string;
  supplied: string;
}

/** Outcome of comparing two values within their common known range. */
export interface Verdict {
  agrees: boolean;
  /** Exponent below which every coefficient agrees; null when both are exact and equal. */
  agreesBelow: string | null;
  firstMismatch: Mismatch | null;
}

/**
 * Compare the `supplied` value with the `computed` one coefficient by coefficient, only where
 * both are determined.
 */
export function compareSeries(computed: Series, supplied: Series): Verdict {
  const [a, b] = align(computed, supplied);
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
          computed: x.toFraction(),
          supplied: y.toFraction(),
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
