import fc from 'fast-check';
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { mul, powInt } from '../series/arith.js';
import { cutAt, Series } from '../series/series.js';
import { frac } from '../rational.js';
import { ser } from '../test-helpers.js';
import { moebius, productExponentList, productForm } from './product.js';

const ints = (xs: Fraction[]): number[] => xs.map((x) => x.valueOf());

describe('product exponents prod (1 - q^n)^(-a_n)', () => {
  // (series, expected a_1.., pattern); sources in the rows.
  const cases: [string, string, number[], string | null][] = [
    // OEIS A000041 (partitions): 1/(q;q)_inf, a_n = 1
    ['partitions', '1/qpoch(q, q, inf)', new Array(12).fill(1), 'a_n = 1'],
    // OEIS A000009 (distinct parts = odd parts, Euler): prod (1 + q^n), a_n = 1 for odd n
    [
      'distinct parts',
      'qpoch(-q, q, inf)',
      [1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0],
      'a_n periodic with period 2: 1, 0 (n = 1..2 mod 2)',
    ],
    // (q;q)_inf itself: a_n = -1
    ['Euler function', 'qpoch(q, q, inf)', new Array(12).fill(-1), 'a_n = -1'],
    // OEIS A000219 (plane partitions, MacMahon): EULER transform of n
    [
      'plane partitions',
      '1 + q + 3*q^2 + 6*q^3 + 13*q^4 + 24*q^5 + 48*q^6 + 86*q^7 + 160*q^8 + 282*q^9 + 500*q^10 + 859*q^11 + 1479*q^12 + O(q^13)',
      [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12],
      'a_n = n',
    ],
  ];
  it.each(cases)('%s', (_name, expr, a, pattern) => {
    const f = ser(expr, 13);
    expect(ints(productExponentList(f).a)).toEqual(a);
    expect(productForm(f).pattern).toBe(pattern);
    expect(productForm(f).determinedBelow).toBe('13');
  });

  it('the inverse of the EULER transform: A000009 -> odd indicator, A000041 -> all ones', () => {
    // OEIS EULER transform (from memory): b_n = coefficients of prod (1 - x^k)^(-a_k); the inverse
    // recovers a from b with 1 + sum b_n x^n. A000009 starts 1, 1, 1, 2, 2, 3, 4, 5, 6, 8, 10.
    const b = [1, 1, 1, 2, 2, 3, 4, 5, 6, 8, 10];
    const f = Series.of(frac(1), 0, b.map(BigInt), 1n, b.length);
    expect(ints(productExponentList(f).a)).toEqual([1, 0, 1, 0, 1, 0, 1, 0, 1, 0]);
    // A000041 starts 1, 1, 2, 3, 5, 7, 11, 15, 22, 30, 42
    const p = [1, 1, 2, 3, 5, 7, 11, 15, 22, 30, 42];
    const g = Series.of(frac(1), 0, p.map(BigInt), 1n, p.length);
    expect(ints(productExponentList(g).a)).toEqual(new Array(10).fill(1));
  });

  it('rational exponent steps: 1/(q^(1/2); q^(1/2))_inf has a_k = 1 on the grid 1/2', () => {
    const f = productForm(ser('1/qpoch(q^(1/2), q^(1/2), inf)', 5));
    expect(f.step).toBe('1/2');
    expect(f.exponents.slice(0, 3)).toEqual([
      { n: '1/2', a: '1' },
      { n: '1', a: '1' },
      { n: '3/2', a: '1' },
    ]);
    expect(f.determinedBelow).toBe('5');
  });

  it('rational a_n: (1-q)^(-1/2) has a_1 = 1/2, the rest 0', () => {
    expect(productExponentList(ser('(1-q)^(-1/2)', 6)).a.map((x) => x.toFraction())).toEqual([
      '1/2',
      '0',
      '0',
      '0',
      '0',
    ]);
  });

  it('no pattern: the note says so', () => {
    const f = productForm(ser('1 + q + 5*q^2 - 7*q^3 + 2*q^5 + O(q^8)'));
    expect(f.pattern).toBeNull();
    expect(f.patternNote).toMatch(
      /^no polynomial of degree <= 3 and no period <= 3 holds on every known n/,
    );
  });

  it('Moebius function mu(1..12)', () => {
    // OEIS A008683
    expect([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12].map(moebius)).toEqual([
      1, -1, -1, 0, -1, 1, -1, 0, 0, 1, -1, 0,
    ]);
  });

  it('property: random finite products give back their exponents', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -3, max: 3 }), { minLength: 1, maxLength: 12 }),
        (a) => {
          const M = 14;
          let f = Series.constant(frac(1));
          a.forEach((ak, i) => {
            const k = i + 1;
            const factor = Series.of(
              frac(1),
              0,
              [1n, ...new Array<bigint>(k - 1).fill(0n), -1n],
              1n,
              null,
            );
            f = mul(f, powInt(factor, -ak, frac(M)), frac(M));
          });
          const got = ints(productExponentList(cutAt(f, frac(M))).a);
          const want = [...a, ...new Array<number>(M - 1 - a.length).fill(0)];
          expect(got).toEqual(want);
        },
      ),
      { numRuns: 60 },
    );
  });
});
