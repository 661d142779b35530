import type Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { KSeries, kAdd, kExp, kLog } from '../grand/kseries.js';
import { frac } from '../rational.js';
import { add, scale } from '../series/arith.js';
import { substitute } from '../series/substitute.js';
import { Series, truncate } from '../series/series.js';
import { exp, log } from '../series/transcendental.js';
import type { Ring, Value } from '../expr/values.js';
import { moebius } from './product.js';

/** Upper end of what a q-series is known to, with the cap applied (null: exact and uncapped). */
function knownTo(s: Series, cap: Fraction | null): Fraction | null {
  const o = s.orderExponent();
  if (o === null) return cap;
  return cap === null || o.compare(cap) < 0 ? o : cap;
}

/**
 * sum_{k>=1} w(k) s(q^k) for a q-series s with positive valuation (or exact zero): the terms with
 * k val(s) at or beyond the known end vanish there, so the sum is finite and known to that end.
 */
function adamsSum(
  s: Series,
  w: (k: number) => Fraction,
  cap: Fraction | null,
  what: string,
): Series {
  if (s.num.length === 0) return truncate(s, cap);
  const v = s.valExponent()!;
  if (v.compare(0) <= 0) throw new EngineError(`${what} needs a series with positive valuation`);
  const end = knownTo(s, cap);
  if (end === null) throw new EngineError(`${what} of a series needs a finite order`);
  let out: Series = truncate(Series.constant(frac(0)), end);
  for (let k = 1; v.mul(k).compare(end) < 0; k++) {
    const c = w(k);
    if (!c.equals(0)) out = add(out, truncate(scale(substitute(s, frac(k)), c), end));
  }
  return truncate(out, end);
}

/** The same for a kappa-series: kappa^j s_j(q) -> kappa^(jk) s_j(q^k), kept up to kappa^nMax. */
function adamsSumK(
  a: KSeries,
  w: (k: number) => Fraction,
  cap: Fraction | null,
  what: string,
): KSeries {
  let out = KSeries.lift(adamsSum(a.at(0), w, cap, what), a.nMax);
  for (let j = 1; j < a.coeffs.length && j <= a.nMax; j++) {
    const c = a.coeffs[j]!;
    if (c.isZero()) continue;
    for (let k = 1; j * k <= a.nMax; k++) {
      const wk = w(k);
      if (wk.equals(0)) continue;
      const coeffs: Series[] = new Array<Series>(j * k + 1).fill(Series.constant(frac(0)));
      coeffs[j * k] = truncate(scale(substitute(c, frac(k)), wk), cap);
      out = kAdd(out, new KSeries(coeffs, a.nMax));
    }
  }
  return out;
}

/**
 * Plethystic exponential PE[f] = exp(sum_{k>=1} f(q^k, kappa^k)/k): f must vanish at q = 0 and
 * kappa = 0 (its kappa-free part has positive valuation). Known to the order of f (and the cap);
 * the kappa-series is kept up to kappa^nMax.
 */
export function plethysticExp(f: Value, ring: Ring): Value {
  const w = (k: number): Fraction => frac(1, k);
  if (f instanceof Series) return exp(adamsSum(f, w, ring.cap, 'pexp'), ring.cap);
  return kExp(adamsSumK(f, w, ring.cap, 'pexp'), ring.cap);
}

/**
 * Plethystic logarithm PLog[g] = sum_{k>=1} mu(k)/k log g(q^k, kappa^k) with the Moebius
 * function, the inverse of PE: g must have leading term 1 (the kappa-free part 1 + O(q)).
 */
export function plethysticLog(g: Value, ring: Ring): Value {
  const w = (k: number): Fraction => frac(moebius(k), k);
  if (g instanceof Series) return adamsSum(log(g, ring.cap), w, ring.cap, 'plog');
  return adamsSumK(kLog(g, ring.cap), w, ring.cap, 'plog');
}
