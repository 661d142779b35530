import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { factorial, reduceRow, reduceRowScaled } from './integers.js';

describe('reduceRowScaled', () => {
  it('gives the same reduced row as reduceRow (random rows, bases, powers and extras)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.bigInt({ min: -(10n ** 30n), max: 10n ** 30n }), { maxLength: 6 }),
        fc.bigInt({ min: 1n, max: 360n }),
        fc.integer({ min: 0, max: 8 }),
        fc.bigInt({ min: 1n, max: 5040n }),
        fc.array(fc.integer({ min: 0, max: 8 }), { minLength: 6, maxLength: 6 }),
        (raw, base, count, extra, shares) => {
          // numerators sharing powers of the base and a factor of the extra, as scaled rows do
          const num = raw.map((c, i) => c * base ** BigInt(shares[i]!) * (i % 2 ? extra : 1n));
          const den = extra * base ** BigInt(count);
          const plain = reduceRow([...num], den);
          const scaled = reduceRowScaled([...num], base, count, extra);
          expect(scaled.den).toBe(plain.den);
          expect(scaled.num).toEqual(plain.num);
        },
      ),
      { numRuns: 400 },
    );
  });

  it('reduces N! D^N Z(N) for a known Z(N) (worked by hand)', () => {
    // 150 / (3! 6^3) = 150 / 1296 = 25 / 216 (by hand: gcd 6)
    const r = reduceRowScaled([150n], 6n, 3, factorial(3));
    expect(r).toEqual({ num: [25n], den: 216n });
    expect(reduceRowScaled([0n, 0n], 10n, 4, 7n)).toEqual({ num: [0n, 0n], den: 1n });
  });
});
