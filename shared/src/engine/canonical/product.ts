import Fraction from 'fraction.js';
import { frac } from '../rational.js';
import { add, mul } from '../series/arith.js';
import { cutAt, Series } from '../series/series.js';

/**
 * Z(0..nMax) from the product form of the grand function over a spectrum: the coefficients of
 * kappa^N in prod_p (1 + kappa c_p) (fermions) or prod_p 1/(1 - kappa c_p) (bosons).
 * `truncated` says the lattice was cut off at the order (omitted c_p lie beyond it).
 */
export function spectrumProduct(
  points: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction | null,
  truncated: boolean,
  tick?: (done: number, total: number) => void,
): Series[] {
  const X: Series[] = [Series.constant(frac(1))];
  for (let j = 1; j <= nMax; j++) X.push(Series.constant(frac(0)));
  let seen = 0;
  for (const c of points) {
    seen++;
    if (fermion) {
      for (let j = Math.min(nMax, seen); j >= 1; j--) {
        if (X[j - 1]!.isZero()) continue;
        X[j] = add(X[j]!, mul(c, X[j - 1]!, cap));
      }
    } else {
      for (let j = 1; j <= nMax; j++) X[j] = add(X[j]!, mul(c, X[j - 1]!, cap));
    }
    tick?.(seen, points.length);
  }
  if (truncated && cap !== null) for (let j = 1; j <= nMax; j++) X[j] = cutAt(X[j]!, cap);
  return X;
}
