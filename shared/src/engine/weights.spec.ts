import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { EngineError } from './errors.js';
import { compareSeries } from './series/compare.js';
import { parseGasSpec } from './spec/schema.js';
import { gas, ser } from './test-helpers.js';
import { cycleWeights } from './weights.js';

const weightsOf = (over: Record<string, unknown>) => {
  const spec = parseGasSpec(gas(over));
  const cap = spec.order == null ? null : new Fraction(spec.order);
  return cycleWeights(spec, { variable: 'q', cap, nMax: spec.nMax });
};
const same = (a: Parameters<typeof compareSeries>[0], text: string, order: string | null) =>
  expect(compareSeries(a, ser(text, order)).agrees).toBe(true);

describe('cycleWeights', () => {
  it('values: Z_1..Z_nMax read one by one, exact or truncated', () => {
    const w = weightsOf({
      nMax: 2,
      weights: { kind: 'values', values: ['1/4', 'q + 2*q^2 + O(q^5)'] },
    });
    expect(w.weights).toHaveLength(2);
    expect(w.weights[0]!.toFraction().equals(new Fraction(1, 4))).toBe(true);
    same(w.weights[1]!, 'q + 2*q^2 + O(q^5)', '5');
    expect(w.spectrum).toBeUndefined();
  });

  it('values: too few for nMax is an error naming weights.values', () => {
    try {
      weightsOf({ nMax: 3, weights: { kind: 'values', values: ['1', '2'] } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).field).toBe('weights.values');
    }
  });

  it('formula: the trap q^(L/2)/(1-q^L) at L = 1..3, cut at the order', () => {
    const w = weightsOf({
      step: '1/2',
      order: '6',
      nMax: 3,
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
    });
    same(w.weights[0]!, 'q^(1/2) + q^(3/2) + q^(5/2) + q^(7/2) + q^(9/2) + q^(11/2) + O(q^6)', '6');
    same(w.weights[2]!, 'q^(3/2) + q^(9/2) + O(q^6)', '6');
  });

  it('bounded spectrum c_p = q^abs(p), p = -1, 0, 1: Z_L = 1 + 2 q^L exactly (power sums)', () => {
    const w = weightsOf({
      order: null,
      nMax: 3,
      weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '0', from: '-1', to: '1' },
    });
    for (let L = 1; L <= 3; L++) same(w.weights[L - 1]!, `1 + 2*q^${L}`, null);
    expect(w.spectrum!.points).toHaveLength(3);
    expect(w.spectrum!.truncated).toBe(false);
  });

  it('unbounded spectrum q^abs(p) on Z + 1/2: Z_L = 2 q^(L/2)/(1 - q^L) (geometric series), lattice cut at the order', () => {
    const w = weightsOf({
      step: '1/2',
      order: '10',
      nMax: 3,
      weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '1/2', from: null, to: null },
    });
    for (let L = 1; L <= 3; L++)
      same(w.weights[L - 1]!, `2*q^(${L}/2)/(1 - q^${L}) + O(q^10)`, '10');
    // |p| = 1/2, 3/2, ..., 19/2 on both sides lie below q^10
    expect(w.spectrum!.points).toHaveLength(20);
    expect(w.spectrum!.truncated).toBe(true);
    expect(w.truncations).toEqual([{ what: 'spectrum lattice points', terms: 20 }]);
  });

  it('an unbounded spectrum without an order is an error naming the open side', () => {
    try {
      weightsOf({
        order: null,
        weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '0', from: '0', to: null },
      });
      expect.unreachable();
    } catch (e) {
      expect((e as EngineError).field).toBe('weights.to');
    }
  });
});
