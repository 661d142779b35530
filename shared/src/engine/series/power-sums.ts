/**
 * Power sums Z_L = sum_c m_c c^L (L = 1..nMax) of a spectrum's lattice values c with
 * multiplicities m_c, cut at the gas order.
 *
 * Lattice values are often one series with q -> q^t substituted (c_p = f(q^|p|) gives c_p(q) =
 * c_(1/2)(q^(2|p|))). Such values form a family: only the family's base, the member on the finest
 * grid, is raised to powers, and every member's c^L is the base's power with the member's
 * substitution, c^L(q) = b^L(q^t). Membership is decided exactly, coefficient by coefficient below
 * the order, never guessed from the expression.
 */
import Fraction from 'fraction.js';
import { gcdInt } from '../integers.js';
import { frac } from '../rational.js';
import { mul, scale } from './arith.js';
import { cutAt, Series } from './series.js';
import { sumSeries } from './sum.js';

/**
 * c = q^(a S) G(q^S): the coarse step S (the grid of the offsets from the lowest term), the
 * lowest exponent in units of S, the coarse coefficients G (G[0] != 0) and how many of them lie
 * below the order (`known`).
 */
interface Profile {
  readonly S: Fraction;
  readonly a: Fraction;
  readonly G: readonly bigint[];
  readonly den: bigint;
  readonly known: number;
}

/**
 * The profile of c, or null when c cannot join a family: no positive valuation, exact (its terms
 * beyond the order would count), or known below a lower order than the gas's.
 */
function profileOf(c: Series, cap: Fraction): Profile | null {
  const v = c.valExponent();
  if (c.num.length === 0 || v === null || v.compare(0) <= 0) return null;
  const o = c.orderExponent();
  if (o === null || o.compare(cap) < 0) return null;
  let r = 0;
  for (let i = 1; i < c.num.length && r !== 1; i++) if (c.num[i] !== 0n) r = gcdInt(r, i);
  if (r === 0) r = c.start; // a monomial g q^e: S = e, a = 1
  const S = c.step.mul(r);
  const a = frac(c.start, r);
  const G: bigint[] = [];
  for (let i = 0; i < c.num.length; i += r) G.push(c.num[i]!);
  const known = Number(cap.div(S).sub(a).ceil().valueOf());
  return { S, a, G, den: c.den, known };
}

/** True when c (profile m) is b (profile base) with q -> q^t, below the order. */
function sameBelowOrder(base: Profile, m: Profile): boolean {
  if (!base.a.equals(m.a) || base.den !== m.den || base.known < m.known) return false;
  for (let k = 0; k < m.known; k++) if ((base.G[k] ?? 0n) !== (m.G[k] ?? 0n)) return false;
  return true;
}

/**
 * x(q^t) with the terms at or beyond `cap` left out; its order is the first point of its grid at
 * or beyond `cap`, so it may claim a little more than x(q^t) + O(q^cap): callers sum it with a
 * term known exactly to `cap` (the family base's power), which sets the sum's order.
 */
function substituteBelow(x: Series, t: Fraction, cap: Fraction): Series {
  const step = x.step.mul(t);
  const orderIdx = Number(cap.div(step).ceil().valueOf());
  const keep = Math.max(0, Math.min(x.num.length, orderIdx - x.start));
  return Series.of(step, x.start, x.num.slice(0, keep), x.den, orderIdx);
}

interface Member {
  readonly c: Series;
  readonly m: number;
  /** c(q) = base(q^t) below the order */
  readonly t: Fraction;
}

/** Families of lattice values; values without a profile are families of one. */
function families(values: readonly [Series, number][], cap: Fraction): Member[][] {
  const profiled = values
    .map(([c, m]) => ({ c, m, p: profileOf(c, cap) }))
    .sort((x, y) =>
      x.p === null ? (y.p === null ? 0 : -1) : y.p === null ? 1 : x.p.S.compare(y.p.S),
    );
  const out: Member[][] = [];
  const byKey = new Map<string, { base: Profile; members: Member[] }[]>();
  for (const { c, m, p } of profiled) {
    if (p === null) {
      out.push([{ c, m, t: frac(1) }]);
      continue;
    }
    const key = `${p.a.toFraction()}|${p.den}|${p.G[0]}`;
    const list = byKey.get(key) ?? [];
    byKey.set(key, list);
    const fam = list.find((f) => sameBelowOrder(f.base, p));
    if (fam) fam.members.push({ c, m, t: p.S.div(fam.base.S) });
    else {
      const members: Member[] = [{ c, m, t: frac(1) }];
      list.push({ base: p, members });
      out.push(members);
    }
  }
  return out;
}

/**
 * Z_L = sum m c^L for L = 1..nMax, each value's powers cut at `cap` as products cut there are
 * (with `cap` null, the plain powers of every value); `truncated` cuts the sums at `cap` too (the
 * lattice omitted values beyond it). `tick` is called once per value.
 */
export function powerSums(
  values: readonly [Series, number][],
  nMax: number,
  cap: Fraction | null,
  truncated: boolean,
  tick?: () => void,
): Series[] {
  const terms: Series[][] = Array.from({ length: nMax }, () => []);
  const groups =
    cap === null ? values.map(([c, m]) => [{ c, m, t: frac(1) }]) : families(values, cap);
  for (const group of groups) {
    const base = group[0]!.c;
    const v = base.valExponent();
    const grows = v !== null && v.compare(0) > 0;
    // the base's powers, as far as any member needs them (members have larger valuations)
    const powers: Series[] = [];
    let pw = base;
    for (let L = 1; L <= nMax; L++) {
      const pv = pw.valExponent();
      if (grows && cap !== null && (pv === null || pv.compare(cap) >= 0)) break;
      powers.push(pw);
      if (L < nMax) pw = mul(pw, base, cap);
    }
    for (const { c, m, t } of group) {
      for (let L = 1; L <= powers.length; L++) {
        let x = L === 1 ? c : powers[L - 1]!;
        if (L > 1 && !t.equals(1)) {
          const xv = x.valExponent();
          if (xv === null || xv.mul(t).compare(cap!) >= 0) break;
          x = substituteBelow(x, t, cap!);
        }
        terms[L - 1]!.push(m === 1 ? x : scale(x, frac(m)));
      }
      tick?.();
    }
  }
  return terms.map((list) => {
    const s = sumSeries(list);
    return truncated && cap !== null ? cutAt(s, cap) : s;
  });
}
