import { compute } from '@traceloom/shared/engine';
import { describe, expect, it } from 'vitest';
import { knownSentence } from '@traceloom/shared/format';
import { agreeWithinError, parseDecimal, shownDigits } from './numeric-values.js';

describe('parseDecimal (exact scaled integers)', () => {
  it.each([
    ['1.25e-3', 125n, -5],
    ['-0.5', -5n, -1],
    ['42', 42n, 0],
    ['3.5136418446315325911e-1', 35136418446315325911n, -20],
    ['.5', 5n, -1],
  ])('%s = %s * 10^%s', (text, mantissa, exponent) => {
    expect(parseDecimal(text)).toEqual({ mantissa, exponent });
  });
  it.each(['', '1/2', 'pi', '1e', '--1'])('%j is no decimal', (text) => {
    expect(parseDecimal(text)).toBeNull();
  });
});

describe('agreeWithinError (|a - b| <= error(a) + error(b), exact on the texts)', () => {
  it.each([
    // Z(1) of the harmonic trap at q = 1/10: q^(1/2)/(1-q) = 0.351364184463153259110988... (mpmath 1.3, independent)
    [
      { real: '3.5136418446315325911e-1', error: '1e-20' },
      { real: '0.35136418446315325911099', error: '0' },
      true,
    ],
    // one digit more determined on one side: still the same number
    [
      { real: '3.513641844631532591e-1', error: '5e-20' },
      { real: '3.5136418446315325911e-1', error: '1e-21' },
      true,
    ],
    // a wrong 15th digit, far beyond the tolerance 2e-20
    [
      { real: '3.5136418446315425911e-1', error: '1e-20' },
      { real: '3.5136418446315325911e-1', error: '1e-20' },
      false,
    ],
    // at the tolerance: 0.3 vs 0.5 with errors 0.1 + 0.1 and half units 0.05 + 0.05
    [{ real: '0.3', error: '0.1' }, { real: '0.6', error: '0.1' }, true],
    [{ real: '0.3', error: '0.1' }, { real: '0.61', error: '0.1' }, false],
    // the printed digits are rounded: 0.35 shown for 0.351364..., error 0, is within half a unit
    [{ real: '0.35', error: '0' }, { real: '0.3513641844631532591', error: '0' }, true],
    [{ real: '0.35', error: '0' }, { real: '0.3561', error: '0' }, false],
    [{ real: '0', error: '3e-30' }, { real: '-1e-31', error: '0' }, true],
  ])('%j vs %j: %s', (a, b, agrees) => {
    expect(agreeWithinError(a, b)).toBe(agrees);
    expect(agreeWithinError(b, a)).toBe(agrees);
  });
});

describe('shownDigits', () => {
  it.each([
    ['3.5136418446315325911e-1', 20],
    ['1.0000000000000000000', 20],
    ['-0.00125', 3],
    ['0', 0],
  ])('%s shows %i digits', (real, digits) => {
    expect(shownDigits({ real, error: '1e-30' })).toBe(digits);
  });
});

describe('knownSentence', () => {
  const trap = {
    format: 'traceloom.gas/1',
    statistics: 'fermion',
    variable: 'q',
    nMax: 2,
    weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
  };
  it.each([
    [
      { ...trap, step: '1/2', order: '6' },
      /^series to O\(q\^6\): every coefficient below q\^6 determined$/,
    ],
    [{ ...trap, step: '1/2', order: '13/2' }, /^series to O\(q\^\(13\/2\)\): every/],
    // the trap's Z(N) starts at q^(N^2/2) (DLMF 17.5, Euler): Z(4) at q^8 is beyond O(q^6)
    [
      { ...trap, nMax: 4, step: '1/2', order: '6' },
      /^series to O\(q\^6\): every coefficient below q\^6 determined; Z\(N\) for N = 4 not determined at this order$/,
    ],
    [
      { ...trap, weights: { kind: 'values', values: ['1', '1'] }, order: null },
      /^exact \(every coefficient determined\)$/,
    ],
    [
      { ...trap, precision: 12, at: { q: '1/10' } },
      /^numeric at q = 1\/10, 12 digits requested, errors estimated by evaluating at two working precisions/,
    ],
  ])('%j', (spec, sentence) => {
    expect(knownSentence(compute(spec))).toMatch(sentence);
  });
});
