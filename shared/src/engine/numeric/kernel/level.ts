import { fromFixed, mul, Real, sqrt, toFixed, toNumber } from '../real.js';
import {
  determinantCoefficients,
  elementarySymmetric,
  type FixedMatrix,
  frobeniusDot,
  inverseCoefficients,
  type Pace,
  pace,
  polyMul,
  powerTraces,
  tridiagonalEigenvaluesFloat,
  tridiagonalize,
} from './matrix.js';
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
  const evenIndex = new Map(reps.map((r, k) => [r, k]));
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
  void evenIndex;
  return [
    { n: ne, a: even },
    { n: no, a: odd },
  ];
}

import { add as addReal, sub as subReal } from '../real.js';
const addR = (a: Real, b: Real, prec: number): Real => addReal(a, b, prec + 4);
const subR = (a: Real, b: Real, prec: number): Real => subReal(a, b, prec + 4);

/**
 * Traces and Fredholm coefficients of one discretisation, by two independent routes: the traces
 * from products of the blocks, the determinant coefficients from their Householder tridiagonal
 * forms (leading-minor recurrence), never one from the other.
 */
export function levelResult(
  blocks: FixedMatrix[],
  nMax: number,
  fermion: boolean,
  F: number,
  p?: Pace,
): LevelResult {
  const u = 2 ** -F;
  let tr: bigint[] = new Array<bigint>(nMax).fill(0n);
  let coeff: bigint[] | null = null;
  let norm2 = 0n;
  const eig: number[] = [];
  const nb = Math.max(...blocks.map((b) => b.n));
  for (const B of blocks) {
    if (B.n === 0) continue;
    const t = powerTraces(B, nMax, F, p);
    tr = tr.map((v, i) => v + t[i]!);
    norm2 += frobeniusDot(B, B);
    const { d, e } = tridiagonalize(B, F, p);
    const c = determinantCoefficients(d, e, nMax, F);
    coeff = coeff ? polyMul(coeff, c, nMax, F) : c;
    const toNum = (v: bigint): number => toNumber(fromFixed(v, F));
    for (const l of tridiagonalEigenvaluesFloat(d.map(toNum), e.map(toNum))) eig.push(Math.abs(l));
  }
  const norm = Math.sqrt(toNumber(fromFixed(norm2, 2 * F)));
  const traces = tr.map((v) => fromFixed(v, 2 * F));
  const absSym = elementarySymmetric(eig, nMax);
  const roundTraces = traces.map(
    (_, i) => 4 * nb * nb * (i + 1) * Math.max(norm, 1) ** (i + 1) * u,
  );
  const delta = 4 * nb * nb * u;
  const cAll = coeff ?? [1n << BigInt(F), ...new Array<bigint>(nMax).fill(0n)];
  const errC = cAll.map((_, N) =>
    N === 0 ? 0 : N * delta * absSym[N - 1]! * 1.01 + 4 * N * nb * u,
  );
  let values: bigint[];
  let errs: number[];
  if (fermion) {
    values = cAll;
    errs = errC;
  } else {
    values = inverseCoefficients(cAll, nMax, F);
    const h = values.map((v) => Math.abs(toNumber(fromFixed(v, F))));
    const c = cAll.map((v) => Math.abs(toNumber(fromFixed(v, F))));
    errs = [0];
    for (let N = 1; N <= nMax; N++) {
      let s = 2 * u;
      for (let k = 1; k <= N; k++) s += errC[k]! * h[N - k]! + c[k]! * errs[N - k]!;
      errs.push(s);
    }
  }
  return {
    points: blocks.reduce((s, b) => s + b.n, 0),
    blocks: blocks.map((b) => b.n),
    traces,
    fredholm: values.map((v) => fromFixed(v, F)),
    roundTraces,
    roundFredholm: errs,
    norm,
    absSymmetric: absSym,
  };
}
