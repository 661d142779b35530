import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findRationalFactor, mulTruncRational, rationalCost } from './rational-factor.js';
import { mulTruncStrided } from './mul-trunc.js';

/** The first n coefficients of P / Q by long division (Q_0 divides every step). */
function expand(p: readonly bigint[], q: readonly bigint[], n: number): bigint[] {
  const out: bigint[] = [];
  for (let i = 0; i < n; i++) {
    let s = p[i] ?? 0n;
    for (let k = 1; k < q.length && k <= i; k++) s -= q[k]! * out[i - k]!;
    out.push(s / q[0]!);
  }
  return out;
}

describe('rational factors', () => {
  it('recognises 1/(1+y)^2 = sum (-1)^k (k+1) y^k (the derivative of the geometric series)', () => {
    const c = Array.from({ length: 40 }, (_, k) => (k % 2 === 0 ? 1n : -1n) * BigInt(k + 1));
    const f = findRationalFactor(c);
    expect(f).toEqual({ p: [1n], q: [1n, 2n, 1n], length: 40 });
    expect(rationalCost(f!)).toBe(3);
  });

  it('recognises the Fibonacci numbers as y / (1 - y - y^2) (OEIS A000045)', () => {
    const fib = [0n, 1n];
    while (fib.length < 30) fib.push(fib[fib.length - 1]! + fib[fib.length - 2]!);
    expect(fib[29]).toBe(514229n); // F_29, OEIS A000045
    const f = findRationalFactor(fib);
    expect(f).toEqual({ p: [0n, 1n], q: [1n, -1n, -1n], length: 30 });
  });

  it('finds no short recurrence for the partition numbers (OEIS A000041) nor for a short array', () => {
    const partitions = [1, 1, 2, 3, 5, 7, 11, 15, 22, 30, 42, 56, 77, 101, 135, 176, 231, 297, 385];
    expect(findRationalFactor(partitions.map(BigInt))).toBeNull();
    expect(findRationalFactor([1n, 2n, 3n])).toBeNull();
  });

  it('recovers random P / Q exactly and multiplies by it as the plain product does', () => {
    const coeff = fc.bigInt({ min: -5n, max: 5n });
    let found = 0;
    fc.assert(
      fc.property(
        fc.array(coeff, { minLength: 1, maxLength: 3 }),
        fc.array(coeff, { minLength: 1, maxLength: 4 }),
        fc.array(fc.bigInt({ min: -(2n ** 80n), max: 2n ** 80n }), { maxLength: 60 }),
        fc.integer({ min: 1, max: 5 }),
        fc.integer({ min: 0, max: 120 }),
        (p, qTail, b, stride, n) => {
          const q = [1n, ...qTail];
          const c = expand(p, q, 30);
          const f = findRationalFactor(c);
          if (f === null) return; // a degenerate P / Q (e.g. all zero) may have no recurrence found
          found++;
          expect(expand(f.p, f.q, 30)).toEqual(c);
          const m = Math.min(n, 30 * stride);
          const want = mulTruncStrided(c, stride, b, m);
          const got = mulTruncRational(f, stride, b, m);
          for (let i = 0; i < Math.max(want.length, got.length); i++) {
            expect(got[i] ?? 0n).toBe(want[i] ?? 0n);
          }
        },
      ),
      { numRuns: 300 },
    );
    expect(found).toBeGreaterThan(200);
  });

  it('divides by Q_0 exactly and refuses a length the factor was not checked on', () => {
    // 512 / (2 - y) = 256 sum (y/2)^k: the first nine coefficients are 2^(8-k)
    const c = Array.from({ length: 9 }, (_, k) => 2n ** BigInt(8 - k));
    const f = findRationalFactor(c);
    expect(f).toEqual({ p: [512n], q: [2n, -1n], length: 9 });
    expect(mulTruncRational(f!, 1, [1n, 1n], 3)).toEqual([256n, 384n, 192n]);
    expect(() => mulTruncRational(f!, 2, [1n], 19)).toThrow(RangeError);
    expect(() => mulTruncRational(f!, 0, [1n], 1)).toThrow(RangeError);
  });
});
