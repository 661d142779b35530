import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { shift } from '../series/arith.js';
import { Series } from '../series/series.js';
import { parseGasSpec } from '../spec/schema.js';
import { gas, ser } from '../test-helpers.js';
import { largeNAnalysis } from './index.js';
import { table } from './test-tables.js';

const spec = (over: Record<string, unknown> = {}) =>
  parseGasSpec(gas({ weights: { kind: 'formula', expression: 'q^L' }, nMax: 10, ...over }));
const one = (): Series => Series.constant(new Fraction(1));

/** Synthetic rows Z(N) = q^(lead(N)) * (expression in N), N = 1..nMax, known to O(q^order). */
function rows(nMax: number, lead: (N: number) => number, body: (N: number) => string): Series[] {
  const Z = [one()];
  for (let N = 1; N <= nMax; N++) Z.push(shift(ser(body(N), 60), new Fraction(lead(N))));
  return Z;
}

describe('large N: walls with coefficients polynomial in N', () => {
  // Constructed: Y(N) = 1/(1-q) + (N^2 - 1) q^(2N+3); Y(N)/Z(inf) - 1 = (N^2 - 1) q^(2N+3) (1 - q),
  // so the first wall is (N^2 - 1) q^(2N + 3) and the second -(N^2 - 1) q^(2N + 4).
  it('first two walls found with their polynomial coefficients', () => {
    const Z = rows(
      10,
      (N) => 2 * N,
      (N) => `1/(1-q) + ${N * N - 1}*q^${2 * N + 3}`,
    );
    const c = largeNAnalysis(Z, spec())!.classes[0]!;
    expect(c.normalization).toBe('q^(-2*N)');
    // N = 1 has no wall (coefficient 0): rows 2.. show it
    expect(c.corrections[0]).toMatchObject({
      status: 'found',
      exponent: '2*N + 3',
      coefficient: 'N^2 - 1',
    });
    expect(c.corrections[0]!.fittedOn).toEqual([2, 3, 4]);
    expect(c.corrections[1]).toMatchObject({ exponent: '2*N + 4', coefficient: '-N^2 + 1' });
    expect(c.stabilizationFit).toBe('2*N + 3');
  });
});

describe('large N: even and odd rows with the same normalization but different limits', () => {
  // Constructed: even N tend to 1/(1-q), odd N to 1/(1-q)^2, both with a wall q^(N+1).
  it('the classes are split because each determines its limit further', () => {
    const Z = rows(
      12,
      (N) => N * N,
      (N) => `${N % 2 ? '1/(1-q)^2' : '1/(1-q)'} + q^${N + 1}`,
    );
    const r = largeNAnalysis(Z, spec({ nMax: 12 }))!;
    expect(r.classes.map((c) => c.parity)).toEqual(['even', 'odd']);
    expect(r.notes.join(' ')).toMatch(/each class determines its limit further/);
    const [even, odd] = r.classes;
    expect(even!.limit!.terms.slice(0, 3)).toEqual([
      ['0', '1'],
      ['1', '1'],
      ['2', '1'],
    ]);
    expect(odd!.limit!.terms.slice(0, 3)).toEqual([
      ['0', '1'],
      ['1', '2'],
      ['2', '3'],
    ]);
    expect(even!.stabilizationFit).toBe('N + 1');
    // (1-q)^(-2): a_1 = 2 and every other known a_n = 0
    expect(odd!.product!.exponents[0]).toEqual({ n: '1', a: '2' });
    expect(odd!.product!.pattern).toBe('a_n = 0 for n > 1');
  });
});

describe('large N: a normalization given in the spec', () => {
  it('q^(-N^2/2) for the harmonic trap: the same limit as the fitted one', () => {
    const { Z, spec: s } = table({
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
      order: '60',
      nMax: 8,
      largeN: { normalization: 'q^(-N^2/2)' },
    });
    const factors = Z.map((_, N) => ser(`q^(-${N * N}/2)`));
    const c = largeNAnalysis(Z, s, { normalization: factors })!.classes[0]!;
    expect(c.normalization).toBe('q^(-N^2/2)');
    expect(c.normalizationDetail).toEqual({ source: 'given' });
    expect(c.stabilizationFit).toBe('N + 1');
    // OEIS A000041
    expect(c.limit!.terms.map((t) => t[1])).toEqual(['1', '1', '2', '3', '5', '7', '11', '15']);
  });
});

describe('large N: an exact limit reached at N = 5', () => {
  // Constructed, exact rows: Y(N) = 1 + q^(N+1) for N < 5 and Y(N) = 1 from N = 5 on.
  it('exact limit 1, the wall q^(N+1) refuted by the rows that have reached it', () => {
    const Z = [one()];
    for (let N = 1; N <= 8; N++) Z.push(ser(N < 5 ? `q^${N} + q^${2 * N + 1}` : `q^${N}`));
    const c = largeNAnalysis(Z, spec({ nMax: 8 }))!.classes[0]!;
    expect(c.limit).toEqual({ order: null, terms: [['0', '1']] });
    expect(c.stabilization.slice(3, 5)).toEqual([
      { N: 4, agreesBelow: '5' },
      { N: 5, agreesBelow: null },
    ]);
    expect(c.stabilizationFit).toBe('N + 1');
    expect(c.corrections[0]).toMatchObject({ status: 'none' });
    expect(c.corrections[0]!.note).toMatch(/refuted by row 5/);
  });
});
