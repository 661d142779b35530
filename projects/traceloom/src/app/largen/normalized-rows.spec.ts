import { TRAP_LARGE_N } from './large-n-fixture';
import { normalizedCanonicalRows } from './normalized-rows';

describe('normalizedCanonicalRows', () => {
  // Harmonic trap, fermions: Z(3) = q^(9/2)/(q;q)_3 = q^(9/2) + q^(11/2) + 2 q^(13/2) + ...
  // (Andrews, Theory of Partitions, Cor. 2.2): normalized 1 + q + 2 q^2 + ... + O(q^(order - 9/2)).
  const rows = [
    { N: 0, value: { order: null, terms: [['0', '1']] as [string, string][] } },
    {
      N: 3,
      value: {
        order: '30',
        terms: [
          ['9/2', '1'],
          ['11/2', '1'],
          ['13/2', '2'],
        ] as [string, string][],
      },
    },
  ];
  it('divides each row of a fitted class by its leading term, order included', () => {
    const out = normalizedCanonicalRows(rows, TRAP_LARGE_N)!;
    expect(out[0]).toBe(rows[0]);
    expect(out[1]!.value).toEqual({
      order: '51/2',
      terms: [
        ['0', '1'],
        ['1', '1'],
        ['2', '2'],
      ],
    });
  });

  it('divides out a leading coefficient (degenerate ground state)', () => {
    const two = [
      {
        N: 3,
        value: {
          order: '5',
          terms: [
            ['2', '2'],
            ['3', '3'],
          ] as [string, string][],
        },
      },
    ];
    expect(normalizedCanonicalRows(two, TRAP_LARGE_N)![0]!.value).toEqual({
      order: '3',
      terms: [
        ['0', '1'],
        ['1', '3/2'],
      ],
    });
  });

  it.each([
    ['no block', undefined],
    ['a numeric block', {}],
    [
      'a given normalization',
      {
        ...TRAP_LARGE_N,
        classes: TRAP_LARGE_N.classes.map((c) => ({
          ...c,
          normalizationDetail: { source: 'given' as const },
        })),
      },
    ],
  ])('null for %s', (_what, block) => {
    expect(normalizedCanonicalRows(rows, block)).toBeNull();
  });
});
