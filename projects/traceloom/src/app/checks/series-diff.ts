import { rationalNumber } from '@traceloom/shared/format';

/** A series value of the result format: exponent/coefficient pairs, `order` null when exact. */
export interface SeriesJson {
  order: string | null;
  terms: [string, string][];
}

/** One exponent of a side-by-side comparison. */
export interface DiffLine {
  exponent: string;
  /** The coefficient, '0' when the term is absent, null when this side does not determine it. */
  computed: string | null;
  supplied: string | null;
  /** differs: both determined and unequal; agrees: both determined and equal; else not compared. */
  state: 'agrees' | 'differs' | 'not compared';
}

function coefficient(value: SeriesJson, exponent: string): string | null {
  if (value.order !== null && rationalNumber(exponent) >= rationalNumber(value.order)) return null;
  return value.terms.find(([e]) => e === exponent)?.[1] ?? '0';
}

/**
 * The two sides of a row term by term: every exponent at which either side has a term (and each
 * side's order, where the other side is still determined), in increasing order. Coefficients are
 * exact rational strings in lowest terms, so equal numbers are equal strings. Every differing
 * coefficient is marked, not only the first; beyond either side's order nothing is compared.
 */
export function seriesDiff(computed: SeriesJson, supplied: SeriesJson): DiffLine[] {
  const exponents = new Map<string, number>();
  for (const [e] of [...computed.terms, ...supplied.terms]) exponents.set(e, rationalNumber(e));
  return [...exponents]
    .sort((a, b) => a[1] - b[1])
    .map(([exponent]) => {
      const c = coefficient(computed, exponent);
      const s = coefficient(supplied, exponent);
      const state = c === null || s === null ? 'not compared' : c === s ? 'agrees' : 'differs';
      return { exponent, computed: c, supplied: s, state };
    });
}
