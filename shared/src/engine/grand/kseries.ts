import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { frac } from '../rational.js';
import { add, inverse, mul, neg, scale } from '../series/arith.js';
import { exp, log } from '../series/transcendental.js';
import { Series } from '../series/series.js';

/**
 * A power series in kappa truncated after kappa^nMax, whose coefficients are q-series:
 * c[0] + c[1] kappa + ... + c[nMax] kappa^nMax + O(kappa^(nMax+1)). Immutable.
 */
export class KSeries {
  constructor(
    readonly coeffs: readonly Series[],
    readonly nMax: number,
  ) {}

  /** kappa itself. */
  static kappa(nMax: number): KSeries {
    const z = Series.constant(frac(0));
    const c = [z, Series.constant(frac(1))];
    return new KSeries(c.slice(0, nMax + 1), nMax);
  }

  /** A q-series seen as a constant in kappa. */
  static lift(s: Series, nMax: number): KSeries {
    return new KSeries([s], nMax);
  }

  /** Coefficient of kappa^j (exact zero beyond the stored ones). */
  at(j: number): Series {
    return this.coeffs[j] ?? Series.constant(frac(0));
  }
}

const zero = (): Series => Series.constant(frac(0));

/** a + b. */
export function kAdd(a: KSeries, b: KSeries): KSeries {
  const n = Math.max(a.coeffs.length, b.coeffs.length);
  const out: Series[] = [];
  for (let j = 0; j < n; j++) out.push(add(a.at(j), b.at(j)));
  return new KSeries(out, a.nMax);
}

/** -a. */
export function kNeg(a: KSeries): KSeries {
  return new KSeries(a.coeffs.map(neg), a.nMax);
}

/** a * b truncated after kappa^nMax and, coefficient-wise, at the q-cap. */
export function kMul(a: KSeries, b: KSeries, cap: Fraction | null): KSeries {
  const n = Math.min(a.nMax + 1, a.coeffs.length + b.coeffs.length - 1);
  const out: Series[] = [];
  for (let j = 0; j < n; j++) {
    let s = zero();
    for (let i = Math.max(0, j - b.coeffs.length + 1); i <= j && i < a.coeffs.length; i++) {
      s = add(s, mul(a.coeffs[i]!, b.coeffs[j - i]!, cap));
    }
    out.push(s);
  }
  return new KSeries(out, a.nMax);
}

/** 1/a; the constant term must be invertible as a q-series. */
export function kInverse(a: KSeries, cap: Fraction | null): KSeries {
  const g0 = inverse(a.at(0), cap);
  const g: Series[] = [g0];
  for (let m = 1; m <= a.nMax; m++) {
    let s = zero();
    for (let k = 1; k <= m && k < a.coeffs.length; k++)
      s = add(s, mul(a.coeffs[k]!, g[m - k]!, cap));
    g.push(neg(mul(g0, s, cap)));
  }
  return new KSeries(g, a.nMax);
}

/** exp(a) = exp(a_0) exp(a - a_0), by n g_n = sum k a_k g_(n-k). */
export function kExp(a: KSeries, cap: Fraction | null): KSeries {
  const g: Series[] = [exp(a.at(0), cap)];
  for (let m = 1; m <= a.nMax; m++) {
    let s = zero();
    for (let k = 1; k <= m && k < a.coeffs.length; k++) {
      s = add(s, mul(scale(a.coeffs[k]!, frac(k)), g[m - k]!, cap));
    }
    g.push(scale(s, frac(1, m)));
  }
  return new KSeries(g, a.nMax);
}

/** log(a); a_0 must have leading term 1. n g_n = (n a_n - sum_(k<n) k g_k a_(n-k)) / a_0. */
export function kLog(a: KSeries, cap: Fraction | null): KSeries {
  const a0inv = inverse(a.at(0), cap);
  const g: Series[] = [log(a.at(0), cap)];
  for (let m = 1; m <= a.nMax; m++) {
    let s = scale(a.at(m), frac(m));
    for (let k = 1; k < m; k++) s = add(s, neg(mul(scale(g[k]!, frac(k)), a.at(m - k), cap)));
    g.push(scale(mul(s, a0inv, cap), frac(1, m)));
  }
  return new KSeries(g, a.nMax);
}

/** a^n for an integer n. */
export function kPowInt(a: KSeries, n: number, cap: Fraction | null): KSeries {
  if (n < 0) return kPowInt(kInverse(a, cap), -n, cap);
  let result = KSeries.lift(Series.constant(frac(1)), a.nMax);
  let base = a;
  while (n > 0) {
    if (n & 1) result = kMul(result, base, cap);
    n >>= 1;
    if (n > 0) base = kMul(base, base, cap);
  }
  return result;
}

/** a^r for a rational r, as exp(r log a) (a_0 must have leading term 1). */
export function kPowRational(a: KSeries, r: Fraction, cap: Fraction | null): KSeries {
  if (r.d === 1n) return kPowInt(a, Number(r.s * r.n), cap);
  const l = kLog(a, cap);
  return kExp(
    new KSeries(
      l.coeffs.map((c) => scale(c, r)),
      a.nMax,
    ),
    cap,
  );
}

/** Smallest q-valuation over the kappa coefficients (null: all exactly zero). */
export function kValuation(a: KSeries): Fraction | null {
  let best: Fraction | null = null;
  for (const c of a.coeffs) {
    const v = c.valExponent();
    if (v !== null && (best === null || v.compare(best) < 0)) best = v;
  }
  return best;
}

/** Guard used by operations that make no sense with kappa. */
export function noKappa(what: string): never {
  throw new EngineError(`${what} is not defined for a series in kappa`);
}
