import { add, fromFixed, mul, ONE, Real, sqrt, sub, toFixed, toNumber, ZERO } from '../real.js';
import { DD_UNIT, ddToReal } from './double-double.js';
import {
  determinantCoefficients,
  elementarySymmetric,
  type FixedMatrix,
  type Pace,
  pace,
  tridiagonalEigenvaluesFloat,
  tridiagonalize,
  tridiagonalPowerTraces,
} from './matrix.js';
import {
  determinantCoefficientsDD,
  fixedToDD,
  tridiagonalizeDD,
  tridiagonalPowerTracesDD,
} from './matrix-dd.js';
import type { DDMatrix } from './nystrom-dd.js';
import type { Rule } from './quadrature.js';
import type { KernelAt } from './sampling.js';

/** One resolution's results: values, and the rounding error estimate of each (absolute). */
export interface LevelResult {
  points: number;
  blocks: number[];
  traces: Real[];
  fredholm: Real[];
  roundTraces: number[];
  roundFredholm: number[];
  /** Frobenius norm of the Nystrom matrix (bounds |lambda|). */
  norm: number;
  /** e_k(|lambda|), k = 0..nMax, for error propagation. */
  absSymmetric: number[];
}

/**
 * The Nystrom matrix of rho on the rule, in fixed point with F bits: A_ij = sqrt(w_i) rho(x_i,
 * x_j) sqrt(w_j), split into the even and odd blocks when `parity` (each half the size). Kernel
 * values are cached by node keys so that nested rules reuse them.
 */
export function nystromBlocks(
  rule: Rule,
  rho: KernelAt,
  parity: boolean,
  cache: Map<string, Real>,
  prec: number,
  F: number,
  p?: Pace,
): FixedMatrix[] {
  const at = (i: number, j: number, mirrored: boolean): Real => {
    const key = `${rule.keys[i]}|${mirrored ? '~' : ''}${rule.keys[j]}`;
    let v = cache.get(key);
    if (v === undefined) {
      v = rho(rule.nodes[i]!, rule.nodes[mirrored ? rule.mirror![j]! : j]!);
      cache.set(key, v);
    }
    return v;
  };
  const sw = rule.weights.map((w) => sqrt(w, prec));
  const entry = (i: number, j: number, v: Real, factor: Real | null): bigint => {
    let x = mul(mul(sw[i]!, sw[j]!, prec), v, prec);
    if (factor) x = mul(x, factor, prec);
    return toFixed(x, F);
  };
  const n = rule.nodes.length;
  if (!parity || !rule.mirror) {
    const a = new Array<bigint>(n * n);
    for (let i = 0; i < n; i++) {
      for (let j = i; j < n; j++) a[i * n + j] = a[j * n + i] = entry(i, j, at(i, j, false), null);
      pace(p);
    }
    return [{ n, a }];
  }
  const mirror = rule.mirror;
  const reps: number[] = [];
  for (let i = 0; i < n; i++) if (mirror[i]! >= i) reps.push(i);
  const pairs = reps.filter((i) => mirror[i] !== i);
  const oddIndex = new Map(pairs.map((r, k) => [r, k]));
  const ne = reps.length;
  const no = pairs.length;
  const even = new Array<bigint>(ne * ne);
  const odd = new Array<bigint>(no * no);
  const half = new Real(1n, -1);
  const rootHalf = sqrt(half, prec);
  for (let a = 0; a < ne; a++) {
    const i = reps[a]!;
    for (let b = a; b < ne; b++) {
      const j = reps[b]!;
      const s = at(i, j, false);
      const fi = mirror[i] === i;
      const fj = mirror[j] === j;
      const t = fi || fj ? s : at(i, j, true);
      const sum = fi || fj ? mul(s, new Real(2n, 0), prec + 4) : addR(s, t, prec);
      const factor = fi && fj ? half : fi || fj ? rootHalf : null;
      even[a * ne + b] = even[b * ne + a] = entry(i, j, sum, factor);
      if (!fi && !fj) {
        const oa = oddIndex.get(i)!;
        const ob = oddIndex.get(j)!;
        odd[oa * no + ob] = odd[ob * no + oa] = entry(i, j, subR(s, t, prec), null);
      }
    }
    pace(p);
  }
  return [
    { n: ne, a: even },
    { n: no, a: odd },
  ];
}

