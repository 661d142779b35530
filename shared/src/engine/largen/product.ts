import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { frac } from '../rational.js';
import type { Series } from '../series/series.js';
import { describePattern } from './patterns.js';
import type { ProductFormJson } from './types.js';

/** Moebius function mu(n) for n >= 1 (trial division). */
export function moebius(n: number): number {
  let m = n;
  let r = 1;
  for (let p = 2; p * p <= m; p++) {
    if (m % p === 0) {
      m /= p;
      if (m % p === 0) return 0;
      r = -r;
    }
  }
  return m > 1 ? -r : r;
}

/**
 * Exponents a_1 .. a_(M-1) of f = prod_{k>=1} (1 - x^k)^(-a_k), x = q^step, for f with constant
 * term exactly 1 known below grid index M (a_k determined for k < M). From x f'/f = sum b_m x^m,
 * m f_m = sum_{j=1..m} b_j f_(m-j), and b_m = sum_{d|m} d a_d (Moebius inversion).
 */
export function productExponentList(f: Series, limit = Infinity): { a: Fraction[]; M: number } {
  if (f.num.length === 0 || f.start !== 0 || f.num[0] !== f.den) {
    throw new EngineError('a product form needs a series with constant term 1');
  }
  const M = Math.min(f.order ?? Infinity, limit);
  if (M === Infinity) throw new EngineError('an exact series needs a limit for its product form');
  const nz: number[] = [];
  for (let i = 1; i < Math.min(f.num.length, M); i++) if (f.num[i] !== 0n) nz.push(i);
  const b: Fraction[] = [frac(0)];
  if (f.den === 1n) {
    const F = f.num;
    const B: bigint[] = [0n];
    for (let m = 1; m < M; m++) {
      let s = m < F.length ? BigInt(m) * F[m]! : 0n;
      for (const j of nz) {
        if (j >= m) break;
        s -= B[m - j]! * F[j]!;
      }
      B.push(s);
    }
    for (let m = 1; m < M; m++) b.push(frac(B[m]!));
  } else {
    const fm = (i: number): Fraction => (i < f.num.length ? frac(f.num[i]!, f.den) : frac(0));
    for (let m = 1; m < M; m++) {
      let s = fm(m).mul(m);
      for (const j of nz) {
        if (j >= m) break;
        s = s.sub(b[m - j]!.mul(fm(j)));
      }
      b.push(s);
    }
  }
  const a: Fraction[] = [];
  for (let m = 1; m < M; m++) {
    let s = frac(0);
    for (let d = 1; d * d <= m; d++) {
      if (m % d !== 0) continue;
      const e = m / d;
      const mu1 = moebius(e);
      if (mu1 !== 0) s = s.add(b[d]!.mul(mu1));
      if (e !== d) {
        const mu2 = moebius(d);
        if (mu2 !== 0) s = s.add(b[e]!.mul(mu2));
      }
    }
    a.push(s.div(m));
  }
  return { a, M };
}

/** Exponents computed at most (the work grows as their number squared). */
export const MAX_COMPUTED = 2000;

/**
 * The product form of a series with constant term 1 in the result format: exact exponents a_n
 * for every n below the order, the grid of n, and a pattern when one holds on every known n.
 */
export function productForm(
  f: Series,
  maxShown = Infinity,
  maxComputed = MAX_COMPUTED,
): ProductFormJson {
  const { a, M } = productExponentList(f, maxComputed);
  const exponents = a
    .slice(0, Math.min(a.length, maxShown))
    .map((x, i) => ({ n: f.step.mul(i + 1).toFraction(), a: x.toFraction() }));
  const { pattern, note: patternNote } = describePattern(a, f.step);
  const cut = f.order === null || M < f.order;
  const note = cut
    ? `${patternNote} (the first ${M - 1} exponents computed; more are determined)`
    : patternNote;
  return {
    exponents,
    step: f.step.toFraction(),
    determinedBelow: f.step.mul(M).toFraction(),
    pattern,
    patternNote: note,
  };
}
