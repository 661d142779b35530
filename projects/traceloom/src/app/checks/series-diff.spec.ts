import { seriesDiff } from './series-diff';

describe('seriesDiff', () => {
  it('marks every differing coefficient, not only the first, and stops at each order', () => {
    // 1/(q;q)_3 = 1 + q + 2q^2 + 3q^3 + 4q^4 + ... (partitions into at most 3 parts, OEIS A001399)
    const computed = {
      order: '5',
      terms: [
        ['0', '1'],
        ['1', '1'],
        ['2', '2'],
        ['3', '3'],
        ['4', '4'],
      ] as [string, string][],
    };
    // A table with two wrong coefficients (q^1 missing, q^3 as 4) known to O(q^4).
    const supplied = {
      order: '4',
      terms: [
        ['0', '1'],
        ['2', '2'],
        ['3', '4'],
      ] as [string, string][],
    };
    expect(seriesDiff(computed, supplied)).toEqual([
      { exponent: '0', computed: '1', supplied: '1', state: 'agrees' },
      { exponent: '1', computed: '1', supplied: '0', state: 'differs' },
      { exponent: '2', computed: '2', supplied: '2', state: 'agrees' },
      { exponent: '3', computed: '3', supplied: '4', state: 'differs' },
      { exponent: '4', computed: '4', supplied: null, state: 'not compared' },
    ]);
  });

  it('orders rational exponents by value and compares exact values exactly', () => {
    const a = {
      order: null,
      terms: [
        ['1/2', '-3/4'],
        ['5/2', '2'],
      ] as [string, string][],
    };
    const b = {
      order: null,
      terms: [
        ['5/2', '2'],
        ['1/2', '3/4'],
      ] as [string, string][],
    };
    expect(seriesDiff(a, b).map((l) => [l.exponent, l.state])).toEqual([
      ['1/2', 'differs'],
      ['5/2', 'agrees'],
    ]);
  });
});
