/**
 * Truncated products with a factor that is a rational function of small degree: when the
 * coefficients c_0..c_(L-1) of a factor satisfy a linear recurrence of order d (exactly, checked on
 * every one of them), the factor equals P(y) / Q(y) below y^L, and multiplying by it costs
 * (terms of P + terms of Q) operations per coefficient instead of one per non-zero c_i.
 */
import { gcd } from '../../integers.js';
import { addScaled } from './mul-trunc.js';

/**
 * P(y) / Q(y) with integer coefficients, Q(0) > 0, no common integer factor, equal to the factor
 * below y^length (the coefficients it was checked on).
 */
export interface RationalFactor {
  readonly p: readonly bigint[];
  readonly q: readonly bigint[];
  readonly length: number;
}

/** The recurrences tried have order 1..MAX_ORDER. */
const MAX_ORDER = 4;

function det(m: bigint[][]): bigint {
  const n = m.length;
  if (n === 0) return 1n;
  if (n === 1) return m[0]![0]!;
  let s = 0n;
  for (let k = 0; k < n; k++) {
    const a = m[0]![k]!;
    if (a === 0n) continue;
    const minor = m.slice(1).map((row) => row.filter((_, c) => c !== k));
    const d = det(minor);
    s += k % 2 === 0 ? a * d : -a * d;
  }
  return s;
}

/**
 * The shortest P / Q (order d <= 4 of Q, degree of P <= d) with Q c = P below y^L, or null when
 * no such recurrence holds for every coefficient of `c` (or `c` is too short to check one). The
 * recurrence sum_k Q_k c_(n-k) = 0 (n > d) is solved on d of its equations (Cramer's rule on
 * integers) and then checked on all the others, so the result is exact.
 */
export function findRationalFactor(c: readonly bigint[]): RationalFactor | null {
  const L = c.length;
  const at = (i: number): bigint => (i >= 0 ? c[i]! : 0n);
  for (let d = 1; d <= MAX_ORDER; d++) {
    const e = d + 1; // the recurrence holds from index e on; P has degree < e
    if (L <= e + d) break; // no equation left to check the recurrence on
    const rows: bigint[][] = [];
    for (let n = e; n < e + d; n++) rows.push(Array.from({ length: d + 1 }, (_, k) => at(n - k)));
    // the null vector of the d x (d+1) system by cofactors: Q_k = (-1)^k det(rows without column k)
    let q = Array.from({ length: d + 1 }, (_, k) => {
      const m = det(rows.map((r) => r.filter((_, col) => col !== k)));
      return k % 2 === 0 ? m : -m;
    });
    if (q[0] === 0n) continue;
    let g = 0n;
    for (const x of q) g = gcd(g, x);
    const sign = q[0]! < 0n ? -1n : 1n;
    q = q.map((x) => (x / g) * sign);
    let holds = true;
    for (let n = e; n < L && holds; n++) {
      let s = 0n;
      for (let k = 0; k <= d; k++) s += q[k]! * at(n - k);
      holds = s === 0n;
    }
    if (!holds) continue;
    const p: bigint[] = [];
    for (let n = 0; n < e; n++) {
      let s = 0n;
      for (let k = 0; k <= Math.min(n, d); k++) s += q[k]! * at(n - k);
      p.push(s);
    }
    while (p.length > 0 && p[p.length - 1] === 0n) p.pop();
    while (q.length > 1 && q[q.length - 1] === 0n) q.pop();
    return { p, q, length: L };
  }
  return null;
}

/** Operations per output coefficient of `mulTruncRational` (its non-zero terms of P and Q). */
export function rationalCost(f: RationalFactor): number {
  let k = 0;
  for (const x of f.p) if (x !== 0n) k++;
  for (let i = 1; i < f.q.length; i++) if (f.q[i] !== 0n) k++;
  return k;
}

/**
 * First n coefficients of (P(y) / Q(y)) * b with y = x^stride, b indexed by the exponent of x
 * (n at most stride * f.length: beyond, P / Q need not be the factor any more):
 * u = P(y) b term by term, then r_i = (u_i - sum_(k>=1) Q_k r_(i - k stride)) / Q_0. The division
 * is exact when the product has integer coefficients (it is checked).
 */
export function mulTruncRational(
  f: RationalFactor,
  stride: number,
  b: readonly bigint[],
  n: number,
): bigint[] {
  if (!Number.isInteger(stride) || stride < 1) throw new RangeError(`stride ${stride} is not >= 1`);
  if (n > f.length * stride) {
    throw new RangeError(`P/Q is known below y^${f.length}, not to x^${n} with stride ${stride}`);
  }
  const lb = Math.min(b.length, n);
  if (lb <= 0 || f.p.length === 0) return [];
  const out = new Array<bigint>(n);
  // P_0 = 1 (a factor from its first term on): u starts as b itself, no additions to zero
  const first = f.p[0] === 1n ? 1 : 0;
  for (let i = 0; i < n; i++) out[i] = first === 1 && i < lb ? b[i]! : 0n;
  for (let k = first; k < f.p.length; k++) {
    const pk = f.p[k]!;
    const off = k * stride;
    if (pk === 0n || off >= n) continue;
    addScaled(out, off, pk, b, Math.min(lb, n - off));
  }
  const q = f.q;
  const q0 = q[0]!;
  const d = q.length - 1;
  for (let i = 0; i < n; i++) {
    let acc = out[i]!;
    for (let k = 1; k <= d; k++) {
      const j = i - k * stride;
      if (j < 0) break;
      const qk = q[k]!;
      if (qk === 0n) continue;
      const r = out[j]!;
      if (r === 0n) continue;
      if (qk === 1n) acc -= r;
      else if (qk === -1n) acc += r;
      else acc -= qk * r;
    }
    if (q0 !== 1n) {
      if (acc % q0 !== 0n)
        throw new RangeError('the product with P/Q has a non-integer coefficient');
      acc /= q0;
    }
    out[i] = acc;
  }
  return out;
}
