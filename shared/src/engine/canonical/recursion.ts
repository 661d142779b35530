import Fraction from 'fraction.js';
import { frac } from '../rational.js';
import { add, mul, neg, scale } from '../series/arith.js';
import { Series } from '../series/series.js';

/**
 * The canonical table Z(0..nMax) by the Newton recursion N Z(N) = sum_(L=1..N) s^(L-1) Z_L Z(N-L),
 * s = -1 fermions, +1 bosons. Every product is cut at `cap`, so no coefficient beyond the order is
 * ever computed; products of series with large valuation are short.
 */
export function newtonRecursion(
  weights: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction | null,
  tick?: (done: number, total: number) => void,
): Series[] {
  const Z: Series[] = [Series.constant(frac(1))];
  for (let N = 1; N <= nMax; N++) {
    let acc = Series.constant(frac(0));
    for (let L = 1; L <= N; L++) {
      const term = mul(weights[L - 1]!, Z[N - L]!, cap);
      acc = add(acc, fermion && L % 2 === 0 ? neg(term) : term);
    }
    Z.push(scale(acc, frac(1, N)));
    tick?.(N, nMax);
  }
  return Z;
}
