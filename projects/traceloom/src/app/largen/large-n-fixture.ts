import type { LargeNJson } from '@traceloom/shared/engine';

/**
 * The large-N block the engine gives for the harmonic trap, fermions, Z_L = q^(L/2)/(1-q^L), order
 * 30, N_max = 6: q^(-N^2/2) Z(N) = 1/(q;q)_N -> 1/(q;q)_inf (Andrews, The Theory of Partitions,
 * Cor. 2.2), agreeing below q^(N+1), first correction -q^(N+1). Written out by largeNAnalysis.
 */
export const TRAP_LARGE_N: LargeNJson = {
  variable: 'q',
  classes: [
    {
      parity: 'all',
      rows: [1, 2, 3, 4, 5, 6],
      normalization: 'q^(-N^2/2)',
      normalizationDetail: {
        source: 'fitted',
        leadingExponent: { expression: 'N^2/2', fittedOn: [1, 2, 3], verifiedOn: [4, 5, 6] },
      },
      limit: {
        order: '6',
        terms: [
          ['0', '1'],
          ['1', '1'],
          ['2', '2'],
          ['3', '3'],
          ['4', '5'],
          ['5', '7'],
        ],
      },
      limitNote:
        'determined below the first exponent where rows 5 and 6 differ, and no later row that knows a coefficient there disagrees',
      productExponents: [
        { n: '1', a: '1' },
        { n: '2', a: '1' },
        { n: '3', a: '1' },
        { n: '4', a: '1' },
        { n: '5', a: '1' },
      ],
      product: {
        exponents: [
          { n: '1', a: '1' },
          { n: '2', a: '1' },
          { n: '3', a: '1' },
          { n: '4', a: '1' },
          { n: '5', a: '1' },
        ],
        step: '1',
        determinedBelow: '6',
        pattern: 'a_n = 1',
        patternNote: 'polynomial in n, holds on every known n (n = 1..5)',
      },
      stabilization: [
        { N: 1, agreesBelow: '2' },
        { N: 2, agreesBelow: '3' },
        { N: 3, agreesBelow: '4' },
        { N: 4, agreesBelow: '5' },
        { N: 5, agreesBelow: null, atLeast: '6' },
        { N: 6, agreesBelow: null, atLeast: '6' },
      ],
      stabilizationFit: 'N + 1',
      stabilizationDetail: { expression: 'N + 1', fittedOn: [1, 2], verifiedOn: [3, 4] },
      stabilizationNote:
        'fitted on rows 1, 2, verified on 3, 4; rows 5, 6 agree with the limit on all of their known range (consistent)',
      correctionTerms: [
        {
          N: 1,
          value: {
            order: '6',
            terms: [
              ['2', '-1'],
              ['3', '-1'],
              ['4', '-1'],
            ],
          },
        },
        {
          N: 2,
          value: {
            order: '6',
            terms: [
              ['3', '-1'],
              ['4', '-1'],
              ['5', '-1'],
            ],
          },
        },
        {
          N: 3,
          value: {
            order: '6',
            terms: [
              ['4', '-1'],
              ['5', '-1'],
            ],
          },
        },
        { N: 4, value: { order: '6', terms: [['5', '-1']] } },
        { N: 5, value: { order: '6', terms: [] } },
        { N: 6, value: { order: '6', terms: [] } },
      ],
      corrections: [
        {
          m: 1,
          status: 'found',
          exponent: 'N + 1',
          coefficient: '-1',
          fittedOn: [1, 2],
          verifiedOn: [3, 4],
        },
        {
          m: 2,
          status: 'found',
          exponent: 'N + 2',
          coefficient: '-1',
          fittedOn: [1, 2],
          verifiedOn: [3],
        },
        {
          m: 3,
          status: 'none',
          exponent: null,
          coefficient: null,
          fittedOn: [],
          verifiedOn: [],
          note: 'fewer than 3 rows show a term 3 (1, 2)',
        },
      ],
    },
  ],
  notes: [],
};
