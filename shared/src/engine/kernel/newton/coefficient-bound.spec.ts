import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { newtonTableBig } from './big.js';
import { logAbs, newtonCoefficientLog2Bounds } from './coefficient-bound.js';

const log2MaxAbs = (row: readonly bigint[], den: bigint): number => {
  let m = 0n;
  for (const c of row) if ((c < 0n ? -c : c) > m) m = c < 0n ? -c : c;
  return m === 0n ? -Infinity : (logAbs(m) - logAbs(den)) / Math.LN2;
};

describe('logAbs', () => {
  it('is ln|x| for float-sized x and an upper estimate, tight to 1e-12, for huge x', () => {
    expect(logAbs(0n)).toBe(-Infinity);
    expect(logAbs(-1000n)).toBeCloseTo(Math.log(1000), 12);
    // ln(10^400) = 400 ln 10 (exact identity)
    const huge = logAbs(10n ** 400n);
    expect(huge).toBeGreaterThanOrEqual(400 * Math.LN10);
    expect(huge - 400 * Math.LN10).toBeLessThan(1e-12 * huge);
  });
});

describe('newtonCoefficientLog2Bounds', () => {
  it('Z_L = 1: the majorant is the boson table 1/(1 - kappa), so every bound is log2 1 = 0 (geometric series, common practice)', () => {
    const weights = Array.from({ length: 12 }, () => [1n]);
    const b = newtonCoefficientLog2Bounds(weights, 1n, 12, 1);
    for (const x of b) {
      expect(x).toBeGreaterThanOrEqual(0);
      expect(x).toBeLessThan(1e-5);
    }
  });

  it('zero weights give -Infinity (Z(N) = 0 below the length for N >= 1)', () => {
    const b = newtonCoefficientLog2Bounds([[0n], [0n, 0n]], 1n, 2, 2);
    expect(b.slice(1)).toEqual([-Infinity, -Infinity]);
  });

  it('bounds every coefficient of the exact table (BigInt route) on random weights, both signs', () => {
    const input = fc.record({
      length: fc.integer({ min: 1, max: 12 }),
      nMax: fc.integer({ min: 1, max: 7 }),
      den: fc.bigInt({ min: 1n, max: 30n }),
      sign: fc.constantFrom(1 as const, -1 as const),
      weights: fc.array(fc.array(fc.bigInt({ min: -1000000n, max: 1000000n }), { maxLength: 12 }), {
        minLength: 7,
        maxLength: 7,
      }),
    });
    fc.assert(
      fc.property(input, ({ length, nMax, den, sign, weights }) => {
        const bound = newtonCoefficientLog2Bounds(weights, den, nMax, length);
        const exact = newtonTableBig({ weights, den, nMax, sign, length });
        for (let N = 0; N <= nMax; N++)
          expect(log2MaxAbs(exact.num[N]!, exact.den[N]!)).toBeLessThanOrEqual(bound[N]!);
      }),
      { numRuns: 150 },
    );
  });
});
