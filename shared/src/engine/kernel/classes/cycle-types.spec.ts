import fc from 'fast-check';
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { classSumRational } from './class-sum.js';
import { exponentNotation, forEachCycleType } from './cycle-types.js';
import { newtonTable } from '../newton/table.js';

const factorial = (n: number): bigint => (n <= 1 ? 1n : BigInt(n) * factorial(n - 1));

describe('cycle types of S_n', () => {
  it('number of cycle types = partitions p(n) (OEIS A000041; A&S Table 24.5)', () => {
    const p = [
      1, 1, 2, 3, 5, 7, 11, 15, 22, 30, 42, 56, 77, 101, 135, 176, 231, 297, 385, 490, 627,
    ];
    expect(p.map((_, n) => forEachCycleType(n, () => {}))).toEqual(p);
    expect(forEachCycleType(40, () => {})).toBe(37338);
    expect(forEachCycleType(50, () => {})).toBe(204226);
  });

  it('class sizes sum to n! and the cycles fill n (A&S Table 24.2)', () => {
    for (const n of [1, 5, 9, 14]) {
      let total = 0n;
      forEachCycleType(n, (v) => {
        total += v.size;
        expect(exponentNotation(v).reduce((s, [L, m]) => s + L * m, 0)).toBe(n);
      });
      expect(total).toBe(factorial(n));
    }
  });

  it('S_4 in the order and with the sizes of A&S Table 24.2: 1^4:1, 1^2 2:6, 2^2:3, 1 3:8, 4:6', () => {
    const rows: [string, string, number][] = [];
    forEachCycleType(4, (v) =>
      rows.push([
        exponentNotation(v)
          .map(([L, m]) => `${L}^${m}`)
          .join(' '),
        v.size.toString(),
        v.sign,
      ]),
    );
    expect(rows).toEqual([
      ['1^4', '1', 1],
      ['1^2 2^1', '6', -1],
      ['2^2', '3', 1],
      ['1^1 3^1', '8', 1],
      ['4^1', '6', -1],
    ]);
  });
});

describe('classSumRational', () => {
  const rational = fc.record({
    num: fc.bigInt({ min: -20n, max: 20n }),
    den: fc.bigInt({ min: 1n, max: 12n }),
  });

  it('equals the Newton recursion for random rational weights, both statistics (common practice)', () => {
    fc.assert(
      fc.property(
        fc.array(rational, { minLength: 9, maxLength: 9 }),
        fc.constantFrom<1 | -1>(1, -1),
        (w, sign) => {
          // the recursion wants one common denominator
          const common = w.reduce((d, x) => d * x.den, 1n);
          const weights = w.map((x) => [x.num * (common / x.den)]);
          const table = newtonTable({ weights, den: common, nMax: 9, sign, length: 1 });
          for (const n of [1, 4, 9]) {
            const z = classSumRational({ weights: w, n, sign });
            expect(new Fraction(z.num, z.den).toFraction()).toBe(
              new Fraction(table.num[n]![0]!, table.den[n]!).toFraction(),
            );
          }
        },
      ),
      { numRuns: 30 },
    );
  });

  it('streams rows whose contributions add up to the total, with fraction.js as the reference', () => {
    const weights = Array.from({ length: 12 }, (_, i) => ({
      num: BigInt((-1) ** (i + 1) * (i + 1)),
      den: BigInt((i + 1) ** 2 + 1),
    }));
    let sum = new Fraction(0);
    let rows = 0;
    const z = classSumRational({
      weights,
      n: 12,
      sign: -1,
      onRow: (visit, contribution) => {
        rows++;
        // independent recomputation of the row: eps * prod Z_L^m / (prod L^m m!)
        let expected = new Fraction(visit.sign);
        for (const [L, m] of exponentNotation(visit)) {
          const w = new Fraction(weights[L - 1]!.num, weights[L - 1]!.den);
          expected = expected.mul(w.div(L).pow(m)).div(new Fraction(factorial(m)));
        }
        expect(new Fraction(contribution.num, contribution.den).equals(expected)).toBe(true);
        sum = sum.add(new Fraction(contribution.num, contribution.den));
      },
    });
    expect(rows).toBe(77);
    expect(new Fraction(z.num, z.den).equals(sum)).toBe(true);
  });
});
