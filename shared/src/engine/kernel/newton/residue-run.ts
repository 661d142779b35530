/**
 * One prime's share of the multi-modular Newton recursion: Z(0..nMax) modulo p on the grid.
 * Each Z_L is transformed once, each Z(M) once when known; N Z(N) is a pointwise
 * multiply-accumulate in the transform domain, then one inverse transform.
 */
import { invMod, mulMod, type TransformPrime } from '../modular/word.js';
import { forwardTransform, inverseTransformUnscaled, transformPlan } from '../modular/ntt.js';
import { residueArray } from '../modular/residues.js';
import { EngineCancelled } from '../../errors.js';
import type { NewtonTableInput } from './types.js';

/** 32 products of residues below 2^24 sum exactly in a double (32 * 2^48 = 2^53). */
const ACCUMULATE = 32;

/** Index of the first non-zero coefficient below `length` (Infinity when none). */
export function valuationOf(w: readonly bigint[], length: number): number {
  const lim = Math.min(w.length, length);
  for (let i = 0; i < lim; i++) if (w[i] !== 0n) return i;
  return Infinity;
}

/**
 * Lower bounds of the valuations of Z(0..nMax): v(0) = 0, v(N) = min_L v(Z_L) + v(N-L).
 */
export function valuationBounds(input: NewtonTableInput): number[] {
  const wVal = input.weights.slice(0, input.nMax).map((w) => valuationOf(w, input.length));
  const v = [0];
  for (let N = 1; N <= input.nMax; N++) {
    let m = Infinity;
    for (let L = 1; L <= N; L++) m = Math.min(m, (wVal[L - 1] ?? Infinity) + v[N - L]!);
    v.push(m);
  }
  return v;
}

/**
 * Residues of Z(N) * scale(N) mod p for N = 0..nMax (index 0 unused), each an Int32Array of
 * `length`, or null when Z(N) vanishes below the length.
 */
export function residueRun(
  input: NewtonTableInput,
  prime: TransformPrime,
  size: number,
  valuation: readonly number[],
  scaleMod: (N: number) => number,
  tick: () => void,
): (Int32Array | null)[] {
  const { weights, den, nMax, sign, length } = input;
  const p = prime.p;
  const plan = transformPlan(prime, size);
  const denInv = invMod(Number(den % BigInt(p)), p);
  const wHat: (Int32Array | null)[] = [];
  const wVal: number[] = [];
  for (let L = 1; L <= nMax; L++) {
    const w = weights[L - 1] ?? [];
    wVal.push(valuationOf(w, length));
    if (wVal[L - 1] === Infinity) {
      wHat.push(null);
      continue;
    }
    const negate = sign === -1 && L % 2 === 0;
    const a = residueArray(
      w.length > length ? w.slice(0, length) : w,
      p,
      size,
      negate ? p - denInv : denInv,
    );
    forwardTransform(a, plan, 2 * length <= size);
    wHat.push(a);
  }
  const zHat: (Int32Array | null)[] = [new Int32Array(size).fill(1)];
  const res: (Int32Array | null)[] = [null];
  const acc = new Float64Array(size);
  for (let N = 1; N <= nMax; N++) {
    if (input.shouldStop?.()) throw new EngineCancelled();
    const v = valuation[N]!;
    if (v >= length) {
      zHat.push(null);
      res.push(null);
      tick();
      continue;
    }
    acc.fill(0);
    let pending = 0;
    for (let L = 1; L <= N; L++) {
      const a = wHat[L - 1];
      const b = zHat[N - L];
      if (!a || !b || wVal[L - 1]! + valuation[N - L]! >= length) continue;
      for (let i = 0; i < size; i++) acc[i]! += a[i]! * b[i]!;
      if (++pending === ACCUMULATE) {
        for (let i = 0; i < size; i++) acc[i] = acc[i]! - p * Math.floor(acc[i]! / p);
        pending = 0;
      }
    }
    const scale = mulMod(invMod(N, p), plan.invSize, p);
    const out = new Int32Array(size);
    const scaleQ = scale / p;
    for (let i = 0; i < size; i++) {
      // acc < 2^52: reduce, then multiply by the scale (quotients estimated in float, fixed up)
      const x = acc[i]! - p * Math.floor(acc[i]! / p);
      let r = (x * scale - p * Math.floor(x * scaleQ)) | 0;
      r += (r >> 31) & p;
      r -= p;
      r += (r >> 31) & p;
      out[i] = r;
    }
    inverseTransformUnscaled(out, plan);
    const row = out.slice(0, length);
    for (let i = 0; i < v; i++) row[i] = 0;
    out.set(row);
    out.fill(0, length);
    forwardTransform(out, plan, 2 * length <= size);
    zHat.push(out);
    const s = scaleMod(N);
    if (s !== 1) for (let i = v; i < length; i++) row[i] = mulMod(row[i]!, s, p);
    res.push(row);
    tick();
  }
  return res;
}
