import { describe, expect, it } from 'vitest';
import {
  cycleTypeText,
  knownTo,
  leadingTerm,
  rationalNumber,
  valuation,
  valueTex,
  valueText,
} from './values.js';

// Harmonic trap, fermions: Z(2) = q^2/((1-q)(1-q^2)) = q^2 + q^3 + 2q^4 + 2q^5 + 3q^6 + ...
// (Andrews, The Theory of Partitions, Cor. 2.2: Z(N) = q^(N^2/2)/(q;q)_N; the coefficients of
// 1/((1-q)(1-q^2)) are floor(n/2) + 1, OEIS A008619).
const Z2 = {
  order: '8',
  terms: [
    ['2', '1'],
    ['3', '1'],
    ['4', '2'],
    ['5', '2'],
    ['6', '3'],
    ['7', '3'],
  ] as [string, string][],
};

describe('value formatting', () => {
  it('writes a series in the expression language with its order', () => {
    expect(valueText(Z2)).toBe('q^2 + q^3 + 2*q^4 + 2*q^5 + 3*q^6 + 3*q^7 + O(q^8)');
  });

  it('handles rational exponents, negative and fractional coefficients, and exact values', () => {
    const v = {
      order: null,
      terms: [
        ['1/2', '-3/4'],
        ['0', '5'],
        ['-1', '1'],
      ] as [string, string][],
    };
    expect(valueText(v, 'x')).toBe('-3/4*x^(1/2) + 5 + x^(-1)');
    expect(valueTex(v, 'x')).toBe('-\\tfrac{3}{4}x^{1/2} + 5 + x^{-1}');
    expect(valueText({ order: null, terms: [] })).toBe('0');
  });

  it('elides the middle of a long series in LaTeX but keeps the order', () => {
    expect(valueTex(Z2, 'q', 2)).toBe('q^{2} + q^{3} + \\cdots + O(q^{8})');
  });

  it('reads off leading term, valuation and how far the value is known', () => {
    const z3 = {
      order: '40',
      terms: [
        ['9/2', '1'],
        ['11/2', '1'],
      ] as [string, string][],
    };
    expect(leadingTerm(z3)).toBe('q^(9/2)');
    expect(valuation(z3)).toBe('9/2');
    expect(knownTo(z3)).toBe('O(q^40)');
    expect(knownTo({ order: null, terms: [] })).toBe('exact');
    expect(valuation({ order: '3', terms: [] })).toBeNull();
  });

  it('converts rational strings to numbers for plots and sorting', () => {
    expect(rationalNumber('9/2')).toBe(4.5);
    expect(rationalNumber('-3/4')).toBe(-0.75);
    expect(rationalNumber('12')).toBe(12);
  });

  it('writes cycle types in exponent notation', () => {
    expect(
      cycleTypeText([
        [1, 2],
        [2, 1],
      ]),
    ).toBe('1^2 2^1');
    expect(cycleTypeText([[4, 1]])).toBe('4^1');
  });
});
