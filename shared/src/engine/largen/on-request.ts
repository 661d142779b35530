import type Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { KSeries } from '../grand/kseries.js';
import { frac } from '../rational.js';
import { toValueJson } from '../series/format.js';
import { coarsen, Series } from '../series/series.js';
import { plethysticLog } from './plethystic.js';
import { productForm } from './product.js';
import type { GrandProductJson, SeriesProductJson } from './types.js';

/** Exponents computed for a product form asked for from a screen (kept quick to answer). */
export const ON_REQUEST_EXPONENTS = 1000;

/**
 * The product form of any determined, non-zero q-series f (a canonical row, a cycle weight):
 * f = c q^v prod_{n>=1} (1 - q^n)^(-a_n), with the leading term c q^v divided out first so that the
 * product has constant term 1. `what` names the series in messages (e.g. `Z(3)`).
 */
export function seriesProductForm(
  f: Series,
  what: string,
  maxComputed = ON_REQUEST_EXPONENTS,
): SeriesProductJson {
  if (f.num.length === 0) {
    throw new EngineError(
      f.order === null
        ? `${what} is exactly 0: it has no product form`
        : `${what} is not determined at this order (no coefficient below ${f.orderExponent()!.toFraction()}): it has no product form`,
    );
  }
  const lead = f.num[0]!;
  let order = f.order === null ? null : f.order - f.start;
  // The grid the known terms live on; an order off that grid (a row known to O(q^(111/2)) whose
  // terms are integer powers) is cut down to it, so the exponents are not listed on a finer grid
  // full of zeros. Only the a_n between the cut and the old order are given up.
  const g = termGrid(f.num);
  if (order !== null && g > 1) order -= order % g;
  const unit = Series.of(f.step, 0, [...f.num], lead, order);
  return {
    of: what,
    leadingExponent: f.step.mul(f.start).toFraction(),
    leadingCoefficient: frac(lead, f.den).toFraction(),
    product: productForm(coarsen(unit), Infinity, maxComputed),
  };
}

/**
 * The grand function Xi(kappa) = sum_N Z(N) kappa^N (Z(0) = 1) as a double product
 * prod_{N>=1} prod_n (1 - kappa^N q^n)^(-a_(N,n)): c_N(q) = sum_n a_(N,n) q^n is the coefficient of
 * kappa^N in the plethystic logarithm of Xi, for N = 1..nMax, each known to the order the table
 * gives it. Says where the c_N vanish (a finite product in kappa on the known range).
 */
export function grandProductForm(Z: readonly Series[], cap: Fraction | null): GrandProductJson {
  const nMax = Z.length - 1;
  if (nMax < 1) throw new EngineError('the grand function needs at least the row N = 1');
  const z0 = Z[0]!;
  if (!(z0.isConstant() && z0.toFraction().equals(1))) {
    throw new EngineError('the grand function needs Z(0) = 1 exactly');
  }
  const pl = plethysticLog(new KSeries(Z, nMax), { cap, nMax });
  if (pl instanceof Series) throw new EngineError('internal: the plethystic logarithm lost kappa');
  const factors = [];
  for (let N = 1; N <= nMax; N++) factors.push({ N, value: toValueJson(pl.at(N)) });
  const zeroFrom = firstZeroTail(pl, nMax);
  let pattern: string | null = null;
  let patternNote: string;
  if (zeroFrom === null) {
    patternNote = `c_N is non-zero at N = ${nMax}: no finite product in kappa on the known range (N = 1..${nMax})`;
  } else if (zeroFrom === 1) {
    pattern = 'c_N = 0 for every N';
    patternNote = `every c_N vanishes on the known range (N = 1..${nMax})`;
  } else {
    pattern = `c_N = 0 for N > ${zeroFrom - 1}`;
    patternNote =
      `a finite product in kappa on the known range: c_N vanishes to its known order for ` +
      `N = ${zeroFrom}..${nMax}` +
      (2 * (zeroFrom - 1) <= nMax ? '' : ' (few rows beyond: weak evidence)');
  }
  return { of: 'Xi', factors, pattern, patternNote };
}

/** First N from which every c_N up to nMax has no coefficient below its order; null if c_nMax has. */
function firstZeroTail(pl: KSeries, nMax: number): number | null {
  let from: number | null = null;
  for (let N = nMax; N >= 1; N--) {
    if (pl.at(N).num.length > 0) break;
    from = N;
  }
  return from;
}

/** The gcd of the grid indices of the non-zero terms (relative to the first), 0 for one term. */
function termGrid(num: readonly bigint[]): number {
  let g = 0;
  for (let i = 1; i < num.length && g !== 1; i++) {
    if (num[i] === 0n) continue;
    let a = g;
    let b = i;
    while (b) [a, b] = [b, a % b];
    g = a;
  }
  return g;
}
