import Fraction from 'fraction.js';
import { logAbs } from '../kernel/index.js';
import type { Series } from '../series/series.js';

/**
 * The grid of (t, q0): sigma = -cap ln q0 (q0 = 1 first) and u = ln t from -U_RANGE to U_RANGE
 * in steps of U_STEP. Every point of it gives a valid bound; the grid only decides how close to
 * the best one the minimum gets (for ring-40 within 0.01 bits of a grid 16 times finer).
 */
const SIGMAS = [0, ...Array.from({ length: 13 }, (_, k) => 2 ** (k - 2))];
const U_RANGE = 60;
const U_STEP = 2;

/** ln(1 + e^x) without overflow. */
function softplus(x: number): number {
  return x > 30 ? x + Math.log1p(Math.exp(-x)) : Math.log1p(Math.exp(x));
}

/**
 * For N = 0..nMax, an upper bound on log2 max |coefficient of q^e in Z(N)| over e < cap, from the
 * product form of a spectrum's grand function: Z(N) is the coefficient of kappa^N in
 * prod_p (1 + kappa c_p) (fermions) or prod_p 1 / (1 - kappa c_p) (bosons), so with G_p the
 * series of |coefficients| of c_p it is majorised coefficientwise by the same product over G_p,
 * and for t > 0, 0 < q0 <= 1 every such coefficient is at most
 * prod_p (1 + t G_p(q0)) / (t^N q0^cap) (all terms non-negative; bosons need t G_p(q0) < 1).
 * The minimum over a grid of (t, q0) is taken, with a margin for the float arithmetic. Null when
 * the bound does not apply: no order, a c_p with negative exponents or known below the order.
 */
export function productLog2Bounds(
  points: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction | null,
): number[] | null {
  if (cap === null) return null;
  const capValue = Number(cap.valueOf());
  if (!(capValue > 0)) return null;
  // per point: (exponent / cap, ln |coefficient|) of its terms below the order
  const terms: { x: number[]; l: number[] }[] = [];
  for (const c of points) {
    if (c.num.length === 0) continue;
    if (c.start < 0) return null;
    const step = Number(c.step.valueOf());
    if (c.order !== null && c.order * step < capValue) return null;
    const lden = logAbs(c.den);
    const x: number[] = [];
    const l: number[] = [];
    for (let i = 0; i < c.num.length; i++) {
      const e = (c.start + i) * step;
      if (e >= capValue) break;
      if (c.num[i] === 0n) continue;
      x.push(e / capValue);
      l.push(logAbs(c.num[i]!) - lden);
    }
    if (x.length > 0) terms.push({ x, l });
  }
  // equal c_p (p and -p of a symmetric spectrum) counted once with their multiplicity
  const distinct = new Map<string, { t: (typeof terms)[number]; k: number }>();
  for (const t of terms) {
    const key = `${t.x.join(',')}|${t.l.join(',')}`;
    const hit = distinct.get(key);
    if (hit) hit.k++;
    else distinct.set(key, { t, k: 1 });
  }
  const groups = [...distinct.values()];
  const mult = Float64Array.from(groups, (g) => g.k);
  const logG = new Float64Array(groups.length);
  const best = new Array<number>(nMax + 1).fill(Infinity);
  best[0] = 0;
  for (const sigma of SIGMAS) {
    let maxLogG = -Infinity;
    groups.forEach(({ t: { x, l } }, k) => {
      let m = -Infinity;
      for (let i = 0; i < x.length; i++) m = Math.max(m, l[i]! - sigma * x[i]!);
      let s = 0;
      for (let i = 0; i < x.length; i++) s += Math.exp(l[i]! - sigma * x[i]! - m);
      logG[k] = m + Math.log(s);
      maxLogG = Math.max(maxLogG, logG[k]!);
    });
    // ln F(t, q0) at u = ln t; bosons need t G_p(q0) < 1 for every p
    const logF = (u: number): number | null => {
      if (!fermion && u + maxLogG >= -1e-9) return null;
      let f = 0;
      for (let k = 0; k < logG.length; k++) {
        const y = u + logG[k]!;
        f += mult[k]! * (fermion ? softplus(y) : -Math.log1p(-Math.exp(y)));
      }
      return f;
    };
    for (let u = -U_RANGE; u <= U_RANGE; u += U_STEP) {
      const f = logF(u);
      if (f === null) break;
      for (let N = 1; N <= nMax; N++) best[N] = Math.min(best[N]!, (f - N * u + sigma) / Math.LN2);
    }
  }
  // margin for rounding in the logarithms and sums above (relative 1e-9 of the terms summed)
  const slack = 0.01 + 1e-9 * terms.length;
  return best.map((b, N) => (N === 0 ? 0 : b + slack + 1e-9 * Math.abs(b)));
}
