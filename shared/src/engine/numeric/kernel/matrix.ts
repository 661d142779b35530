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

/**
 * C = A B rounded to F fractional bits. The entries are cut into slices of beta bits held exactly
 * as float64 integers; slice products are then exact float64 matrix products (beta is chosen so
 * that no sum exceeds 2^53), and the levels are added up once per entry in BigInt.
 */
export function multiply(
  A: FixedMatrix,
  B: FixedMatrix,
  F: number,
  p?: Pace,
  symmetric?: boolean,
): FixedMatrix {
  const n = A.n;
  const lgn = Math.ceil(Math.log2(n + 1));
  const topA = maxBits(A.a);
  const topB = maxBits(B.a);
  if (topA === 0 || topB === 0) return { n, a: new Array<bigint>(n * n).fill(0n) };
  // level g = p + q of slice products is at most 2^(topA + topB + lgn + 1 - beta g) in units of
  // 2^-2F; levels are kept until the rest is below 2^(F - 2); beta keeps every sum below 2^53
  const count = (b: number): number => Math.max(1, Math.floor((topA + topB + lgn + 4 - F) / b) + 1);
  let beta = Math.floor((53 - lgn - 4) / 2);
  let G = count(beta);
  while (beta > 4 && 2 * beta + 2 + lgn + Math.log2(G) > 53) {
    beta--;
    G = count(beta);
  }
  const slicesA = slice(A.a, topA, beta, G);
  const slicesB = A === B ? slicesA : slice(B.a, topB, beta, G);
  // powers of one symmetric matrix commute, so C is symmetric: only j >= i is computed
  const sym = symmetric === true;
  const acc: Float64Array[] = [];
  for (let g = 0; g < G; g++) {
    const C = new Float64Array(n * n);
    for (let q = 0; q <= g; q++) {
      const a = slicesA[g - q];
      const b = slicesB[q];
      if (!a || !b) continue;
      floatProduct(a, b, C, n, sym);
      pace(p);
    }
    acc.push(C);
  }
  // entry = sum_g acc_g * 2^(topA + topB - beta (g + 2)) * 2^-F (fixed point of A, B: 2^-F each)
  const out = new Array<bigint>(n * n);
  const base = topA + topB - beta * (G + 1);
  const shift = base - F;
  for (let i = 0; i < n * n; i++) {
    let s = 0n;
    for (let g = 0; g < G; g++) {
      const v = acc[g]![i]!;
      if (v !== 0) s += BigInt(v) << BigInt(beta * (G - 1 - g));
    }
    out[i] = shiftRound(s, shift);
  }
  if (sym) for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) out[i * n + j] = out[j * n + i]!;
  return { n, a: out };
}

/** s * 2^k rounded to an integer. */
function shiftRound(s: bigint, k: number): bigint {
  if (k >= 0) return s << BigInt(k);
  const kk = BigInt(-k);
  return (s + (1n << (kk - 1n))) >> kk;
}

function maxBits(a: bigint[]): number {
  let m = 0;
  for (const v of a) {
    const b = bitLength(v);
    if (b > m) m = b;
  }
  return m;
}

/** Signed slices: a = sum_p s_p 2^(top - beta (p + 1)) + rest, |s_p| <= 2^beta. */
function slice(a: bigint[], top: number, beta: number, count: number): Float64Array[] {
  const out: Float64Array[] = [];
  for (let p = 0; p < count; p++) out.push(new Float64Array(a.length));
  const B = BigInt(beta);
  for (let i = 0; i < a.length; i++) {
    let r = a[i]!;
    if (r === 0n) continue;
    // work on r * 2^(beta*count - top) so that every slice is an integer digit
    const k = beta * count - top;
    r = k >= 0 ? r << BigInt(k) : shiftRound(r, k);
    const half = 1n << (B - 1n);
    for (let p = count - 1; p >= 0; p--) {
      // lowest digit first (balanced digits in (-2^(beta-1), 2^(beta-1)])
      let d = r & ((1n << B) - 1n);
      if (d > half) d -= 1n << B;
      out[p]![i] = Number(d);
      r = (r - d) >> B;
    }
    out[0]![i]! += Number(r) * 2 ** beta; // the top digit may carry (|value| < 2^(beta+1))
  }
  return out;
}

/** C += A B for n x n float64 matrices (row-major), i-k-j order; only j >= i when `upper`. */
function floatProduct(
  A: Float64Array,
  B: Float64Array,
  C: Float64Array,
  n: number,
  upper: boolean,
): void {
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    const j0 = upper ? i : 0;
    for (let k = 0; k < n; k++) {
      const aik = A[ri + k]!;
      if (aik === 0) continue;
      const rk = k * n;
      for (let j = j0; j < n; j++) C[ri + j]! += aik * B[rk + j]!;
    }
  }
}

