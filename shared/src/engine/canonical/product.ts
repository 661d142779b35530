import Fraction from 'fraction.js';
import {
  findRationalFactor,
  mulTruncRational,
  mulTruncStrided,
  rationalCost,
  type RationalFactor,
} from '../series/multiply.js';
import { gcdInt, lcm } from '../integers.js';
import { frac } from '../rational.js';
import { add, mul } from '../series/arith.js';
import { cutAt, gridIndex, Series, stepGcd } from '../series/series.js';

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
  const packed = cap === null ? null : productOnArrays(points, nMax, fermion, cap, tick);
  const X = packed ?? productBySeries(points, nMax, fermion, cap, tick);
  if (truncated && cap !== null) for (let j = 1; j <= nMax; j++) X[j] = cutAt(X[j]!, cap);
  return X;
}

/** The product in series arithmetic (any exponents, exact or truncated); exported for tests. */
export function productBySeries(
  points: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction | null,
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
  return X;
}

/**
 * The same product on integer arrays over one grid, accumulated in place: Y_j = D^j X_j with D
 * the common denominator of the c_p. Each c_p Y_(j-1) starts at the valuation of Y_(j-1), so the
 * work shrinks as the valuations grow; the factors are taken in order of falling valuation. Null when some c_p has negative exponents.
 */
function productOnArrays(
  points: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction,
  tick?: (done: number, total: number) => void,
): Series[] | null {
  let step = cap;
  for (const c of points) step = stepGcd(step, c.step);
  const cs = points.map((c) => c.onStep(step));
  if (cs.some((c) => c.num.length > 0 && c.start < 0)) return null;
  // no lattice point below the order (e.g. a sector whose spectrum lies beyond it): M = cap / step
  let M = cs.length === 0 ? Number(cap.div(step).valueOf()) : gridIndex(cs[0]!, cap)[1];
  let D = 1n;
  for (const c of cs) {
    D = lcm(D, c.den);
    if (c.order !== null) M = Math.min(M, c.order);
  }
  const Y: bigint[][] = [];
  const val: number[] = [];
  for (let j = 0; j <= nMax; j++) {
    Y.push(new Array<bigint>(M).fill(0n));
    val.push(Infinity);
  }
  if (M > 0) {
    Y[0]![0] = 1n;
    val[0] = 0;
  }
  // Y_j += C * Y_(j-1), only below M; C's coefficient at cStart + i * stride is coarse[i]
  const step1 = (f: Factor, j: number): void => {
    const v = val[j - 1]!;
    const lo = f.start + v;
    if (lo >= M) return;
    const src = Y[j - 1]!.slice(v, M - f.start);
    const prod = factorTimes(f, src, M - lo);
    const dst = Y[j]!;
    for (let i = 0; i < prod.length; i++) {
      const x = prod[i]!;
      if (x !== 0n) dst[lo + i]! += x;
    }
    if (lo < val[j]!) {
      let k = lo;
      while (k < M && dst[k] === 0n) k++;
      val[j] = Math.min(val[j]!, k === M ? Infinity : k);
    }
  };
  // highest valuation first: the partial products' valuations then stay high for as long as
  // possible, and every term of Y_(j-1) c_p at or beyond the order is skipped (the product is
  // commutative, so the order of the factors does not change the result)
  const byValuation = [...cs].sort((a, b) => b.val - a.val);
  let seen = 0;
  for (const c of byValuation) {
    seen++;
    if (c.num.length === 0 || c.start >= M) continue;
    const f = factorOf(c.num.slice(0, M - c.start), D / c.den, c.start);
    if (fermion) for (let j = Math.min(nMax, seen); j >= 1; j--) step1(f, j);
    else for (let j = 1; j <= nMax; j++) step1(f, j);
    tick?.(seen, points.length);
  }
  const order = cs.some((c) => c.order !== null) || cs.length > 0 ? M : null;
  return Y.map((y, j) =>
    j === 0 ? Series.constant(frac(1)) : Series.of(step, 0, y, D ** BigInt(j), order),
  );
}

/**
 * One c_p scaled to the common denominator, on the coarsest grid of its offsets: its
 * coefficient at exponent index start + i * stride is coarse[i] (zero elsewhere), and `rational`
 * is coarse as P(y) / Q(y), y = x^stride, when its coefficients satisfy a short recurrence (a
 * c_p = q^a / (1 + q^a)^2 does: Q = (1 + y)^2).
 */
interface Factor {
  coarse: bigint[];
  stride: number;
  start: number;
  rational: RationalFactor | null;
}

function factorOf(num: readonly bigint[], f: bigint, start: number): Factor {
  let stride = 0;
  for (let i = 1; i < num.length && stride !== 1; i++)
    if (num[i] !== 0n) stride = gcdInt(stride, i);
  if (stride === 0) stride = 1;
  const coarse: bigint[] = [];
  for (let i = 0; i < num.length; i += stride) coarse.push(f === 1n ? num[i]! : num[i]! * f);
  return { coarse, stride, start, rational: findRationalFactor(coarse) };
}

/**
 * First n coefficients of the factor (without its offset) times b: through P / Q when that costs
 * fewer operations than the factor's terms below x^n would (the schoolbook product pays each term
 * on about half the length, the recurrence its terms of P and Q on the whole length), else by
 * `mulTruncStrided`. Both are exact; which one runs changes no digit.
 */
function factorTimes(f: Factor, b: readonly bigint[], n: number): bigint[] {
  const terms = Math.min(f.coarse.length, Math.ceil(n / f.stride));
  const r = f.rational;
  if (r !== null && n <= r.length * f.stride && 2 * rationalCost(r) < terms)
    return mulTruncRational(r, f.stride, b, n);
  return mulTruncStrided(f.coarse, f.stride, b, n);
}
