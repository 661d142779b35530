import { EngineCancelled } from '../../errors.js';
import { bitLength, isqrt } from '../real.js';

/**
 * Dense symmetric matrices in BigInt fixed point: entry = integer * 2^-F, stored row-major in a
 * plain array (n * n). Fixed point keeps every entry's rounding absolute (2^-F), which is what the
 * Nystrom matrix needs: its entries are bounded and the interesting quantities are sums of them.
 */
export interface FixedMatrix {
  n: number;
  a: bigint[];
}

/** Cooperative cancellation and progress inside long loops. */
export interface Pace {
  tick?: () => void;
  shouldStop?: () => boolean;
}

export function pace(p: Pace | undefined): void {
  p?.tick?.();
  if (p?.shouldStop?.()) throw new EngineCancelled();
}

/** s * 2^k rounded to an integer. */
function shiftRound(s: bigint, k: number): bigint {
  if (k >= 0) return s << BigInt(k);
  const kk = BigInt(-k);
  return (s + (1n << (kk - 1n))) >> kk;
}

/**
 * Tr T^L for L = 1..nMax (F fractional bits each) of the symmetric tridiagonal T = (d, e): the
 * banded powers T^k (bandwidth k) for k <= ceil(nMax / 2), then Tr T^(a+b) = sum_ij (T^a)_ij
 * (T^b)_ij. O(n nMax^2) operations instead of the O(n^3) products of the dense matrix.
 */
export function tridiagonalPowerTraces(
  d: bigint[],
  e: bigint[],
  nMax: number,
  F: number,
): bigint[] {
  const n = d.length;
  const FB = BigInt(F);
  const K = Math.ceil(nMax / 2);
  // band[k][i * (2k + 1) + (j - i + k)] = (T^k)_ij for |j - i| <= k
  const band: bigint[][] = [[]];
  const at = (k: number, i: number, j: number): bigint => {
    if (j < 0 || j >= n || Math.abs(j - i) > k) return 0n;
    return band[k]![i * (2 * k + 1) + (j - i + k)]!;
  };
  const w1 = 3;
  const t1 = new Array<bigint>(n * w1).fill(0n);
  for (let i = 0; i < n; i++) {
    t1[i * w1 + 1] = d[i]!;
    if (i > 0) t1[i * w1] = e[i - 1]!;
    if (i < n - 1) t1[i * w1 + 2] = e[i]!;
  }
  band.push(t1);
  for (let k = 2; k <= K; k++) {
    const w = 2 * k + 1;
    const next = new Array<bigint>(n * w).fill(0n);
    for (let i = 0; i < n; i++) {
      for (let j = Math.max(0, i - k); j <= Math.min(n - 1, i + k); j++) {
        // (T^(k-1) T)_ij = (T^(k-1))_(i,j-1) e_(j-1) + (T^(k-1))_ij d_j + (T^(k-1))_(i,j+1) e_j
        let s = at(k - 1, i, j) * d[j]!;
        if (j > 0) s += at(k - 1, i, j - 1) * e[j - 1]!;
        if (j < n - 1) s += at(k - 1, i, j + 1) * e[j]!;
        next[i * w + (j - i + k)] = shiftRound(s, -F);
      }
    }
    band.push(next);
  }
  const out: bigint[] = [];
  for (let L = 1; L <= nMax; L++) {
    if (L === 1) {
      out.push(d.reduce((s, v) => s + v, 0n));
      continue;
    }
    const a = Math.ceil(L / 2);
    const b = L - a;
    let s = 0n;
    for (let i = 0; i < n; i++)
      for (let j = Math.max(0, i - b); j <= Math.min(n - 1, i + b); j++)
        s += at(a, i, j) * at(b, i, j);
    out.push((s + (1n << (FB - 1n))) >> FB);
  }
  return out;
}

/**
 * Householder reduction of a symmetric fixed-point matrix to tridiagonal form (the same
 * eigenvalues): returns the diagonal d (n) and the off-diagonal e (n - 1), F bits each.
 */