const addR = (a: Real, b: Real, prec: number): Real => add(a, b, prec + 4);
const subR = (a: Real, b: Real, prec: number): Real => sub(a, b, prec + 4);

/** How the blocks are reduced: BigInt fixed point (any precision) or double-double (fast). */
export type Arithmetic = 'fixed' | 'dd';

/** A Nystrom block in fixed point, or already in double-double. */
export type Block = FixedMatrix | DDMatrix;

/** One block's tridiagonal reduction: traces, det(1 + kappa B) coefficients, sizes. */
interface Reduced {
  traces: Real[];
  coeff: Real[];
  norm2: number;
  eig: number[];
}

function reduceFixed(B: FixedMatrix, nMax: number, F: number, p?: Pace): Reduced {
  const { d, e } = tridiagonalize(B, F, p);
  const toNum = (v: bigint): number => toNumber(fromFixed(v, F));
  let norm2 = 0n;
  for (const v of d) norm2 += v * v;
  for (const v of e) norm2 += 2n * v * v;
  return {
    traces: tridiagonalPowerTraces(d, e, nMax, F).map((v) => fromFixed(v, F)),
    coeff: determinantCoefficients(d, e, nMax, F).map((v) => fromFixed(v, F)),
    norm2: toNumber(fromFixed(norm2, 2 * F)),
    eig: tridiagonalEigenvaluesFloat(d.map(toNum), e.map(toNum)),
  };
}

function reduceDD(B: Block, nMax: number, F: number, p?: Pace): Reduced {
  const { d, e } = tridiagonalizeDD(B.n, 'hi' in B ? B : fixedToDD(B, F), p);
  const t = tridiagonalPowerTracesDD(d, e, nMax);
  const c = determinantCoefficientsDD(d, e, nMax);
  let norm2 = 0;
  for (let i = 0; i < d.hi.length; i++) norm2 += d.hi[i]! * d.hi[i]!;
  for (let i = 0; i < e.hi.length; i++) norm2 += 2 * e.hi[i]! * e.hi[i]!;
  return {
    traces: Array.from(t.hi, (h, i) => ddToReal(h, t.lo[i]!)),
    coeff: Array.from(c.hi, (h, i) => ddToReal(h, c.lo[i]!)),
    norm2,
    eig: tridiagonalEigenvaluesFloat(d.hi, e.hi),
  };
}

/**
 * Traces and Fredholm coefficients of one discretisation from the Householder tridiagonal form T
 * of each block (the same eigenvalues): the traces Tr T^L from banded powers of T (they feed the
 * Newton recursion), the determinant coefficients from the leading-minor recurrence of T. The two
 * routes share the reduction but not the algebra: the recursion's cancellation shows in its own
 * error, the minor recurrence has none for positive kernels. The blocks' determinants are
 * multiplied (and inverted for bosons) in Real arithmetic.
 *
 * Rounding model: the reduction moves each eigenvalue by at most delta (4 n^2 units, absolute in
 * fixed point, relative to |A|_F in double-double, plus the entries' own rounding there).
 */
