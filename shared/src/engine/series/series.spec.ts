import fc from 'fast-check';
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { EngineError } from '../errors.js';
import { frac } from '../rational.js';
import { coeffs, ser } from '../test-helpers.js';
import { add, inverse, mul, powInt } from './arith.js';
import { compareSeries } from './compare.js';
import { toText, toValueJson } from './format.js';
import { Series } from './series.js';
import { substitute } from './substitute.js';
import { exp, log, powRational } from './transcendental.js';

describe('series arithmetic and honest precision', () => {
  // Each expected text is worked by hand from the rules in PRODUCT.md (common practice).
  it.each([
    ['(q + O(q^3)) * (q^2 + O(q^5))', 'q^3 + O(q^5)'], // min(3+2, 5+1) = 5
    ['(1 + q + O(q^2)) * (1 + O(q^4))', '1 + q + O(q^2)'],
    ['1/(q + q^2 + O(q^4))', 'q^(-1) - 1 + q + O(q^2)'], // known to B - 2 val = 4 - 2
    ['(q + O(q^3)) + (1 + O(q^2))', '1 + q + O(q^2)'],
    ['q^(1/3) * (1 + q^(1/2))', 'q^(1/3) + q^(5/6)'], // grid refined to 1/6
    ['(q^2 + O(q^5))^3', 'q^6 + O(q^9)'], // A + (n-1) v = 5 + 4
    ['(q + O(q^4))^(-2)', 'q^(-2) + O(q)'], // B - (n+1) v = 4 - 3
    ['0.1 + 1/3', '13/30'], // decimal read exactly: 1/10 + 1/3
    ['(1+q)^5', '1 + 5*q + 10*q^2 + 10*q^3 + 5*q^4 + q^5'], // binomial row 5
  ])('%s = %s', (text, expected) => {
    expect(toText(ser(text, 10))).toBe(expected);
  });

  it('reports the result format with exact rational strings and no zero terms', () => {
    expect(toValueJson(ser('1/2*q^(1/2) - 3/4*q^(5/2) + 0*q', 10))).toEqual({
      order: null,
      terms: [
        ['1/2', '1/2'],
        ['5/2', '-3/4'],
      ],
    });
  });

  it('1/(1-q) to order 10 and (1 - q) (1/(1-q)) = 1 + O(q^10)', () => {
    const g = ser('1/(1-q)', 10);
    expect(coeffs(g, 10)).toEqual(Array(10).fill(1)); // geometric series, common practice
    expect(toText(mul(ser('1-q'), g))).toBe('1 + O(q^10)');
  });

  it('inverse with a non-unit leading coefficient: 1/(2 - q) = sum q^k / 2^(k+1)', () => {
    const g = inverse(ser('2 - q'), frac(6));
    expect(coeffs(g, 6)).toEqual([1 / 2, 1 / 4, 1 / 8, 1 / 16, 1 / 32, 1 / 64]); // geometric series
  });

  it('rational powers: (1+q)^(1/2) by the binomial series; (4+q)^(1/2) leads with 2', () => {
    // binomial series coefficients C(1/2, k): 1, 1/2, -1/8, 1/16, -5/128 (A&S 3.6.8, from memory)
    expect(coeffs(ser('(1+q)^(1/2)', 5), 5)).toEqual([1, 1 / 2, -1 / 8, 1 / 16, -5 / 128]);
    const r = ser('(4+q)^(1/2)', 6);
    expect(toText(mul(r, r, frac(6)))).toBe('4 + q + O(q^6)');
    expect(() => ser('(2+q)^(1/2)', 5)).toThrow(/not a perfect power/);
    expect(toText(powRational(ser('q^2'), frac(3, 2), frac(10)))).toBe('q^3');
  });

  it('exp and log: exp(q) = sum q^k/k!, log(1+q) = sum (-1)^(k+1) q^k / k (A&S 4.2.1, 4.1.24)', () => {
    expect(coeffs(ser('exp(q)', 6), 6)).toEqual([1, 1, 1 / 2, 1 / 6, 1 / 24, 1 / 120]);
    expect(coeffs(ser('log(1+q)', 5), 5)).toEqual([0, 1, -1 / 2, 1 / 3, -1 / 4]);
    expect(() => ser('exp(1)', 5)).toThrow(EngineError);
    expect(() => ser('log(2+q)', 5)).toThrow(/leading term is 1/);
    expect(toText(ser('exp(0)'))).toBe('1');
  });

  it('substitution q -> q^k scales exponents and order', () => {
    expect(toText(substitute(ser('1 + q + O(q^3)'), frac(1, 2)))).toBe('1 + q^(1/2) + O(q^(3/2))');
  });

  it('comparison gives the first mismatch within the common known range', () => {
    const v = compareSeries(ser('1 + 2*q + 8*q^3 + O(q^5)'), ser('1 + 2*q + 4*q^3 + O(q^4)'));
    expect(v).toEqual({
      agrees: false,
      agreesBelow: '3',
      firstMismatch: { exponent: '3', computed: '8', supplied: '4' },
    });
    expect(compareSeries(ser('1 + q + O(q^3)'), ser('1 + q + 5*q^3')).agreesBelow).toBe('3');
    expect(compareSeries(ser('1 + q'), ser('1 + q'))).toEqual({
      agrees: true,
      agreesBelow: null,
      firstMismatch: null,
    });
  });

  it('values are immutable: operations return new series', () => {
    const a = ser('1 + q');
    const before = JSON.stringify(toValueJson(a));
    add(a, a);
    mul(a, a);
    powInt(a, 3);
    expect(JSON.stringify(toValueJson(a))).toBe(before);
  });
});

/** A random series with positive valuation: sum c_i q^(i+1), i < n. */
const positiveSeries = fc
  .array(fc.tuple(fc.integer({ min: -20, max: 20 }), fc.integer({ min: 1, max: 9 })), {
    minLength: 1,
    maxLength: 6,
  })
  .map((cs) =>
    Series.of(
      frac(1),
      1,
      cs.map(([n]) => BigInt(n)),
      BigInt(cs[0]![1]),
      null,
    ),
  );

describe('properties', () => {
  it('exp/log round trip: log(exp(f)) = f and exp(log(1+f)) = 1+f below the order', () => {
    fc.assert(
      fc.property(positiveSeries, fc.integer({ min: 3, max: 12 }), (f, order) => {
        const cap = new Fraction(order);
        const back = log(exp(f, cap), cap);
        expect(compareSeries(f, back).agrees).toBe(true);
        const one = Series.constant(frac(1));
        const g = add(one, f);
        expect(compareSeries(g, exp(log(g, cap), cap)).agrees).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it('inverse: b * (1/b) = 1 below the order', () => {
    fc.assert(
      fc.property(positiveSeries, fc.integer({ min: 2, max: 12 }), (f, order) => {
        const b = add(Series.constant(frac(3)), f);
        const prod = mul(b, inverse(b, new Fraction(order)));
        expect(compareSeries(Series.constant(frac(1)), prod).agrees).toBe(true);
        // an exact constant b has an exact inverse; otherwise 1/b is known to the order exactly
        expect(prod.orderExponent()?.valueOf()).toBe(f.isZero() ? undefined : order);
      }),
      { numRuns: 60 },
    );
  });
});
