import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { EngineError } from '../errors.js';
import { MAX_EXPRESSION_LENGTH } from '../limits.js';
import { compareSeries } from '../series/compare.js';
import { toText } from '../series/format.js';
import { coeffs, ser } from '../test-helpers.js';
import { evaluateExpression, Truncation } from './evaluate.js';
import { EXACT_FUNCTIONS } from './functions.js';
import { DISABLED_FUNCTIONS, limitedMath, parseExpression } from './sandbox.js';

describe('the limited mathjs instance', () => {
  it.each(DISABLED_FUNCTIONS)('%s is disabled inside expressions and on the instance', (name) => {
    expect(() => ser(`${name}("1")`, 5)).toThrow(/disabled/);
    const fn = (limitedMath as unknown as Record<string, (...a: unknown[]) => unknown>)[name]!;
    expect(() => fn('1 + 1')).toThrow(/disabled/);
  });

  it('refuses an over-long expression naming the limit and the field', () => {
    const long = '1+'.repeat(MAX_EXPRESSION_LENGTH) + '1';
    try {
      parseExpression(long, 'weights.expression');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).message).toContain(String(MAX_EXPRESSION_LENGTH));
      expect((e as EngineError).field).toBe('weights.expression');
    }
  });

  it.each([
    ['pi', /unknown symbol pi/],
    ['x + 1', /unknown symbol x/],
    ['foo(q)', /unknown function foo/],
    ['[1, 2]', /not supported/],
    ['q == 1', /not supported/],
    ['"text"', /only numbers/],
    ['q^q', /exact number/],
    ['1/(1-q)', /finite order/],
    ['(1+q)^100000', /too many terms/],
    ['(2^100000)^100000', /number too large/],
    ['binom(5, 10^9)', /at most/],
  ])('%s is a clear error', (text, message) => {
    const exact = text === '1/(1-q)' || text === '(1+q)^100000';
    expect(() => ser(text, exact ? null : 5)).toThrow(message);
  });
});

