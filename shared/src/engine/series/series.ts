import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { MAX_ORDER } from '../limits.js';
import { gcd, reduceRow } from '../integers.js';
import { frac, numer } from '../rational.js';

/** gcd of two positive rationals: the coarsest grid holding both. */
export function stepGcd(a: Fraction, b: Fraction): Fraction {
  if (a.equals(b)) return a;
  return frac(gcd(a.n * b.d, b.n * a.d), a.d * b.d);
}

/**
 * A truncated Puiseux series in one variable with exact rational coefficients:
 * sum_i (num[i] / den) q^((start + i) * step) + O(q^(order * step)); order null = exact.
 * Immutable; build through `Series.of`, which normalises (no leading or trailing zeros, den > 0,
 * nothing stored at or beyond the order, common factors removed).
 */
export class Series {
  private constructor(
    readonly step: Fraction,
    readonly start: number,
    readonly num: readonly bigint[],
    readonly den: bigint,
    readonly order: number | null,
  ) {}

  /** Normalising constructor. */
  static of(
    step: Fraction,
    start: number,
    num: bigint[],
    den: bigint,
    order: number | null,
  ): Series {
    if (den === 0n) throw new EngineError('division by zero');
    if (den < 0n) {
      den = -den;
      for (let i = 0; i < num.length; i++) num[i] = -num[i]!;
    }
    let hi = num.length;
    if (order !== null) hi = Math.max(0, Math.min(hi, order - start));
    let lo = 0;
    while (lo < hi && num[lo] === 0n) lo++;
    while (hi > lo && num[hi - 1] === 0n) hi--;
    if (lo > 0 || hi < num.length) num = num.slice(lo, hi);
    start = num.length === 0 ? 0 : start + lo;
    if (num.length === 0) den = 1n;
    else if (den !== 1n) ({ num, den } = reduceRow(num, den));
    return new Series(step, start, num, den, order);
  }

  /** An exact rational num/den already in lowest terms (den > 0): no normalisation work. */
  static reducedConstant(num: bigint, den: bigint): Series {
    return num === 0n
      ? new Series(frac(1), 0, [], 1n, null)
      : new Series(frac(1), 0, [num], den, null);
  }

  /** The exact rational constant c. */
  static constant(c: Fraction): Series {
    return Series.of(frac(1), 0, [numer(c)], c.d, null);
  }

  /** The exact monomial c q^e. */
  static monomial(c: Fraction, e: Fraction): Series {
    const step = e.equals(0) ? frac(1) : e.abs();
    const start = e.equals(0) ? 0 : e.s < 0n ? -1 : 1;
    return Series.of(step, start, [numer(c)], c.d, null);
  }

  /** O(q^e): zero, known below exponent e only. */
  static bigO(e: Fraction): Series {
    const step = e.equals(0) ? frac(1) : e.abs();
    return Series.of(step, 0, [], 1n, e.equals(0) ? 0 : e.s < 0n ? -1 : 1);
  }

  /** Grid index of the lowest non-zero coefficient; the order for a zero series, or Infinity. */
  get val(): number {
    if (this.num.length > 0) return this.start;
    return this.order ?? Infinity;
  }

  /** Exponent of the lowest non-zero (or the order, for zero), or null for an exact zero. */
  valExponent(): Fraction | null {
    const v = this.val;
    return v === Infinity ? null : this.step.mul(v);
  }

  /** Exponent of the order, or null when exact. */
  orderExponent(): Fraction | null {
    return this.order === null ? null : this.step.mul(this.order);
  }

  /** True for an exact zero. */
  isZero(): boolean {
    return this.num.length === 0 && this.order === null;
  }

  /** True when the value is an exact rational (exponent 0 only). */
  isConstant(): boolean {
    return (
      this.order === null && (this.num.length === 0 || (this.num.length === 1 && this.start === 0))
    );
  }

  /** The exact rational, when `isConstant()`. */
  toFraction(): Fraction {
    if (!this.isConstant()) throw new EngineError('expected an exact number, got a series');
    return this.num.length === 0 ? frac(0) : frac(this.num[0]!, this.den);
  }

  /** Coefficient at grid index i (as a fraction); undefined when not determined. */
  coeffAt(i: number): Fraction | undefined {
    if (this.order !== null && i >= this.order) return undefined;
    const k = i - this.start;
    if (k < 0 || k >= this.num.length) return frac(0);
    return frac(this.num[k]!, this.den);
  }

  /** The same series on a grid `r` times finer (r a positive integer). */
  refine(r: number): Series {
    if (r === 1) return this;
    if (this.num.length * r > 4 * MAX_ORDER + 16) {
      throw new EngineError('series grid too fine: exponent steps do not fit together');
    }
    const out: bigint[] = new Array<bigint>(
      this.num.length === 0 ? 0 : (this.num.length - 1) * r + 1,
    ).fill(0n);
    for (let i = 0; i < this.num.length; i++) out[i * r] = this.num[i]!;
    return Series.of(
      this.step.div(r),
      this.start * r,
      out,
      this.den,
      this.order === null ? null : this.order * r,
    );
  }

  /** The same series on grid `step` (which must divide the current step). */
  onStep(step: Fraction): Series {
    if (step.equals(this.step)) return this;
    const r = this.step.div(step);
    if (r.d !== 1n) throw new EngineError('internal: grid does not refine');
    return this.refine(Number(r.n));
  }
}

/** Both series on their common grid. */
export function align(a: Series, b: Series): [Series, Series] {
  if (a.step.equals(b.step)) return [a, b];
  const g = stepGcd(a.step, b.step);
  return [a.onStep(g), b.onStep(g)];
}

/** Grid index corresponding to exponent e on `s`'s grid, refining `s` if e is off-grid. */
export function gridIndex(s: Series, e: Fraction): [Series, number] {
  let t = s;
  let idx = e.div(t.step);
  if (idx.d !== 1n) {
    t = t.onStep(stepGcd(t.step, e.abs()));
    idx = e.div(t.step);
  }
  return [t, Number(numer(idx))];
}

/** Truncate to O(q^e) (never raises the order). */
export function truncate(s: Series, e: Fraction | null): Series {
  if (e === null) return s;
  const [t, idx] = gridIndex(s, e);
  if (t.order !== null && t.order <= idx) return t;
  if (t.order === null && t.start + t.num.length <= idx) return t; // exact, nothing at or beyond e
  return Series.of(t.step, t.start, [...t.num], t.den, idx);
}

/** Cut off at O(q^e) even when exact: used where omitted terms lie at or beyond e. */
export function cutAt(s: Series, e: Fraction): Series {
  const [t, idx] = gridIndex(s, e);
  if (t.order !== null && t.order <= idx) return t;
  return Series.of(t.step, t.start, [...t.num], t.den, idx);
}

/**
 * The same series on the coarsest grid that holds all its exponents and its order (e.g. a series
 * in q^3 moves to step 3): products of such series then touch only the grid points they live on.
 */
export function coarsen(s: Series): Series {
  if (s.num.length === 0) return s;
  const small = (a: number, b: number): number => {
    a = Math.abs(a);
    b = Math.abs(b);
    while (b) [a, b] = [b, a % b];
    return a;
  };
  let g = small(s.start, s.order ?? 0);
  for (let i = 1; i < s.num.length && g !== 1; i++) if (s.num[i] !== 0n) g = small(g, s.start + i);
  if (g <= 1) return s;
  const num: bigint[] = [];
  for (let i = 0; i < s.num.length; i += g) num.push(s.num[i]!);
  return Series.of(s.step.mul(g), s.start / g, num, s.den, s.order === null ? null : s.order / g);
}
