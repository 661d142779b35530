import { gcd } from '../integers.js';
import { abs, bitLength, cmp, div, isqrt, mul, Real, add, sqrt, toFixed, ZERO } from './real.js';

/** Why a search ended. */
export type RelationOutcome =
  /** a relation with max |c_i| <= maxHeight was found */
  | 'found'
  /** the norm bound proves that no relation of height <= maxHeight exists at this precision */
  | 'bound'
  /** a relation was detected, but its height exceeds maxHeight */
  | 'height'
  /** the working precision ran out before the bound or a relation was reached */
  | 'precision'
  /** the iteration cap was reached */
  | 'iterations';

export interface RelationSearch {
  /** the relation (primitive, normalised), or null */
  relation: bigint[] | null;
  outcome: RelationOutcome;
  /** every integer relation of the inputs has Euclidean norm >= normBound (at this precision) */
  normBound: number;
  iterations: number;
}

/** gamma > sqrt(4/3), the PSLQ parameter; log2 of it, for the choice of the exchange row. */
const LOG2_GAMMA = Math.log2(Math.sqrt(4 / 3) + 0.01);

/** log2 |v| of a non-zero BigInt (float estimate). */
function log2Abs(v: bigint): number {
  const bl = bitLength(v);
  if (bl <= 53) return Math.log2(Math.abs(Number(v)));
  const s = bl - 53;
  return Math.log2(Math.abs(Number(v >> BigInt(s)))) + s;
}

/** Nearest integer to a / b (b != 0), ties away from zero. */
function roundDiv(a: bigint, b: bigint): bigint {
  if (b < 0n) {
    a = -a;
    b = -b;
  }
  return a >= 0n ? (2n * a + b) / (2n * b) : -((-2n * a + b) / (2n * b));
}

/** Divide out the common factor; make the first non-zero coefficient positive. */
export function normaliseRelation(c: bigint[]): bigint[] {
  const g = c.reduce((acc, v) => gcd(acc, v), 0n);
  if (g === 0n) return c.slice();
  const first = c.find((v) => v !== 0n)!;
  const s = first < 0n ? -g : g;
  return c.map((v) => v / s);
}

/**
 * Integer relation search by PSLQ (H. R. P. Ferguson, D. H. Bailey, S. Arno, "Analysis of PSLQ,
 * an integer relation finding algorithm", Math. Comp. 68 (1999) 351), in BigInt fixed point.
 *
 * The inputs x_i are taken as known to absolute error 2^-prec * max |x_i| (the precision the data
 * has, not more: digits beyond the data's error are noise and would let PSLQ "find" relations that
 * are artefacts of rounding). The arithmetic carries guard bits beyond prec, and y_j = (x B)_j counts
 * as zero when it is within what that input error can produce, 8 * 2^-prec * ||B_j||_1.
 *
 * Termination: after each iteration 1 / max_j |H_jj| is a lower bound on the Euclidean norm of any
 * relation (the paper's Theorem 1); a relation of height <= maxHeight has norm <= maxHeight * sqrt(n),
 * so once the bound passes that the search stops with the proven statement "no relation of height
 * <= maxHeight" (outcome 'bound'). An iteration cap and an exhausted-precision test stop it otherwise.
 */
