import { largeNAnalysis, newtonRecursion, cycleWeights, parseGasSpec } from '../engine/index.js';
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { largeNTableLines } from './largen-text.js';
import { valueText } from './values.js';

describe('large-N summary for --format table', () => {
  it('harmonic trap: normalization, limit, law N + 1 and the first wall -q^(N+1)', () => {
    // Andrews, Theory of Partitions, Cor. 2.2: q^(-N^2/2) Z(N) = 1/(q;q)_N
    const spec = parseGasSpec({
      format: 'traceloom.gas/1',
      statistics: 'fermion',
      order: '60',
      nMax: 8,
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
    });
    const cap = new Fraction(60);
    const w = cycleWeights(spec, { variable: 'q', cap, nMax: 8, tick: () => {} });
    const Z = newtonRecursion(w.weights, 8, true, cap, () => {});
    const text = largeNTableLines(largeNAnalysis(Z, spec)!, (v) => valueText(v, 'q')).join('\n');
    expect(text).toContain('normalization  q^(-N^2/2)');
    expect(text).toContain('Z(inf)         1 + q + 2*q^2 + 3*q^3 + 5*q^4');
    expect(text).toContain('a_n = 1');
    expect(text).toContain('stabilization  N + 1');
    expect(text).toMatch(/correction 1 {3}-1 \* q\^\(N \+ 1\) {2}fitted on 1, 2, verified on 3/);
  });

  it.each([
    ['no block', undefined],
    ['a numeric block (fit only)', {}],
  ])('no lines for %s', (_what, block) => {
    expect(largeNTableLines(block, () => '')).toEqual([]);
  });
});
