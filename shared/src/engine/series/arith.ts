import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { MAX_NUMBER_BITS, MAX_POWER, MAX_TERMS_PER_SERIES } from '../limits.js';
import { frac, numer } from '../rational.js';
import { mulTrunc } from './multiply.js';
import { align, gridIndex, Series, truncate } from './series.js';

const minOrder = (a: number | null, b: number | null): number | null =>
  a === null ? b : b === null ? a : Math.min(a, b);

/** The cap as a grid index on `s`'s grid (refining `s` when needed), or null. */
function capOn(s: Series, cap: Fraction | null): [Series, number | null] {
  return cap === null ? [s, null] : gridIndex(s, cap);
}

/** a + b; known up to the smaller order. */
export function add(a: Series, b: Series): Series {
  if (b.isZero()) return a;
  if (a.isZero()) return b;
  [a, b] = align(a, b);
  const order = minOrder(a.order, b.order);
  const lo = Math.min(a.num.length ? a.start : Infinity, b.num.length ? b.start : Infinity);
  if (lo === Infinity) return Series.of(a.step, 0, [], 1n, order);
  let hi = Math.max(a.start + a.num.length, b.start + b.num.length);
  if (order !== null) hi = Math.min(hi, order);
  if (hi <= lo) return Series.of(a.step, 0, [], 1n, order);
  const g = a.den === b.den ? a.den : a.den * b.den;
  const fa = g / a.den;
  const fb = g / b.den;
  const out: bigint[] = new Array<bigint>(hi - lo).fill(0n);
  const an = a.num;
  const bn = b.num;
  const aEnd = Math.min(an.length, out.length + lo - a.start);
  const bEnd = Math.min(bn.length, out.length + lo - b.start);
  const ao = a.start - lo;
  const bo = b.start - lo;
  if (fa === 1n) for (let i = 0; i < aEnd; i++) out[ao + i] = an[i]!;
  else for (let i = 0; i < aEnd; i++) out[ao + i] = an[i]! * fa;
  if (fb === 1n) {
    for (let i = 0; i < bEnd; i++) if (bn[i] !== 0n) out[bo + i]! += bn[i]!;
  } else for (let i = 0; i < bEnd; i++) if (bn[i] !== 0n) out[bo + i]! += bn[i]! * fb;
  return Series.of(a.step, lo, out, g, order);
}

/** -a. */
export function neg(a: Series): Series {
  return Series.of(
    a.step,
    a.start,
    a.num.map((c) => -c),
    a.den,
    a.order,
  );
}

/** a - b. */
export function sub(a: Series, b: Series): Series {
  return add(a, neg(b));
}

/** c a for an exact rational c. */
export function scale(a: Series, c: Fraction): Series {
  if (c.equals(0)) return Series.of(a.step, 0, [], 1n, a.order === null ? null : a.order);
  const n = numer(c);
  return Series.of(
    a.step,
    a.start,
    a.num.map((x) => x * n),
    a.den * c.d,
    a.order,
  );
}

/** q^e a (exact shift of every exponent, and of the order). */
export function shift(a: Series, e: Fraction): Series {
  const [t, k] = gridIndex(a, e);
  return Series.of(t.step, t.start + k, [...t.num], t.den, t.order === null ? null : t.order + k);
}

/**
 * a * b, known to O(q^min(A + val b, B + val a)), truncated further at `cap` (an exponent) when
 * given. Only the coefficients below that bound are computed.
 */
export function mul(a: Series, b: Series, cap: Fraction | null = null): Series {
  [a, b] = align(a, b);
  let capIdx: number | null = null;
  if (cap !== null) {
    const [t, idx] = gridIndex(a, cap);
    if (t !== a) [a, b] = align(t, b);
    capIdx = idx;
  }
  let order: number | null = null;
  if (a.order !== null) order = a.order + b.val;
  if (b.order !== null) order = minOrder(order, b.order + a.val);
  if (order === Infinity) order = null;
  const start = a.start + b.start;
  const exactFits =
    order === null && capIdx !== null && start + a.num.length + b.num.length - 1 <= capIdx;
  if (!exactFits) order = minOrder(order, capIdx);
  if (a.num.length === 0 || b.num.length === 0) return Series.of(a.step, 0, [], 1n, order);
  const n = order === null ? a.num.length + b.num.length - 1 : order - start;
  if (n <= 0) return Series.of(a.step, 0, [], 1n, order);
  if (n > MAX_TERMS_PER_SERIES) {
    throw new EngineError('exact result has too many terms: give the gas a finite order');
  }
  return Series.of(a.step, start, mulTrunc(a.num, b.num, n), a.den * b.den, order);
}

