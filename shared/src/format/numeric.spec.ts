import { describe, expect, it } from 'vitest';
import {
  isNumericValue,
  numericDigits,
  numericLog,
  numericNumber,
  numericTex,
  numericText,
} from './numeric.js';

// 1/(16 pi) = 0.01989436788648691697111047042156... (mpmath 1.3, independent; mp.dps = 40).
const ONE_OVER_16PI = { real: '1.98943678864869169711104704e-2', error: '3e-30' };

describe('numeric values', () => {
  it('tells the numeric form from the series form', () => {
    const cases: [unknown, boolean][] = [
      [ONE_OVER_16PI, true],
      [{ real: '0', error: '1e-3' }, true],
      [{ order: '20', terms: [['0', '1']] }, false],
      [{ real: 1, error: '0' }, false],
      [null, false],
      ['1.5', false],
    ];
    for (const [v, want] of cases) expect(isNumericValue(v)).toBe(want);
  });

  it('shows only the determined digits, grouped in fives, with the error', () => {
    // Magnitudes from 1e-3 to 1e6 are written positionally, others in scientific form.
    expect(numericText(ONE_OVER_16PI)).toBe('0.0198943678864869169711104704 ± 3e-30');
    expect(numericText(ONE_OVER_16PI, true)).toBe('0.01989 43678 86486 91697 11104 704 ± 3e-30');
    const table: [{ real: string; error: string }, string][] = [
      // exact values: no error shown
      [{ real: '1', error: '0' }, '1'],
      [{ real: '0.25', error: '0' }, '0.25'],
      // nothing determined: "0 ± e", never a made-up digit
      [{ real: '0', error: '2e-12' }, '0 ± 2e-12'],
      // large and small magnitudes in scientific form, grouped after the first digit
      [{ real: '-3.14159265358979e-7', error: '4e-22' }, '-3.14159 26535 8979e-7 ± 4e-22'],
      [{ real: '6.0221407600e23', error: '4e12' }, '6.02214 07600e23 ± 4e12'],
      // trailing zeros are digits too: error 1e13 leaves the last 0 (unit 1e13) undetermined
      [{ real: '6.0221407600e23', error: '1e13' }, '6.02214 0760e23 ± 1e13'],
      [{ real: '123456.5', error: '0.01' }, '1 23456.5 ± 0.01'],
      [{ real: '1234567.5', error: '0.01' }, '1.23456 75e6 ± 0.01'],
      [{ real: '12345.5', error: '0.01' }, '12345.5 ± 0.01'],
    ];
    for (const [v, want] of table) expect(numericText(v, true)).toBe(want);
  });

  it('drops digits the error does not determine (rounding), should a value carry any', () => {
    // error 3e-4 leaves digits down to 1e-3 (3e-4 <= 5e-4): 0.1234567 -> 0.123
    expect(numericDigits({ real: '0.1234567', error: '3e-4' })).toBe('0.123');
    // rounding carries: 0.9996 with error 3e-3 -> 1.00
    expect(numericDigits({ real: '0.9996', error: '3e-3' })).toBe('1.00');
    // error as large as the value: no digit is determined
    expect(numericDigits({ real: '0.5', error: '0.6' })).toBe('0');
  });

  it('typesets values with thin spaces, a power of ten and the error', () => {
    expect(numericTex(ONE_OVER_16PI)).toBe(
      '0.01989\\,43678\\,86486\\,91697\\,11104\\,704 \\pm 3 \\times 10^{-30}',
    );
    expect(numericTex({ real: '-3.14159265358979e-7', error: '4e-22' }, 6)).toBe(
      '-3.14159\\ldots \\times 10^{-7} \\pm 4 \\times 10^{-22}',
    );
    expect(numericTex({ real: '0', error: '1e-9' })).toBe('0 \\pm 10^{-9}');
    expect(numericTex({ real: '2', error: '0' })).toBe('2');
  });

  it('takes logarithms from the text, beyond the float64 range', () => {
    // ln(1e-500) = -500 ln 10 = -1151.2925464970229 (mpmath 1.3, independent)
    expect(numericLog({ real: '1e-500', error: '1e-520' })).toBeCloseTo(-1151.2925464970229, 9);
    // ln(1/(16 pi)) = -3.9173186080891814... (mpmath 1.3, independent)
    expect(numericLog(ONE_OVER_16PI)).toBeCloseTo(-3.9173186080891814, 12);
    expect(numericLog({ real: '0', error: '1' })).toBeNaN();
    expect(numericNumber(ONE_OVER_16PI)).toBeCloseTo(0.019894367886486918, 16);
  });
});
