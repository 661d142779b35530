import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { lcm } from '../integers.js';
import { exactRoot, frac, numer } from '../rational.js';
import { powInt, shift } from './arith.js';
import { gridIndex, Series } from './series.js';

/** Fractions f_k = coefficient of t^k, t = q^step, of s / (leading term), k < n. */
function relative(s: Series, n: number): Fraction[] {
  const lead = s.num[0]!;
  const out: Fraction[] = [];
  for (let k = 0; k < n; k++) out.push(k < s.num.length ? frac(s.num[k]!, lead) : frac(0));
  return out;
}

/** Series on `step` from fraction coefficients at grid indices start, start+1, ... */
function fromFractions(
  step: Fraction,
  start: number,
  cs: Fraction[],
  order: number | null,
): Series {
  let d = 1n;
  for (const c of cs) if (c.d !== 1n) d = lcm(d, c.d);
  return Series.of(
    step,
    start,
    cs.map((c) => numer(c) * (d / c.d)),
    d,
    order,
  );
}

/** Relative number of terms to compute: known range of the argument, capped. */
function termsNeeded(known: number | null, capIdx: number | null, what: string): number {
  const n = known === null ? capIdx : capIdx === null ? known : Math.min(known, capIdx);
  if (n === null) throw new EngineError(`${what} of a series needs a finite order`);
  return Math.max(0, n);
}

/** exp(a): a has positive valuation, or is the exact constant 0. Known to the order of a. */
export function exp(a: Series, cap: Fraction | null): Series {
  if (a.isConstant()) {
    if (a.toFraction().equals(0)) return Series.constant(frac(1));
    throw new EngineError('exp of a non-zero number is not rational');
  }
  if (a.val <= 0) throw new EngineError('exp needs an argument with positive valuation');
  let capIdx: number | null = null;
  if (cap !== null) [a, capIdx] = gridIndex(a, cap);
  const n = termsNeeded(a.order, capIdx, 'exp');
  const f: Fraction[] = [];
  for (let k = 0; k < n; k++) f.push(a.coeffAt(k) ?? frac(0));
  const nz = f.map((c, k) => (c.equals(0) ? -1 : k)).filter((k) => k > 0);
  const g: Fraction[] = [frac(1)];
  for (let m = 1; m < n; m++) {
    let s = frac(0);
    for (const k of nz) {
      if (k > m) break;
      s = s.add(f[k]!.mul(k).mul(g[m - k]!));
    }
    g.push(s.div(m));
  }
  return fromFractions(a.step, 0, g, n);
}

/** log(a): the leading term of a must be exactly 1 at exponent 0. */
export function log(a: Series, cap: Fraction | null): Series {
  if (a.num.length === 0 || a.start !== 0 || a.num[0] !== a.den) {
    throw new EngineError('log needs an argument whose leading term is 1 (at exponent 0)');
  }
  if (a.isConstant()) return Series.constant(frac(0));
  let capIdx: number | null = null;
  if (cap !== null) [a, capIdx] = gridIndex(a, cap);
  const n = termsNeeded(a.order, capIdx, 'log');
  const f = relative(a, n);
  const nz = f.map((c, k) => (c.equals(0) ? -1 : k)).filter((k) => k > 0);
  const g: Fraction[] = [frac(0)];
  for (let m = 1; m < n; m++) {
    let s = f[m]!.mul(m);
    for (const k of nz) {
      if (k >= m) break;
      // term (m-k) g_(m-k) f_k
      s = s.sub(g[m - k]!.mul(m - k).mul(f[k]!));
    }
    g.push(s.div(m));
  }
  return fromFractions(a.step, 0, g, n);
}

/** Exact r-th root-power of a rational c = n/d for r = m/k, or null when not rational. */
function rationalPower(c: Fraction, r: Fraction): Fraction | null {
  const k = Number(r.d);
  const neg = c.s < 0n;
  if (neg && k % 2 === 0) return null;
  const rn = exactRoot(c.n, k);
  const rd = exactRoot(c.d, k);
  if (rn === null || rd === null) return null;
  const root = frac(neg ? -rn : rn, rd);
  return r.s < 0n ? root.inverse().pow(Number(r.n)) : root.pow(Number(r.n));
}

/**
 * a^r for a rational r: defined when the leading coefficient is a perfect power. The result is
 * c^r q^(v r) (1 + u)^r, the last factor by the recurrence n g_n = sum ((r+1)k - n) f_k g_(n-k).
 */
export function powRational(a: Series, r: Fraction, cap: Fraction | null): Series {
  if (r.d === 1n) return powInt(a, Number(numer(r)), cap);
  if (a.num.length === 0) {
    if (a.order === null && r.s > 0n) return a;
    throw new EngineError('fractional power of zero (or of a series with no known term)');
  }
  const lead = frac(a.num[0]!, a.den);
  const c = rationalPower(lead, r);
  if (c === null) {
    throw new EngineError(
      `fractional power: leading coefficient ${lead.toFraction()} is not a perfect power`,
    );
  }
  const vExp = a.step.mul(a.start);
  const outVal = vExp.mul(r);
  let relCap: number | null = null;
  if (cap !== null) {
    const [t, idx] = gridIndex(a, cap.sub(outVal));
    a = t;
    relCap = idx;
  }
  const known = a.order === null ? null : a.order - a.start;
  if (a.num.length === 1 && a.order === null) return shift(Series.constant(c), outVal);
  const n = termsNeeded(known, relCap, 'a fractional power');
  const f = relative(a, n);
  const nz = f.map((x, k) => (x.equals(0) ? -1 : k)).filter((k) => k > 0);
  const r1 = r.add(1);
  const g: Fraction[] = [c];
  for (let m = 1; m < n; m++) {
    let s = frac(0);
    for (const k of nz) {
      if (k > m) break;
      s = s.add(
        r1
          .mul(k)
          .sub(m)
          .mul(f[k]!)
          .mul(g[m - k]!),
      );
    }
    g.push(s.div(m));
  }
  return shift(fromFractions(a.step, 0, g, n), outVal);
}
