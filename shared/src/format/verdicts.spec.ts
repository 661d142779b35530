import { describe, expect, it } from 'vitest';
import { checkStatusText, readResultVerdicts, readVerdict, verdictText } from './verdicts.js';

describe('verdicts in words and stored verdicts (worked by hand)', () => {
  it('reads the older side names expected/found as computed/supplied', () => {
    const old = {
      N: 2,
      agrees: false,
      agreesBelow: '3',
      firstMismatch: { exponent: '3', expected: '4', found: '8' },
    };
    expect(readVerdict(old).firstMismatch).toEqual({ exponent: '3', computed: '4', supplied: '8' });
    const today = { ...old, firstMismatch: { exponent: '3', computed: '4', supplied: '8' } };
    expect(readVerdict(today)).toEqual(today);
    const result = readResultVerdicts({ referenceCheck: [old], grandCheck: [today], other: 1 });
    expect(result.referenceCheck[0]!.firstMismatch).toEqual(today.firstMismatch);
    expect(result.other).toBe(1);
  });

  it.each([
    [{ agrees: true, agreesBelow: '40', firstMismatch: null }, 'agrees below q^40'],
    [{ agrees: true, agreesBelow: '1/2', firstMismatch: null }, 'agrees below q^(1/2)'],
    [{ agrees: true, agreesBelow: null, firstMismatch: null }, 'agrees exactly'],
    [
      {
        agrees: false,
        agreesBelow: '3',
        firstMismatch: { exponent: '3', expected: '4', found: '8' },
      },
      'differs at q^3: computed 4, supplied 8',
    ],
    [
      {
        agrees: false,
        tolerance: '3e-20',
        difference: '1e-5',
        computed: { real: '0.5', error: '1e-20' },
        supplied: { real: '0.50001', error: '2e-20' },
      },
      'differs by 1e-5, beyond the tolerance 3e-20: computed 0.5 ± 1e-20, supplied 0.50001 ± 2e-20',
    ],
    [{ agrees: true, tolerance: '3e-20', difference: '0' }, 'agrees within 3e-20 (difference 0)'],
  ])('%j -> %s', (v, text) => expect(verdictText(v as never)).toBe(text));
});

describe('checkStatusText', () => {
  it.each([
    ['green', 'passes'],
    ['red', 'fails'],
    ['passes', 'passes'],
    ['fails', 'fails'],
    ['waived', 'waived'],
    ['not compared', 'not compared'],
  ])('%s reads as %s', (stored, shown) => {
    expect(checkStatusText(stored)).toBe(shown);
  });
});
