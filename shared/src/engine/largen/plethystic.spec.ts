import fc from 'fast-check';
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { evaluateExpression } from '../expr/evaluate.js';
import { KSeries } from '../grand/kseries.js';
import { toValueJson } from '../series/format.js';
import { cutAt, Series } from '../series/series.js';
import { ser } from '../test-helpers.js';

const json = (s: Series) => toValueJson(s);

describe('pexp and plog on q-series', () => {
  // [expression, equal expression, order]; sources named per row
  const cases: [string, string, number][] = [
    // PE[q/(1-q)] = prod 1/(1-q^n) = 1/(q;q)_inf (OEIS A000041, EULER transform of 1s)
    ['pexp(q/(1-q))', '1/qpoch(q, q, inf)', 20],
    // PE[q] = 1/(1-q) (geometric series)
    ['pexp(q)', '1/(1-q)', 20],
    // PE[q - q^2] = (1-q^2)/(1-q) = 1 + q; PE[-q] = 1 - q
    ['pexp(q - q^2)', '1 + q + O(q^20)', 20],
    ['pexp(-q)', '1 - q + O(q^20)', 20],
    // distinct parts: PE[q/(1-q^2)] = prod (1+q^n) (OEIS A000009; odd parts)
    ['pexp(q/(1-q^2))', 'qpoch(-q, q, inf)', 20],
    // MacMahon: PE[q/(1-q)^2] = plane partitions (OEIS A000219: 1, 1, 3, 6, 13, 24, 48)
    ['pexp(q/(1-q)^2)', '1 + q + 3*q^2 + 6*q^3 + 13*q^4 + 24*q^5 + 48*q^6 + O(q^7)', 7],
    // inverses
    ['plog(1/qpoch(q, q, inf))', 'q/(1-q)', 20],
    ['plog(qpoch(-q, q, inf))', 'q/(1-q^2)', 20],
    ['plog(1 + q)', 'q - q^2 + O(q^20)', 20],
    // rational steps: PE[q^(1/2)] = 1/(1-q^(1/2))
    ['pexp(q^(1/2))', '1/(1-q^(1/2))', 10],
  ];
  it.each(cases)('%s = %s', (lhs, rhs, order) => {
    expect(json(ser(lhs, order))).toEqual(json(ser(rhs, order)));
  });

  it('honest orders: pexp(q + O(q^5)) is known to O(q^5) only', () => {
    expect(ser('pexp(q + O(q^5))').orderExponent()?.toFraction()).toBe('5');
    expect(ser('plog(1 + q + O(q^4))').orderExponent()?.toFraction()).toBe('4');
  });

  it('errors: an exact polynomial without an order, a constant term', () => {
    expect(() => ser('pexp(q)')).toThrow(/finite order/);
    expect(() => ser('pexp(1 + q)', 5)).toThrow(/exp/);
    expect(() => ser('plog(2 + q)', 5)).toThrow(/leading term is 1/);
  });

  it('property: pexp(plog(f)) = f and plog(pexp(g)) = g on random truncated series', () => {
    const coeff = fc.integer({ min: -5, max: 5 });
    fc.assert(
      fc.property(
        fc.array(coeff, { minLength: 1, maxLength: 10 }),
        fc.integer({ min: 1, max: 3 }),
        (cs, den) => {
          const order = cs.length + 1;
          const g = `${cs.map((c, i) => `${c}/${den}*q^${i + 1}`).join(' + ')} + O(q^${order})`;
          const f = `1 + ${g}`;
          expect(json(ser(`pexp(plog(${f}))`))).toEqual(json(ser(f)));
          expect(json(ser(`plog(pexp(${g}))`))).toEqual(json(ser(g)));
        },
      ),
      { numRuns: 40 },
    );
  });
});

describe('pexp and plog with kappa: f(q^k, kappa^k)', () => {
  const ev = (text: string, nMax: number): KSeries => {
    const v = evaluateExpression(text, {
      variable: 'q',
      cap: new Fraction(12),
      nMax,
      allowKappa: true,
    });
    if (!(v instanceof KSeries)) throw new Error('expected a kappa-series');
    return v;
  };
  // compared at the cap O(q^12): pexp and plog of a kappa-series are known to the cap
  const coeffJson = (v: KSeries, n: number) =>
    Array.from({ length: n + 1 }, (_, j) => json(cutAt(v.at(j), new Fraction(12))));

  it('PE[kappa q/(1-q)] = prod_n 1/(1 - kappa q^n): the boson grand function of the levels q^n', () => {
    // Euler: prod 1/(1 - kappa q^n) = sum_N kappa^N q^N/(q;q)_N (Andrews, Cor. 2.2)
    const nMax = 4;
    const got = ev('pexp(kappa*q/(1-q))', nMax);
    for (let N = 0; N <= nMax; N++) {
      expect(json(got.at(N))).toEqual(json(ser(`q^${N}/qpoch(q, q, ${N})`, 12)));
    }
  });

  it('PE[kappa] = 1/(1 - kappa) and plog inverts pexp with kappa', () => {
    const nMax = 5;
    expect(coeffJson(ev('pexp(kappa)', nMax), nMax)).toEqual(
      coeffJson(ev('1/(1-kappa)', nMax), nMax),
    );
    const f = 'kappa*q/(1-q) + kappa^2*q^3 + q^2';
    expect(coeffJson(ev(`plog(pexp(${f}))`, nMax), nMax)).toEqual(coeffJson(ev(f, nMax), nMax));
  });
});