export function levelResult(
  blocks: Block[],
  nMax: number,
  fermion: boolean,
  F: number,
  arithmetic: Arithmetic,
  p?: Pace,
): LevelResult {
  const prec = F + 64;
  let traces: Real[] = new Array<Real>(nMax).fill(ZERO);
  let coeff: Real[] = [ONE, ...new Array<Real>(nMax).fill(ZERO)];
  let norm2 = 0;
  const eig: number[] = [];
  const nb = Math.max(...blocks.map((b) => b.n));
  for (const B of blocks) {
    if (B.n === 0) continue;
    const r =
      arithmetic === 'dd' || 'hi' in B ? reduceDD(B, nMax, F, p) : reduceFixed(B, nMax, F, p);
    traces = traces.map((v, i) => add(v, r.traces[i]!, prec));
    coeff = truncatedProduct(coeff, r.coeff, nMax, prec);
    norm2 += r.norm2;
    for (const l of r.eig) eig.push(Math.abs(l));
    pace(p);
  }
  const norm = Math.sqrt(norm2);
  const absSym = elementarySymmetric(eig, nMax);
  const fixedUnit = 2 ** -F;
  const dd = arithmetic === 'dd';
  const entryUnit = Math.max(...blocks.map((b) => ('unit' in b ? b.unit : fixedUnit)));
  const delta = dd ? 4 * nb * nb * DD_UNIT * norm + nb * entryUnit : 4 * nb * nb * fixedUnit;
  // |sum lambda^L - sum mu^L| <= L delta sum |lambda|^(L-1), with sum |lambda|^(L-1) <= sqrt(n)
  // |A|_F (L = 2), |A|_F^(L-1) (L > 2); plus the rounding of the banded powers
  const roundTraces = traces.map((_, i) => {
    const L = i + 1;
    const moved =
      L === 1 ? nb * delta : L * delta * (L === 2 ? Math.sqrt(nb) * norm : norm ** (L - 1));
    const own = dd
      ? 4 * L * nb * DD_UNIT * Math.max(norm ** L, Math.sqrt(nb) * norm)
      : 4 * L * nb * Math.max(norm, 1) ** L * fixedUnit;
    return moved + own;
  });
  const errC = coeff.map((_, N) =>
    N === 0
      ? 0
      : N * delta * absSym[N - 1]! * 1.01 + 4 * N * nb * (dd ? DD_UNIT * absSym[N]! : fixedUnit),
  );
  let values = coeff;
  let errs = errC;
  if (!fermion) {
    values = inverseSeries(coeff, nMax, prec);
    const h = values.map((v) => Math.abs(toNumber(v)));
    const c = coeff.map((v) => Math.abs(toNumber(v)));
    errs = [0];
    for (let N = 1; N <= nMax; N++) {
      let s = 2 ** -prec * h[N]!;
      for (let k = 1; k <= N; k++) s += errC[k]! * h[N - k]! + c[k]! * errs[N - k]!;
      errs.push(s);
    }
  }
  return {
    points: blocks.reduce((s, b) => s + b.n, 0),
    blocks: blocks.map((b) => b.n),
    traces,
    fredholm: values,
    roundTraces,
    roundFredholm: errs,
    norm,
    absSymmetric: absSym,
  };
}

/** (a * b) truncated at degree nMax. */
function truncatedProduct(a: Real[], b: Real[], nMax: number, prec: number): Real[] {
  const out: Real[] = new Array<Real>(nMax + 1).fill(ZERO);
  for (let i = 0; i <= nMax; i++)
    for (let j = 0; i + j <= nMax; j++)
      out[i + j] = add(out[i + j]!, mul(a[i]!, b[j]!, prec), prec);
  return out;
}

/** h_0..h_nMax of 1 / det(I - kappa T) from c of det(I + kappa T): h_N = sum (-1)^(k+1) c_k h_(N-k). */
function inverseSeries(c: Real[], nMax: number, prec: number): Real[] {
  const h: Real[] = [ONE];
  for (let N = 1; N <= nMax; N++) {
    let s: Real = ZERO;
    for (let k = 1; k <= N; k++) {
      const t = mul(c[k]!, h[N - k]!, prec);
      s = k % 2 === 1 ? add(s, t, prec) : sub(s, t, prec);
    }
    h.push(s);
  }
  return h;
}
