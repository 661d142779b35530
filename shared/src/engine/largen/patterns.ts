import type Fraction from 'fraction.js';
import { fitPolynomial, polyText } from './fit.js';

/** Highest polynomial degree tried for a_n. */
const MAX_DEGREE = 3;

/**
 * A pattern in a_1, a_2, ... (index k = 1, 2, ..., exponent n = k * step) that holds on every
 * known index: a polynomial in the index of degree <= 3 with at least two indices beyond the ones
 * it is solved from, else the shortest period p seen at least twice (p <= known / 2). Null with a
 * note when neither holds: nothing is guessed beyond the data.
 */
export function describePattern(
  a: readonly Fraction[],
  step: Fraction,
): { pattern: string | null; note: string } {
  const name = step.equals(1) ? 'n' : 'k';
  const known = a.length;
  const where = step.equals(1)
    ? `on every known n (n = 1..${known})`
    : `on every known k (k = 1..${known}, n = k*${step.toFraction()})`;
  if (known === 0) return { pattern: null, note: 'no exponent is determined' };
  const points = a.map((y, i) => ({ N: i + 1, y }));
  const poly = fitPolynomial(points, MAX_DEGREE, 2);
  if (poly) {
    return {
      pattern: `a_${name} = ${polyText(poly.coeffs, name)}`,
      note: `polynomial in ${name}, holds ${where}`,
    };
  }
  let last = known - 1;
  while (last >= 0 && a[last]!.equals(0)) last--;
  if (last >= 0 && 2 * (last + 1) <= known) {
    return {
      pattern: `a_n = 0 for n > ${step.mul(last + 1).toFraction()}`,
      note: `a finite product on the known range: holds ${where}`,
    };
  }
  for (let p = 1; 2 * p <= known; p++) {
    let ok = true;
    for (let i = p; i < known && ok; i++) ok = a[i]!.equals(a[i - p]!);
    if (ok) {
      const values = a
        .slice(0, p)
        .map((x) => x.toFraction())
        .join(', ');
      return {
        pattern: `a_${name} periodic with period ${p}: ${values} (${name} = 1..${p} mod ${p})`,
        note: `periodic, holds ${where}`,
      };
    }
  }
  return {
    pattern: null,
    note: `no polynomial of degree <= ${MAX_DEGREE} and no period <= ${Math.floor(known / 2)} holds ${where}`,
  };
}