/**
 * 1/b. Known to B - 2 val(b) (grid indices); an exact non-monomial needs `cap`.
 */
export function inverse(b: Series, cap: Fraction | null = null): Series {
  if (b.num.length === 0)
    throw new EngineError('division by zero (or by a series with no known term)');
  let capIdx: number | null;
  [b, capIdx] = capOn(b, cap);
  const v = b.start;
  let order: number | null = b.order === null ? null : b.order - 2 * v;
  if (order === null && b.num.length > 1) {
    if (capIdx === null) throw new EngineError('division by a series needs a finite order');
  }
  const F = b.num;
  const f0 = F[0]!;
  if (!(F.length === 1 && order === null && capIdx !== null && -v < capIdx))
    order = minOrder(order, capIdx);
  if (F.length === 1) {
    // c q^v -> (den / c) q^-v
    return Series.of(b.step, -v, [b.den], f0, order);
  }
  const n = order! + v; // relative terms needed
  if (n <= 0) return Series.of(b.step, 0, [], 1n, order);
  const nz: number[] = [];
  for (let i = 1; i < F.length && i < n; i++) if (F[i] !== 0n) nz.push(i);
  // H_k / f0^(k+1) are the coefficients of 1/F:  H_0 = 1, H_k = -sum_i F_i f0^(i-1) H_(k-i).
  const maxI = nz.length ? nz[nz.length - 1]! : 0;
  const pw: bigint[] = [1n];
  for (let i = 1; i < maxI; i++) pw.push(pw[i - 1]! * f0);
  const W = nz.map((i) => F[i]! * pw[i - 1]!);
  const H: bigint[] = new Array<bigint>(n);
  H[0] = 1n;
  for (let k = 1; k < n; k++) {
    let s = 0n;
    for (let j = 0; j < nz.length; j++) {
      const i = nz[j]!;
      if (i > k) break;
      s += W[j]! * H[k - i]!;
    }
    H[k] = -s;
  }
  // common denominator f0^n
  const out: bigint[] = new Array<bigint>(n);
  let p = 1n;
  for (let k = n - 1; k >= 0; k--) {
    out[k] = H[k]! * p * b.den;
    p *= f0;
  }
  return Series.of(b.step, -v, out, p, order);
}

/** a / b. */
export function div(a: Series, b: Series, cap: Fraction | null = null): Series {
  if (b.isConstant()) {
    const c = b.toFraction();
    if (c.equals(0)) throw new EngineError('division by zero');
    return truncate(scale(a, c.inverse()), cap);
  }
  return mul(a, inverse(b, cap === null ? null : capForInverse(a, cap)), cap);
}

/** The cap the divisor's inverse needs so that a * (1/b) is right below `cap`. */
function capForInverse(a: Series, cap: Fraction): Fraction {
  const v = a.valExponent();
  return v === null ? cap : cap.sub(v);
}

/** a^n for an integer n (negative: power of the inverse). */
export function powInt(a: Series, n: number, cap: Fraction | null = null): Series {
  if (Math.abs(n) > MAX_POWER) throw new EngineError(`exponent ${n} is larger than ${MAX_POWER}`);
  if (n === 0) {
    if (a.num.length === 0) throw new EngineError('0^0 is undefined');
    return Series.constant(frac(1));
  }
  if (n < 0) {
    // cap for the inverse: (1/a)^|n| has valuation -|n| val(a) ... keep enough terms
    const va = a.valExponent() ?? frac(0);
    const invCap = cap === null ? null : cap.add(va.mul(Math.abs(n) - 1));
    return powInt(inverse(a, invCap), -n, cap);
  }
  if (a.num.length === 1 && a.order === null) {
    const bits = a.num[0]!.toString(16).length + a.den.toString(16).length;
    if (bits * 4 * n > MAX_NUMBER_BITS) throw new EngineError('number too large');
    const c = a.num[0]! ** BigInt(n);
    return truncate(Series.of(a.step, a.start * n, [c], a.den ** BigInt(n), null), cap);
  }
  if (cap === null && a.order === null && (a.num.length - 1) * n + 1 > MAX_TERMS_PER_SERIES) {
    throw new EngineError('exact result has too many terms: give the gas a finite order');
  }
  let result: Series | null = null;
  let base = a;
  let k = n;
  while (k > 0) {
    if (k & 1) result = result === null ? base : mul(result, base, cap);
    k >>= 1;
    if (k > 0) base = mul(base, base, cap === null ? null : cap);
  }
  return truncate(result!, cap);
}
