import { verdictText } from '@traceloom/shared/format';
import { cellState, matrixExponents } from './verdict-cells';

describe('check matrix cells', () => {
  const agreeing = { N: 2, agrees: true, agreesBelow: '4', firstMismatch: null };
  const differing = {
    N: 3,
    agrees: false,
    agreesBelow: '3/2',
    firstMismatch: { exponent: '3/2', computed: '8', supplied: '4' },
  };

  it('a row that is not determined is not compared: no cell agrees, the text says so', () => {
    const open = { N: 30, agrees: null, agreesBelow: null, firstMismatch: null };
    expect(cellState(open, '0')).toBe('unchecked');
    expect(verdictText(open)).toBe('not compared (not determined at the order)');
  });

  it('marks coefficients below the agreed order as agreeing and the rest as unchecked', () => {
    expect(cellState(agreeing, '0')).toBe('agrees');
    expect(cellState(agreeing, '7/2')).toBe('agrees');
    expect(cellState(agreeing, '4')).toBe('unchecked');
  });

  it('marks the first mismatch, and what follows it as unchecked', () => {
    expect(cellState(differing, '1')).toBe('agrees');
    expect(cellState(differing, '3/2')).toBe('differs');
    expect(cellState(differing, '2')).toBe('unchecked');
  });

  it('treats exact agreement as agreeing everywhere', () => {
    expect(cellState({ N: 0, agrees: true, agreesBelow: null, firstMismatch: null }, '99')).toBe(
      'agrees',
    );
  });

  it('lays out the exponent grid in steps below the order, capped', () => {
    expect(matrixExponents('1/2', '2', [])).toEqual(['0', '1/2', '1', '3/2']);
    expect(matrixExponents('1', '100', [], 5)).toEqual(['0', '1', '2', '3', '4']);
    expect(matrixExponents('1', null, [differing])).toEqual(['0', '1', '2']);
  });

  it('says the verdict in words', () => {
    expect(verdictText(differing)).toBe('differs at q^(3/2): computed 8, supplied 4');
    expect(verdictText(agreeing)).toBe('agrees below q^4');
  });

  it('states the tolerance of a numeric verdict', () => {
    // Shapes of the numeric-mode contract: values compared within their combined error.
    const table: [{ agrees: boolean; tolerance: string; difference?: string }, string][] = [
      [
        { agrees: true, tolerance: '3e-28', difference: '1e-30' },
        'agrees within 3e-28 (difference 1e-30)',
      ],
      [{ agrees: true, tolerance: '3e-28' }, 'agrees within 3e-28'],
      [
        { agrees: false, tolerance: '3e-28', difference: '2e-5' },
        'differs by 2e-5, beyond the tolerance 3e-28',
      ],
    ];
    for (const [row, want] of table) expect(verdictText(row)).toBe(want);
  });
});
