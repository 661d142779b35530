/**
 * Number-theoretic transforms of length 2^k over a word prime, in float64 arithmetic.
 * The forward transform is decimation in frequency (natural order in, bit-reversed out) and the
 * inverse is decimation in time (bit-reversed in, natural out), so no permutation pass is needed:
 * pointwise products in the transform domain do not care about the order.
 */
import { invMod, mulMod, powMod, type TransformPrime } from './word.js';

/** Precomputed twiddles for one prime and one length. */
export interface TransformPlan {
  readonly p: number;
  readonly size: number;
  /** forward twiddles, stage of half-size h at offsets h..2h-1 */
  readonly tw: Float64Array;
  /** tw / p, for the one-multiplication quotient estimate */
  readonly twq: Float64Array;
  readonly itw: Float64Array;
  readonly itwq: Float64Array;
  /** 1 / size mod p */
  readonly invSize: number;
}

/** Builds the plan for transforms of length `size` (a power of two, at most 2^prime.k). */
export function transformPlan(prime: TransformPrime, size: number): TransformPlan {
  const { p } = prime;
  const logSize = Math.log2(size);
  if (!Number.isInteger(logSize) || logSize > prime.k) {
    throw new RangeError(`transform length ${size} is not a power of two up to 2^${prime.k}`);
  }
  const omega = powMod(prime.root, 2 ** (prime.k - logSize), p);
  const omegaInv = invMod(omega, p);
  const tw = new Float64Array(Math.max(size, 2));
  const itw = new Float64Array(Math.max(size, 2));
  for (let h = 1; h < size; h *= 2) {
    const w = powMod(omega, size / (2 * h), p);
    const wi = powMod(omegaInv, size / (2 * h), p);
    let x = 1;
    let xi = 1;
    for (let j = 0; j < h; j++) {
      tw[h + j] = x;
      itw[h + j] = xi;
      x = mulMod(x, w, p);
      xi = mulMod(xi, wi, p);
    }
  }
  const twq = tw.map((w) => w / p);
  const itwq = itw.map((w) => w / p);
  return { p, size, tw, twq, itw, itwq, invSize: invMod(size, p) };
}

/**
 * In-place forward transform (natural order in, bit-reversed order out); residues in [0, p).
 * `upperHalfZero` promises a[size/2..] = 0, which turns the first stage into one multiplication.
 */
export function forwardTransform(a: Int32Array, plan: TransformPlan, upperHalfZero = false): void {
  const { p, size, tw, twq } = plan;
  let top = size >> 1;
  if (upperHalfZero && top >= 1) {
    for (let j = 0; j < top; j++) {
      const u = a[j]!;
      let r = (u * tw[top + j]! - p * Math.floor(u * twq[top + j]!)) | 0;
      r += (r >> 31) & p;
      r -= p;
      r += (r >> 31) & p;
      a[j + top] = r;
    }
    top >>= 1;
  }
  // branch-free corrections: residues are below 2^24, so int32 sign tricks are exact
  for (let h = top; h >= 1; h >>= 1) {
    for (let s = 0; s < size; s += 2 * h) {
      for (let j = 0; j < h; j++) {
        const i = s + j;
        const u = a[i]!;
        const v = a[i + h]!;
        let sum = u + v - p;
        sum += (sum >> 31) & p;
        a[i] = sum;
        let d = u - v;
        d += (d >> 31) & p;
        let r = (d * tw[h + j]! - p * Math.floor(d * twq[h + j]!)) | 0;
        r += (r >> 31) & p;
        r -= p;
        r += (r >> 31) & p;
        a[i + h] = r;
      }
    }
  }
}

/**
 * In-place inverse transform (bit-reversed order in, natural order out), without the 1/size
 * factor: callers fold plan.invSize into a scaling they do anyway.
 */
export function inverseTransformUnscaled(a: Int32Array, plan: TransformPlan): void {
  const { p, size, itw, itwq } = plan;
  for (let h = 1; h < size; h <<= 1) {
    for (let s = 0; s < size; s += 2 * h) {
      for (let j = 0; j < h; j++) {
        const i = s + j;
        const u = a[i]!;
        const x = a[i + h]!;
        let v = (x * itw[h + j]! - p * Math.floor(x * itwq[h + j]!)) | 0;
        v += (v >> 31) & p;
        v -= p;
        v += (v >> 31) & p;
        let sum = u + v - p;
        sum += (sum >> 31) & p;
        a[i] = sum;
        let d = u - v;
        d += (d >> 31) & p;
        a[i + h] = d;
      }
    }
  }
}

/** Cyclic convolution of residue arrays of length plan.size (inputs are overwritten). */
export function cyclicConvolution(a: Int32Array, b: Int32Array, plan: TransformPlan): Int32Array {
  forwardTransform(a, plan);
  forwardTransform(b, plan);
  const { p, invSize } = plan;
  for (let i = 0; i < a.length; i++) a[i] = mulMod(mulMod(a[i]!, b[i]!, p), invSize, p);
  inverseTransformUnscaled(a, plan);
  return a;
}
