import { compute, type ComputeResult } from '@traceloom/shared/engine';
import { describe, expect, it } from 'vitest';
import { TRAP_SPEC } from '../testing/gas-fixtures.js';
import { resultMismatches } from './result-compare.js';

/** The trap with the bosonic grand function: Z_2 implied differs from the entered one. */
const WRONG_GRAND = {
  ...TRAP_SPEC,
  grand: { kind: 'expression', expression: '1/qpoch(kappa*q^(1/2), q, inf)' },
};

describe('verify: recomputed result against the stored one', () => {
  const fresh = compute(WRONG_GRAND as never) as ComputeResult;

  it('accepts a stored result made before implied weights carried their series', () => {
    const stored = structuredClone(fresh);
    stored.impliedWeights = (stored.impliedWeights as Array<Record<string, unknown>>).map(
      ({ implied: _implied, ...rest }) => rest,
    ) as never;
    expect(resultMismatches(stored, fresh)).toEqual([]);
  });

  it('still compares the implied series when the stored result has them', () => {
    const stored = structuredClone(fresh);
    const rows = stored.impliedWeights as Array<{ implied?: { terms: string[][] } }>;
    rows[1]!.implied!.terms[0] = ['1', '7'];
    expect(resultMismatches(stored, fresh)).toEqual(['impliedWeights L = 2: differs']);
  });
});