/** sum_ij X_ij Y_ij (= Tr X Y for symmetric X, Y) as a fixed-point number with 2F bits. */
export function frobeniusDot(X: FixedMatrix, Y: FixedMatrix): bigint {
  let s = 0n;
  const x = X.a;
  const y = Y.a;
  for (let i = 0; i < x.length; i++) s += x[i]! * y[i]!;
  return s;
}

/** Sum of the diagonal (F bits). */
export function trace(X: FixedMatrix): bigint {
  let s = 0n;
  for (let i = 0; i < X.n; i++) s += X.a[i * X.n + i]!;
  return s;
}

/**
 * Tr A^L for L = 1..nMax (2F fractional bits each) from a few powers of A: Tr A^(a+b) =
 * sum_ij (A^a)_ij (A^b)_ij for symmetric powers. The powers form a set S (1, 2, 4, 5, ... for
 * nMax = 10: three products) in which every L <= nMax is a sum of two members.
 */
export function powerTraces(A: FixedMatrix, nMax: number, F: number, p?: Pace): bigint[] {
  const plan = powerPlan(nMax);
  const pow = new Map<number, FixedMatrix>([[1, A]]);
  for (const [k, [x, y]] of plan.build) pow.set(k, multiply(pow.get(x)!, pow.get(y)!, F, p, true));
  const out: bigint[] = [trace(A) << BigInt(F)];
  for (let L = 2; L <= nMax; L++) {
    const [x, y] = plan.split.get(L)!;
    out.push(frobeniusDot(pow.get(x)!, pow.get(y)!));
  }
  return out;
}

/** Which powers to build (k = x + y, in order) and how each L splits into two of them. */
export function powerPlan(nMax: number): {
  build: [number, [number, number]][];
  split: Map<number, [number, number]>;
} {
  const S = [1];
  const build: [number, [number, number]][] = [];
  const split = new Map<number, [number, number]>();
  const pairOf = (k: number): [number, number] | undefined => {
    for (const a of S) if (S.includes(k - a)) return [Math.max(a, k - a), Math.min(a, k - a)];
    return undefined;
  };
  for (let L = 2; L <= nMax; L++) {
    let pair = pairOf(L);
    if (!pair) {
      // add the smallest x >= L/2 with L - x in S and x buildable from S
      for (let x = Math.ceil(L / 2); x < L && !pair; x++) {
        const parts = pairOf(x);
        if (S.includes(L - x) && parts) {
          S.push(x);
          build.push([x, parts]);
          pair = [x, L - x];
        }
      }
      if (!pair) {
        const parts = pairOf(L) ?? [L - 1, 1];
        S.push(L);
        build.push([L, parts]);
        pair = [L, 0];
      }
    }
    split.set(L, pair);
  }
  return { build, split };
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

/** Product of two coefficient lists (F bits), truncated at degree nMax. */
export function polyMul(a: bigint[], b: bigint[], nMax: number, F: number): bigint[] {
  const out = new Array<bigint>(nMax + 1).fill(0n);
  for (let i = 0; i <= nMax; i++)
    for (let j = 0; i + j <= nMax; j++) out[i + j] = out[i + j]! + a[i]! * b[j]!;
  return out.map((v) => shiftRound(v, -F));
}

/**
 * Coefficients h_0..h_nMax of 1 / det(I - kappa T) from c = coefficients of det(I + kappa T):
 * h_N = sum_k (-1)^(k+1) c_k h_(N-k) (complete homogeneous symmetric functions).
 */
export function inverseCoefficients(c: bigint[], nMax: number, F: number): bigint[] {
  const h: bigint[] = [1n << BigInt(F)];
  for (let N = 1; N <= nMax; N++) {
    let s = 0n;
    for (let k = 1; k <= N; k++) s += (k % 2 === 1 ? 1n : -1n) * c[k]! * h[N - k]!;
    h.push(shiftRound(s, -F));
  }
  return h;
}

/**
 * Eigenvalues of a symmetric tridiagonal matrix in float64 (implicit QL with Wilkinson shifts);
 * used only for error bounds (sizes of e_k(|lambda|)), never for the values themselves.
 */
export function tridiagonalEigenvaluesFloat(d0: number[], e0: number[]): number[] {
  const n = d0.length;
  const d = d0.slice();
  const e = [...e0, 0];
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
      let r = Math.hypot(g, 1);
      g = d[m]! - d[l]! + e[l]! / (g + (g >= 0 ? Math.abs(r) : -Math.abs(r)));
      let s = 1;
      let c = 1;
      let pp = 0;
      let i = m - 1;
      for (; i >= l; i--) {
        let f = s * e[i]!;
        const b = c * e[i]!;
        r = Math.hypot(f, g);
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
  return d;
}

/** e_0..e_k of the numbers xs (float64). */
export function elementarySymmetric(xs: number[], k: number): number[] {
  const out = new Array<number>(k + 1).fill(0);
  out[0] = 1;
  for (const x of xs) for (let j = k; j >= 1; j--) out[j]! += x * out[j - 1]!;
  return out;
}
