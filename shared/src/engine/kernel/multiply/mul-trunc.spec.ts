import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mulKronecker, mulSchoolbook, mulTrunc, mulTruncStrided } from './mul-trunc.js';

/** Plain reference: every pair, then cut to n (common practice). */
function reference(a: bigint[], b: bigint[], n: number): bigint[] {
  if (a.length === 0 || b.length === 0) return [];
  const out = new Array<bigint>(Math.max(0, Math.min(n, a.length + b.length - 1))).fill(0n);
  a.forEach((x, i) =>
    b.forEach((y, j) => {
      if (i + j < out.length) out[i + j]! += x * y;
    }),
  );
  return out;
}

const small = fc.bigInt({ min: -(10n ** 6n), max: 10n ** 6n });
const huge = fc.bigInt({ min: -(2n ** 400n), max: 2n ** 400n });
const sparseCoeff = fc.oneof(
  { weight: 9, arbitrary: fc.constant(0n) },
  { weight: 1, arbitrary: huge },
);
const arrays = fc.oneof(
  fc.array(small, { maxLength: 60 }),
  fc.array(huge, { maxLength: 40 }),
  fc.array(sparseCoeff, { maxLength: 300 }),
  fc.array(fc.constantFrom(-1n, 0n, 1n), { minLength: 100, maxLength: 400 }),
);

describe('mulTrunc and its variants', () => {
  it('agree with the reference product on random signed, sparse, empty and huge inputs', () => {
    fc.assert(
      fc.property(arrays, arrays, fc.integer({ min: 0, max: 500 }), (a, b, n) => {
        const expected = reference(a, b, n);
        expect(mulTrunc(a, b, n)).toEqual(expected);
        expect(mulKronecker(a, b, n)).toEqual(expected);
        expect(mulSchoolbook(a, b, n)).toEqual(expected);
      }),
      { numRuns: 200 },
    );
  });

  it('handles length-1 factors and an empty factor', () => {
    expect(mulKronecker([-3n], [5n, -7n], 5)).toEqual([-15n, 21n]);
    expect(mulTrunc([], [1n, 2n], 4)).toEqual([]);
    expect(mulKronecker([2n ** 200n], [-(2n ** 200n)], 1)).toEqual([-(2n ** 400n)]);
  });

  it('takes the Kronecker path on large dense inputs and still matches', () => {
    const a = Array.from({ length: 800 }, (_, i) => BigInt(i % 7) - 3n);
    const b = Array.from({ length: 800 }, (_, i) => ((BigInt(i) * 7919n) % 1000003n) - 500000n);
    expect(mulTrunc(a, b, 900)).toEqual(reference(a, b, 900));
  });

  it('mulTruncStrided equals the product with the coarse factor spread onto every stride-th index', () => {
    fc.assert(
      fc.property(
        arrays,
        arrays,
        fc.integer({ min: 1, max: 9 }),
        fc.integer({ min: 0, max: 600 }),
        (coarse, b, stride, n) => {
          const spread: bigint[] = [];
          coarse.forEach((c, i) => {
            while (spread.length < i * stride) spread.push(0n);
            spread.push(c);
          });
          const expected = reference(spread, b, n);
          const got = mulTruncStrided(coarse, stride, b, n);
          // the reference may keep trailing zeros the strided product leaves out: compare values
          const width = Math.max(expected.length, got.length);
          for (let i = 0; i < width; i++) expect(got[i] ?? 0n).toBe(expected[i] ?? 0n);
          expect(got.length).toBeLessThanOrEqual(Math.max(0, n));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('mulTruncStrided on a series in q^3 times a dense one (worked by hand)', () => {
    // (1 + 2 q^3) (1 + q + q^2 + q^3 + q^4) = 1 + q + q^2 + 3 q^3 + 3 q^4 + 2 q^5 + 2 q^6 + 2 q^7
    expect(mulTruncStrided([1n, 2n], 3, [1n, 1n, 1n, 1n, 1n], 20)).toEqual([
      1n,
      1n,
      1n,
      3n,
      3n,
      2n,
      2n,
      2n,
    ]);
    expect(mulTruncStrided([1n, 2n], 3, [1n, 1n, 1n, 1n, 1n], 4)).toEqual([1n, 1n, 1n, 3n]);
    expect(() => mulTruncStrided([1n], 0, [1n], 3)).toThrow(RangeError);
  });
});