describe('expression language', () => {
  it('reads decimals exactly: 0.1 = 1/10, 2.5e-1 = 1/4', () => {
    expect(ser('0.1').toFraction().equals(new Fraction(1, 10))).toBe(true);
    expect(ser('2.5e-1').toFraction().equals(new Fraction(1, 4))).toBe(true);
    expect(ser('12345678901234567890123 + 1').toFraction().toFraction()).toBe(
      '12345678901234567890124',
    );
  });

  it('abs, binom, factorial: C(7,3) = 35, 10! = 3628800, C(1/2, 2) = -1/8 (A&S 24.1.1, 6.1.6)', () => {
    expect(toText(ser('binom(7, 3)'))).toBe('35');
    expect(toText(ser('factorial(10)'))).toBe('3628800');
    expect(toText(ser('5!'))).toBe('120');
    expect(toText(ser('binom(1/2, 2)'))).toBe('-1/8');
    expect(toText(ser('abs(-3/2)'))).toBe('3/2');
  });

  it('finite sums and products: sum k^2 for k=1..10 = 385; prod k = 5! (common practice)', () => {
    expect(toText(ser('sum(k^2, k, 1, 10)'))).toBe('385');
    expect(toText(ser('prod(k, k, 1, 5)'))).toBe('120');
  });

  it('an infinite sum is cut off at the order and reports its terms', () => {
    const truncations: Truncation[] = [];
    const v = evaluateExpression('sum(q^(k^2), k, 0, inf)', {
      variable: 'q',
      cap: new Fraction(30),
      truncations,
    });
    expect(toText(v as never)).toBe('1 + q + q^4 + q^9 + q^16 + q^25 + O(q^30)');
    expect(truncations).toEqual([{ what: 'sum over k', terms: 6 }]);
  });

  it('a sum whose terms do not shrink is an error, not a hang', () => {
    expect(() => ser('sum(q^0, k, 0, inf)', 10)).toThrow(
      'sum over k does not converge: term valuations stop growing',
    );
    expect(() => ser('sum((-1)^k * q, k, 1, inf)', 10)).toThrow(/does not converge/);
  });

  it('Euler pentagonal theorem: (q;q)_inf = sum (-1)^k q^(k(3k-1)/2) (OEIS A010815)', () => {
    // OEIS A010815: 1, -1, -1, 0, 0, 1, 0, 1, 0, 0, 0, 0, -1, 0, 0, -1, 0, 0, 0, 0, 0, 0, 1
    expect(coeffs(ser('qpoch(q, q, inf)', 23), 23)).toEqual([
      1, -1, -1, 0, 0, 1, 0, 1, 0, 0, 0, 0, -1, 0, 0, -1, 0, 0, 0, 0, 0, 0, 1,
    ]);
  });

  it('finite q-Pochhammer: (q;q)_3 = (1-q)(1-q^2)(1-q^3), (a;q)_0 = 1 (DLMF 17.2.1)', () => {
    expect(toText(ser('qpoch(q, q, 3)'))).toBe('1 - q - q^2 + q^4 + q^5 - q^6');
    expect(toText(ser('qpoch(q^2, q, 0)'))).toBe('1');
    // (a;q)_(-1) = 1/(1 - a/q) (DLMF 17.2.3); with a = q^2: 1/(1-q)
    expect(coeffs(ser('qpoch(q^2, q, -1)', 5), 5)).toEqual([1, 1, 1, 1, 1]);
  });

  it('theta_3(0,q)^2 = sum r_2(n) q^n (OEIS A004018; DLMF 20.2.3)', () => {
    const r2 = [1, 4, 4, 0, 4, 8, 0, 0, 4, 4, 8, 0, 0, 8, 0, 0, 4, 8, 4, 0, 8];
    expect(coeffs(ser('theta3(0, q)^2', 21), 21)).toEqual(r2);
  });

  it('theta functions at z = 0 match the Jacobi triple product forms (DLMF 20.5.1-20.5.3)', () => {
    const order = 40;
    const pairs: [string, string][] = [
      // theta_2(0,q) = 2 q^(1/4) prod (1 - q^(2n)) (1 + q^(2n))^2
      ['theta2(0, q)', '2*q^(1/4) * prod((1 - q^(2*n)) * (1 + q^(2*n))^2, n, 1, inf)'],
      // theta_3(0,q) = prod (1 - q^(2n)) (1 + q^(2n-1))^2
      ['theta3(0, q)', 'prod((1 - q^(2*n)) * (1 + q^(2*n-1))^2, n, 1, inf)'],
      // theta_4(0,q) = prod (1 - q^(2n)) (1 - q^(2n-1))^2
      ['theta4(0, q)', 'qpoch(q^2, q^2, inf) * qpoch(q, q^2, inf)^2'],
    ];
    for (const [a, b] of pairs) {
      const v = compareSeries(ser(a, order), ser(b, order));
      expect(v.agrees, `${a}: ${JSON.stringify(v.firstMismatch)}`).toBe(true);
      expect(v.agreesBelow).toBe(String(order));
    }
    expect(toText(ser('theta1(0, q)', order))).toBe('0');
    expect(() => ser('theta3(1/2, q)', order)).toThrow(/argument z must be 0/);
  });

  it('kappa series: qpoch(-kappa q^(1/2), q, inf) has kappa^2 coefficient q^2/((1-q)(1-q^2)) (Andrews 1976 Cor. 2.2)', () => {
    const v = evaluateExpression('qpoch(-kappa*q^(1/2), q, inf)', {
      variable: 'q',
      cap: new Fraction(12),
      nMax: 3,
      allowKappa: true,
    });
    const c2 = (v as unknown as { at(j: number): never }).at(2);
    expect(compareSeries(ser('q^2/((1-q)*(1-q^2))', 12), c2).agrees).toBe(true);
  });
});

describe('EXACT_FUNCTIONS, the names the exact language knows', () => {
  // Each listed name reaches its own case of callFunction: called with no arguments it
  // complains about its arguments (or their value), never that the function is unknown.
  it.each(EXACT_FUNCTIONS)('%s is dispatched, not unknown', (name) => {
    expect(() => ser(`${name}()`, 5)).toThrow(EngineError);
    expect(() => ser(`${name}()`, 5)).not.toThrow(/unknown function/);
  });

  it('a name outside the list is an unknown function', () => {
    expect(() => ser('thetta3(0, q)', 5)).toThrow(/unknown function thetta3/);
  });
});
