import type { LargeNJson, ValueJson } from '@traceloom/shared/engine';
import Fraction from 'fraction.js';

/** A canonical row as far as normalizing it goes. */
interface RowLike {
  N: number;
  value: unknown;
}

const isSeriesValue = (v: unknown): v is ValueJson =>
  typeof v === 'object' && v !== null && Array.isArray((v as ValueJson).terms);

/** q^(-e) v / c for the leading term c q^e of v (exact; the order moves with the exponents). */
function divideByLead(v: ValueJson): ValueJson {
  const first = v.terms[0];
  if (!first) return v;
  const e0 = new Fraction(first[0]);
  const c0 = new Fraction(first[1]);
  return {
    order: v.order === null ? null : new Fraction(v.order).sub(e0).toFraction(),
    terms: v.terms.map(([e, c]) => [
      new Fraction(e).sub(e0).toFraction(),
      new Fraction(c).div(c0).toFraction(),
    ]),
  };
}

/**
 * The canonical rows normalized as the large-N analysis found (q^(-e(N)) Z(N) / c(N), with e(N)
 * the leading exponent fitted and verified on every row of its class), or null when the block has
 * no fitted normalization (a given one is an expression the client does not evaluate). Rows
 * outside every class (N = 0, rows with no known term) are left as they are.
 */
export function normalizedCanonicalRows<R extends RowLike>(
  rows: readonly R[],
  block: Partial<LargeNJson> | null | undefined,
): R[] | null {
  const classes = block?.classes;
  if (!classes?.length || classes.some((c) => c.normalizationDetail.source !== 'fitted'))
    return null;
  const inClass = new Set(classes.flatMap((c) => c.rows));
  return rows.map((r) =>
    inClass.has(r.N) && isSeriesValue(r.value) ? { ...r, value: divideByLead(r.value) } : r,
  );
}
