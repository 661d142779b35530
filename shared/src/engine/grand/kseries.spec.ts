import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { EngineError } from '../errors.js';
import { compareSeries } from '../series/compare.js';
import type { Series } from '../series/series.js';
import { ser } from '../test-helpers.js';
import {
  kAdd,
  KSeries,
  kExp,
  kInverse,
  kLog,
  kMul,
  kNeg,
  kPowInt,
  kPowRational,
  kValuation,
  noKappa,
} from './kseries.js';

const cap = new Fraction(12);
const k = (texts: string[], nMax = texts.length - 1) =>
  new KSeries(
    texts.map((t) => ser(t, '12')),
    nMax,
  );
const expectSame = (a: KSeries, texts: string[]) => {
  for (let j = 0; j <= a.nMax; j++) {
    const want: Series = ser(texts[j] ?? '0', '12');
    expect(compareSeries(a.at(j), want).agrees, `kappa^${j}`).toBe(true);
  }
};

describe('KSeries', () => {
  it('kappa, lift and at: coefficients beyond the stored ones are exact zeros', () => {
    const kappa = KSeries.kappa(3);
    expect(kappa.at(1).toFraction().equals(1)).toBe(true);
    expect(kappa.at(3).isZero()).toBe(true);
    expect(KSeries.lift(ser('q'), 2).at(1).isZero()).toBe(true);
  });

  it('(1 + q kappa)^3 = 1 + 3q kappa + 3q^2 kappa^2, cut after kappa^2 (binomial theorem)', () => {
    expectSame(kPowInt(k(['1', 'q'], 2), 3, cap), ['1', '3*q', '3*q^2']);
  });

  it('a * (1/a) = 1 and a + (-a) = 0 for a = (1 - q) + q^2 kappa + kappa^2', () => {
    const a = k(['1 - q', 'q^2', '1']);
    expectSame(kMul(a, kInverse(a, cap), cap), ['1', '0', '0']);
    expectSame(kAdd(a, kNeg(a)), ['0', '0', '0']);
  });

  it('exp(kappa q) = 1 + q kappa + q^2 kappa^2/2 + q^3 kappa^3/6 (exponential series)', () => {
    expectSame(kExp(k(['0', 'q', '0', '0']), cap), ['1', 'q', 'q^2/2', 'q^3/6']);
  });

  it('log(1 + kappa) = kappa - kappa^2/2 + kappa^3/3, and exp(log a) = a', () => {
    expectSame(kLog(k(['1', '1', '0', '0']), cap), ['0', '1', '-1/2', '1/3']);
    const a = k(['1 + q', 'q', '2*q^3', '-1']);
    expectSame(kExp(kLog(a, cap), cap), ['1 + q', 'q', '2*q^3', '-1']);
  });

  it('(1 + kappa)^(1/2) squared is 1 + kappa; the half power is 1 + kappa/2 - kappa^2/8 (binomial series)', () => {
    const r = kPowRational(k(['1', '1', '0']), new Fraction(1, 2), cap);
    expectSame(r, ['1', '1/2', '-1/8']);
    expectSame(kMul(r, r, cap), ['1', '1', '0']);
  });

  it('kValuation is the least q-valuation over the coefficients (null when all are zero)', () => {
    expect(kValuation(k(['q^3', 'q^2 + q^5', '0']))!.equals(2)).toBe(true);
    expect(kValuation(k(['0', '0']))).toBeNull();
  });

  it('noKappa names the operation', () => {
    expect(() => noKappa('abs')).toThrow(EngineError);
    expect(() => noKappa('abs')).toThrow(/abs is not defined for a series in kappa/);
  });
});