export function relationSearch(
  x: Real[],
  prec: number,
  maxHeight: bigint | number,
  opts: { maxIterations?: number } = {},
): RelationSearch {
  const n = x.length;
  if (n < 2) throw new RangeError('an integer relation needs at least two numbers');
  const hMax = Number(maxHeight);
  const W = prec + 32 + 4 * n; // working fixed-point bits
  const one = 1n << BigInt(W);
  const maxIterations = opts.maxIterations ?? 1000 + 40 * n * n + 4 * n * prec;
  const P = W + 16;

  // unit relations first: an input that is zero within the data's error
  let big = ZERO;
  for (const v of x) if (cmp(abs(v), big) > 0) big = abs(v);
  if (big.m === 0n) return { relation: unit(n, 0), outcome: 'found', normBound: 1, iterations: 0 };
  const tiny = new Real(big.m, big.e - prec);
  const zeroAt = x.findIndex((v) => cmp(abs(v), tiny) <= 0);
  if (zeroAt >= 0) {
    return { relation: unit(n, zeroAt), outcome: 'found', normBound: 1, iterations: 0 };
  }

  // normalise x to unit length; s_k = sqrt(sum_{j >= k} x_j^2)
  let sq = ZERO;
  for (const v of x) sq = add(sq, mul(v, v, P), P);
  const norm = sqrt(sq, P);
  const xs = x.map((v) => div(v, norm, P));
  const s: Real[] = new Array<Real>(n);
  let acc = ZERO;
  for (let k = n - 1; k >= 0; k--) {
    acc = add(acc, mul(xs[k]!, xs[k]!, P), P);
    s[k] = sqrt(acc, P);
  }
  const y = xs.map((v) => toFixed(v, W));
  const H: bigint[][] = [];
  for (let i = 0; i < n; i++) {
    const row: bigint[] = new Array<bigint>(n - 1).fill(0n);
    for (let j = 0; j < Math.min(i + 1, n - 1); j++) {
      if (j === i) row[j] = toFixed(div(s[i + 1]!, s[i]!, P), W);
      else {
        const num = mul(xs[i]!, xs[j]!, P);
        row[j] = -toFixed(div(num, mul(s[j]!, s[j + 1]!, P), P), W);
      }
    }
    H.push(row);
  }
  const A: bigint[][] = identity(n);
  const B: bigint[][] = identity(n);

  const reduceRow = (i: number, jFrom: number): void => {
    for (let j = jFrom; j >= 0; j--) {
      if (H[j]![j] === 0n) continue;
      const t = roundDiv(H[i]![j]!, H[j]![j]!);
      if (t === 0n) continue;
      y[j]! += t * y[i]!;
      for (let k = 0; k <= j; k++) H[i]![k]! -= t * H[j]![k]!;
      for (let k = 0; k < n; k++) {
        A[i]![k]! -= t * A[j]![k]!;
        B[k]![j]! += t * B[k]![i]!;
      }
    }
  };
  for (let i = 1; i < n; i++) reduceRow(i, i - 1);

  let normBound = 0;
  for (let it = 1; it <= maxIterations; it++) {
    // 1. the exchange row: maximise gamma^(m+1) |H_mm|
    let m = 0;
    let best = -Infinity;
    for (let i = 0; i < n - 1; i++) {
      const h = H[i]![i]!;
      if (h === 0n) continue;
      const score = log2Abs(h) + (i + 1) * LOG2_GAMMA;
      if (score > best) {
        best = score;
        m = i;
      }
    }
    // 2. exchange m and m + 1
    [y[m], y[m + 1]] = [y[m + 1]!, y[m]!];
    [A[m], A[m + 1]] = [A[m + 1]!, A[m]!];
    [H[m], H[m + 1]] = [H[m + 1]!, H[m]!];
    for (let k = 0; k < n; k++) [B[k]![m], B[k]![m + 1]] = [B[k]![m + 1]!, B[k]![m]!];
    // 3. remove the corner H[m][m+1] by a rotation
    if (m < n - 2) {
      const a = H[m]![m]!;
      const b = H[m]![m + 1]!;
      const t0 = isqrt(a * a + b * b);
      if (t0 !== 0n) {
        const t1 = (a * one) / t0;
        const t2 = (b * one) / t0;
        for (let i = m; i < n; i++) {
          const t3 = H[i]![m]!;
          const t4 = H[i]![m + 1]!;
          H[i]![m] = (t1 * t3 + t2 * t4) >> BigInt(W);
          H[i]![m + 1] = (t1 * t4 - t2 * t3) >> BigInt(W);
        }
      }
    }
    // 4. reduce the rows below m
    for (let i = m + 1; i < n; i++) reduceRow(i, Math.min(i - 1, m + 1));

    // 5. relation detected?
    let found: bigint[] | null = null;
    let foundNorm = Infinity;
    for (let j = 0; j < n; j++) {
      let l1 = 0n;
      for (let k = 0; k < n; k++) l1 += B[k]![j]! < 0n ? -B[k]![j]! : B[k]![j]!;
      const yj = y[j]! < 0n ? -y[j]! : y[j]!;
      if (yj <= l1 << BigInt(W - prec + 3)) {
        const c = B.map((row) => row[j]!);
        const nrm = c.reduce((sum, v) => sum + Number(v) ** 2, 0);
        if (nrm < foundNorm) {
          found = c;
          foundNorm = nrm;
        }
      }
    }
    if (found) {
      const height = found.reduce((h, v) => ((v < 0n ? -v : v) > h ? (v < 0n ? -v : v) : h), 0n);
      const rel = normaliseRelation(found);
      if (Number(height) <= hMax)
        return { relation: rel, outcome: 'found', normBound, iterations: it };
      return { relation: null, outcome: 'height', normBound, iterations: it };
    }

    // 6. the norm bound, and the precision left
    let hDiag = 0;
    for (let j = 0; j < n - 1; j++) {
      const h = H[j]![j]!;
      if (h !== 0n) hDiag = Math.max(hDiag, 2 ** (log2Abs(h) - W));
    }
    normBound = Math.max(normBound, hDiag > 0 ? 1 / hDiag : Infinity);
    if (normBound > hMax * Math.sqrt(n)) {
      return { relation: null, outcome: 'bound', normBound, iterations: it };
    }
    let aMax = 0;
    for (const row of A) for (const v of row) if (v !== 0n) aMax = Math.max(aMax, log2Abs(v));
    if (aMax > prec || H.some((row, j) => j < n - 1 && row[j] === 0n)) {
      return { relation: null, outcome: 'precision', normBound, iterations: it };
    }
  }
  return { relation: null, outcome: 'iterations', normBound, iterations: maxIterations };
}

/**
 * The integer relation c (sum c_i x_i = 0 within the inputs' precision 2^-prec relative to the
 * largest) of smallest norm found by PSLQ with max |c_i| <= maxHeight, primitive and with its
 * first non-zero coefficient positive; null when there is none (proven by the norm bound at this
 * precision, or the search gave up: see `relationSearch` for which).
 */
export function integerRelation(
  x: Real[],
  prec: number,
  maxHeight: bigint | number,
  opts: { maxIterations?: number } = {},
): bigint[] | null {
  return relationSearch(x, prec, maxHeight, opts).relation;
}

function identity(n: number): bigint[][] {
  return Array.from({ length: n }, (_, i) => unit(n, i));
}

function unit(n: number, i: number): bigint[] {
  const v = new Array<bigint>(n).fill(0n);
  v[i] = 1n;
  return v;
}
