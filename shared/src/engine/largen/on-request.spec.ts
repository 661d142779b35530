import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { toValueJson } from '../series/format.js';
import { ser } from '../test-helpers.js';
import { grandProductForm, seriesProductForm } from './on-request.js';
import { table, trapRows } from './test-tables.js';

const exps = (p: { product: { exponents: { n: string; a: string }[] } }): string[] =>
  p.product.exponents.map((e) => `${e.n}:${e.a}`);

describe('product form of one series on request', () => {
  it('harmonic-trap row Z(3) = q^(9/2)/(q;q)_3: a_n = 1 for n <= 3, then 0', () => {
    // Andrews, Theory of Partitions, Cor. 2.2: Z(N) = q^(N^2/2)/(q;q)_N for the fermion trap.
    const Z = trapRows(3, 20);
    const p = seriesProductForm(Z[3]!, 'Z(3)');
    expect(p.of).toBe('Z(3)');
    expect(p.leadingExponent).toBe('9/2');
    expect(p.leadingCoefficient).toBe('1');
    expect(exps(p).slice(0, 5)).toEqual(['1:1', '2:1', '3:1', '4:0', '5:0']);
    expect(p.product.pattern).toBe('a_n = 0 for n > 3');
    expect(p.product.determinedBelow).toBe('20');
  });

  it('a cycle weight q^(L/2)/(1-q^L) at L = 3: one factor (1 - q^3)^(-1) on the grid 3', () => {
    // order 81/2 = 3/2 + 13*3: every exponent and the order of q^(-3/2) Z_3 lie on multiples of 3
    // 1/(1 - x) is its own product form (common practice); the series lives on exponents 3k.
    const p = seriesProductForm(ser('q^(3/2)/(1-q^3)', '81/2'), 'Z_3');
    expect(p.leadingExponent).toBe('3/2');
    expect(p.product.step).toBe('3');
    expect(exps(p).slice(0, 3)).toEqual(['3:1', '6:0', '9:0']);
    expect(p.product.pattern).toBe('a_n = 0 for n > 3');
  });

  it('an order off the grid of the terms is cut down to it, never listing a finer grid', () => {
    // q^(9/2)/(1 - q) known to O(q^60): the normalized series 1/(1 - q) to O(q^(111/2)); its terms
    // are integer powers, so the exponents stay on n = 1, 2, ... and are listed for n < 55.
    const p = seriesProductForm(ser('q^(9/2)/(1-q)', 60), 'Z(3)');
    expect(p.product.step).toBe('1');
    expect(p.product.determinedBelow).toBe('55');
    expect(exps(p).slice(0, 2)).toEqual(['1:1', '2:0']);
    expect(p.product.pattern).toBe('a_n = 0 for n > 1');
  });

  it('divides out a rational leading coefficient', () => {
    // (3/4) q^-2 (1 + q)= (3/4) q^-2 (1 - q^2)/(1 - q): a_1 = 1, a_2 = -1, then 0 (common practice)
    const p = seriesProductForm(ser('3/4*q^(-2)*(1 + q) + O(q^12)', 12), 'Z(1)');
    expect(p.leadingExponent).toBe('-2');
    expect(p.leadingCoefficient).toBe('3/4');
    expect(exps(p).slice(0, 4)).toEqual(['1:1', '2:-1', '3:0', '4:0']);
    expect(p.product.determinedBelow).toBe('14');
  });

  it('refuses a zero or undetermined series, naming it', () => {
    expect(() => seriesProductForm(ser('O(q^5)', 5), 'Z(7)')).toThrow(
      /Z\(7\) is not determined at this order .*below 5/,
    );
    expect(() => seriesProductForm(ser('0'), 'Z_2')).toThrow(/Z_2 is exactly 0/);
  });
});

describe('product form of the grand function in kappa and q', () => {
  // Fermions: Xi = prod_{p>=0} (1 + kappa q^(p+1/2)) and 1 + x = (1 - x^2)/(1 - x), so
  // c_1 = q^(1/2)/(1 - q), c_2 = -q/(1 - q^2), c_N = 0 for N >= 3. Bosons: Xi = prod 1/(1 - kappa
  // q^(p+1/2)), c_1 = q^(1/2)/(1 - q) only. (Spectrum q^(p+1/2) of the trap: Andrews Cor. 2.2;
  // the identities for PE are common practice.)
  const trap = (statistics: string) =>
    table({
      statistics,
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
      order: '30',
      nMax: 6,
    });

  it('fermions: two factors in kappa, the rest vanish to the order', () => {
    const { Z } = trap('fermion');
    const g = grandProductForm(Z, new Fraction(30));
    expect(g.factors).toHaveLength(6);
    expect(g.factors[0]!.value).toEqual(toValueJson(ser('q^(1/2)/(1-q)', 30)));
    expect(g.factors[1]!.value).toEqual(toValueJson(ser('-q/(1-q^2)', 30)));
    for (const f of g.factors.slice(2)) expect(f.value.terms).toEqual([]);
    expect(g.pattern).toBe('c_N = 0 for N > 2');
    expect(g.patternNote).toMatch(/N = 3\.\.6/);
  });

  it('bosons: one factor', () => {
    const { Z } = trap('boson');
    const g = grandProductForm(Z, new Fraction(30));
    expect(g.factors[0]!.value).toEqual(toValueJson(ser('q^(1/2)/(1-q)', 30)));
    expect(g.pattern).toBe('c_N = 0 for N > 1');
  });

  it('a gas whose factors do not stop says so', () => {
    // Z_L = 2 for every L: Xi = exp(sum (-1)^(L-1) 2 kappa^L/L) = (1 + kappa)^2, whose PLog is
    // 2 kappa - 2 kappa^2 (common practice): stops. Z_L = L instead: Xi = exp(kappa - kappa^2/2 +
    // ...) = exp(kappa/(1+kappa)), not a finite product in kappa.
    const stops = table({ weights: { kind: 'formula', expression: '2' }, order: null, nMax: 5 });
    const g1 = grandProductForm(stops.Z, null);
    expect(g1.factors.map((f) => f.value.terms)).toEqual([[['0', '2']], [['0', '-2']], [], [], []]);
    const runs = table({ weights: { kind: 'formula', expression: 'L' }, order: null, nMax: 5 });
    const g2 = grandProductForm(runs.Z, null);
    expect(g2.pattern).toBeNull();
    expect(g2.patternNote).toMatch(/non-zero at N = 5/);
  });
});
