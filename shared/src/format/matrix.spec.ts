import { describe, expect, it } from 'vitest';
import { compute } from '../engine/index.js';
import { renderMatrix } from './render.js';
import { coefficientMatrixCsv } from './matrix.js';

describe('coefficient matrix (N x exponent)', () => {
  it('harmonic trap, step 1/2: Z(N) = q^(N^2/2)/(q;q)_N row by row', () => {
    // Andrews, The Theory of Partitions, Cor. 2.2; the coefficients of 1/(q;q)_N count
    // partitions into parts <= N (OEIS A008619 for N = 2, A001399 for N = 3).
    const r = compute({
      format: 'traceloom.gas/1',
      statistics: 'fermion',
      variable: 'q',
      step: '1/2',
      order: '8',
      nMax: 3,
      weights: { kind: 'formula', expression: 'q^(L/2) / (1 - q^L)' },
    });
    const lines = renderMatrix(r).trimEnd().split('\n');
    expect(lines[0]).toBe(
      'N,q^0,q^1/2,q^1,q^3/2,q^2,q^5/2,q^3,q^7/2,q^4,q^9/2,q^5,q^11/2,q^6,q^13/2,q^7,q^15/2',
    );
    expect(lines[1]).toBe('0,1,0,0,0,0,0,0,0,0,0,0,0,0,0,0,0');
    expect(lines[2]).toBe('1,0,1,0,1,0,1,0,1,0,1,0,1,0,1,0,1');
    expect(lines[3]).toBe('2,0,0,0,0,1,0,1,0,2,0,2,0,3,0,3,0');
    expect(lines[4]).toBe('3,0,0,0,0,0,0,0,0,0,1,0,1,0,2,0,3');
  });

  it('leaves undetermined cells empty and starts at the lowest exponent (worked by hand)', () => {
    const csv = coefficientMatrixCsv(
      [
        { N: 1, value: { order: '1', terms: [['-1', '2']] } },
        {
          N: 2,
          value: {
            order: '3',
            terms: [
              ['0', '-1/2'],
              ['2', '5'],
            ],
          },
        },
      ],
      '1',
      'x',
    );
    expect(csv).toBe('N,x^-1,x^0,x^1,x^2\n1,2,0,,\n2,0,-1/2,0,5\n');
  });

  it('refuses a numeric table, which has no coefficients', () => {
    const r = compute({
      format: 'traceloom.gas/1',
      statistics: 'fermion',
      precision: 10,
      at: { q: '1/10' },
      nMax: 1,
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
    });
    expect(() => renderMatrix(r)).toThrow(/no coefficient matrix/);
  });
});