export function tridiagonalize(M: FixedMatrix, F: number, p?: Pace): { d: bigint[]; e: bigint[] } {
  const n = M.n;
  const a = M.a.slice();
  const FB = BigInt(F);
  const d: bigint[] = [];
  const e: bigint[] = [];
  const u = new Array<bigint>(n).fill(0n);
  const w = new Array<bigint>(n).fill(0n);
  for (let k = 0; k < n - 2; k++) {
    let s2 = 0n;
    for (let i = k + 1; i < n; i++) s2 += a[i * n + k]! * a[i * n + k]!;
    d.push(a[k * n + k]!);
    if (s2 === 0n) {
      e.push(0n);
      continue;
    }
    const x0 = a[(k + 1) * n + k]!;
    const norm = isqrt(s2);
    const alpha = x0 > 0n ? -norm : norm;
    e.push(alpha);
    // v = x - alpha e1, |v|^2 = s2 - 2 alpha x0 + alpha^2 (2F bits)
    const v2 = s2 - 2n * alpha * x0 + alpha * alpha;
    // |v| to F + 8 significant bits even when the column is tiny: u must be a unit vector to
    // 2^-F, or H = I - 2 u u^T is not orthogonal and the trailing block is perturbed
    const G = Math.max(0, F + 8 - Math.floor(bitLength(v2) / 2));
    const vn = isqrt(v2 << BigInt(2 * G));
    const shiftU = BigInt(F + G);
    for (let i = k + 1; i < n; i++) {
      const vi = i === k + 1 ? x0 - alpha : a[i * n + k]!;
      u[i] = (vi << shiftU) / vn;
    }
    // p = 2 A u (lower triangle holds A), w = p - (u.p) u
    for (let i = k + 1; i < n; i++) {
      let s = 0n;
      const ri = i * n;
      for (let j = k + 1; j <= i; j++) s += a[ri + j]! * u[j]!;
      for (let j = i + 1; j < n; j++) s += a[j * n + i]! * u[j]!;
      w[i] = (2n * s) >> FB;
    }
    let up = 0n;
    for (let i = k + 1; i < n; i++) up += u[i]! * w[i]!;
    up >>= FB;
    for (let i = k + 1; i < n; i++) w[i] = w[i]! - ((up * u[i]!) >> FB);
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const ui = u[i]!;
      const wi = w[i]!;
      for (let j = k + 1; j <= i; j++) a[ri + j] = a[ri + j]! - ((ui * w[j]! + wi * u[j]!) >> FB);
    }
    pace(p);
  }
  if (n >= 2) {
    d.push(a[(n - 2) * n + n - 2]!);
    e.push(a[(n - 1) * n + n - 2]!);
  }
  if (n >= 1) d.push(a[(n - 1) * n + n - 1]!);
  return { d, e };
}

/**
 * Coefficients c_0..c_nMax of det(I + kappa T) for the tridiagonal T (F bits each): the leading
 * principal minors obey p_k = (1 + kappa d_k) p_(k-1) - kappa^2 e_(k-1)^2 p_(k-2), truncated at
 * kappa^nMax. c_k = e_k(eigenvalues), the elementary symmetric functions.
 */
export function determinantCoefficients(
  d: bigint[],
  e: bigint[],
  nMax: number,
  F: number,
): bigint[] {
  const FB = BigInt(F);
  const one = 1n << FB;
  let p0 = new Array<bigint>(nMax + 1).fill(0n); // p_(k-2)
  let p1 = new Array<bigint>(nMax + 1).fill(0n); // p_(k-1)
  p1[0] = one;
  p0[0] = one;
  for (let k = 0; k < d.length; k++) {
    const next = new Array<bigint>(nMax + 1).fill(0n);
    const dk = d[k]!;
    const ek2 = k > 0 ? e[k - 1]! * e[k - 1]! : 0n;
    for (let j = 0; j <= nMax; j++) {
      let s = p1[j]!;
      if (j >= 1) s += (dk * p1[j - 1]!) >> FB;
      if (j >= 2 && k > 0) s -= (ek2 * p0[j - 2]!) >> (2n * FB);
      next[j] = s;
    }
    p0 = p1;
    p1 = next;
  }
  return p1;
}

/**
 * Eigenvalues of a symmetric tridiagonal matrix in float64 (implicit QL with Wilkinson shifts);
 * used only for error bounds (sizes of e_k(|lambda|)), never for the values themselves.
 */
export function tridiagonalEigenvaluesFloat(
  d0: ArrayLike<number>,
  e0: ArrayLike<number>,
): number[] {
  const n = d0.length;
  const d = Float64Array.from(d0);
  const e = new Float64Array(n + 1);
  e.set(e0);
  for (let l = 0; l < n; l++) {
    let iter = 0;
    for (;;) {
      let m = l;
      for (; m < n - 1; m++) {
        const dd = Math.abs(d[m]!) + Math.abs(d[m + 1]!);
        if (Math.abs(e[m]!) <= Number.EPSILON * dd) break;
      }
      if (m === l || iter++ > 60) break;
      let g = (d[l + 1]! - d[l]!) / (2 * e[l]!);
      let r = hypot(g, 1);
      g = d[m]! - d[l]! + e[l]! / (g + (g >= 0 ? Math.abs(r) : -Math.abs(r)));
      let s = 1;
      let c = 1;
      let pp = 0;
      let i = m - 1;
      for (; i >= l; i--) {
        let f = s * e[i]!;
        const b = c * e[i]!;
        r = hypot(f, g);
        e[i + 1] = r;
        if (r === 0) {
          d[i + 1]! -= pp;
          e[m] = 0;
          break;
        }
        s = f / r;
        c = g / r;
        g = d[i + 1]! - pp;
        r = (d[i]! - g) * s + 2 * c * b;
        pp = s * r;
        d[i + 1] = g + pp;
        g = c * r - b;
        f = 0;
        void f;
      }
      if (r === 0 && i >= l) continue;
      d[l]! -= pp;
      e[l] = g;
      e[m] = 0;
    }
  }
  return Array.from(d);
}

/** sqrt(a^2 + b^2): Math.hypot only where the squares would leave the normal range (it is slow). */
function hypot(a: number, b: number): number {
  const s = a * a + b * b;
  return s > 1e-290 && s < 1e290 ? Math.sqrt(s) : Math.hypot(a, b);
}

/** e_0..e_k of the numbers xs (float64). */
export function elementarySymmetric(xs: number[], k: number): number[] {
  const out = new Array<number>(k + 1).fill(0);
  out[0] = 1;
  for (const x of xs) for (let j = k; j >= 1; j--) out[j]! += x * out[j - 1]!;
  return out;
}
