import { compute } from '@traceloom/shared/engine';
import { describe, expect, it } from 'vitest';
import { parseDecimal, shownDigits } from '../compute/numeric-values.js';
import {
  decimalLatex,
  renderCsv,
  renderLatex,
  renderTable,
  withUncertainty,
} from '@traceloom/shared/format';

/**
 * The harmonic trap at q = 1/10: Z(N) = q^(N^2/2) / (q;q)_N (Andrews 1976, Cor. 2.2), so
 * Z(2) = q^2/((1-q)(1-q^2)) = 10/891 and Z(4) = 100/8900199891 are rational.
 */
const trap = compute({
  format: 'traceloom.gas/1',
  statistics: 'fermion',
  variable: 'q',
  precision: 20,
  at: { q: '1/10' },
  nMax: 4,
  classTable: 2,
  recognize: { basis: ['1'] },
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
});

// mpmath 1.3 (independent): q^(N^2/2)/qp(q,q,N) at q = 1/10, mp.dps = 50, 40 digits
const MPMATH = [
  '1.0',
  '0.3513641844631532591109881716036353926355',
  '0.01122334455667789001122334455667789001122',
  '0.00003552685862257745210978535824750360387008',
  '0.00000001123570270608431214615289812933034045269',
];

/** True when `shown` is `exact` correctly rounded: within half a unit of its last digit. */
function correctlyRounded(shown: string, exact: string): boolean {
  const s = parseDecimal(shown)!;
  const x = parseDecimal(exact)!;
  const e = Math.min(s.exponent, x.exponent);
  const diff =
    s.mantissa * 10n ** BigInt(s.exponent - e) - x.mantissa * 10n ** BigInt(x.exponent - e);
  return 2n * (diff < 0n ? -diff : diff) <= 10n ** BigInt(s.exponent - e);
}

describe('numeric result in the CLI renderers', () => {
  it('shows each Z(N) with its determined digits (all correct) and an error column', () => {
    const csv = renderCsv(trap).split('\n');
    expect(csv[0]).toBe('N,Z(N),error,routes,route check,closed form');
    for (let N = 0; N <= 4; N++) {
      const [n, real, error] = csv[N + 1]!.split(',');
      expect(n).toBe(String(N));
      // the same decimal as the result's digits, written positionally where that is shorter
      const digits = (trap.canonical[N]!.value as { real: string }).real;
      expect(Number(real)).toBe(Number(digits));
      expect(shownDigits({ real: real!, error: error! })).toBeLessThanOrEqual(20);
      expect(shownDigits({ real: real!, error: error! })).toBeGreaterThanOrEqual(N === 0 ? 1 : 20);
      expect(correctlyRounded(real!, MPMATH[N]!)).toBe(true);
      expect(Number(error)).toBeLessThan(1e-30);
    }
  });

  it('puts the closed forms found beside their rows (10/891 and 100/8900199891)', () => {
    const csv = renderCsv(trap);
    expect(csv).toMatch(/\n2,0\.011223344556677890011,[^,]+,recursion\+classSum,agrees,10\/891\n/);
    expect(csv).toMatch(/\n4,[^,]+,[^,]+,recursion,one route,100\/8900199891\n/);
    const table = renderTable(trap);
    expect(table).toMatch(/^2 .*0\.011223344556677890011 .*10\/891 \(height 891/m);
    expect(table).toMatch(/^1 .*no relation of height <= \d+ at this precision$/m);
    expect(renderLatex(trap)).toMatch(/^Z\(2\) &= .* && \\frac\{10\}\{891\} \\\\$/m);
  });

  it('states how the errors were estimated, and the Airy fit as a small table', () => {
    for (const text of [renderTable(trap), renderCsv(trap), renderLatex(trap)]) {
      expect(text).toContain('caution: Each error is an estimate, not a bound');
      expect(text).toContain(
        'Airy fit Z(N) ~ C^(-1/3) e^A Ai[C^(-1/3) (N - B)], fitted on N = 1, 2, 3, 4',
      );
    }
    expect(renderTable(trap)).toMatch(
      /^numeric|— fermions, numeric at q = 1\/10, 20 digits requested/m,
    );
    expect(renderTable(trap)).toMatch(/^parameter\s+value\s+uncertainty$/m);
    expect(renderCsv(trap)).toMatch(/\nparameter,value,uncertainty\nC,[^,]+,[^,]+\nB,/);
  });

  it('writes LaTeX numbers with \\times 10^{k}', () => {
    expect(renderLatex(trap)).toContain(
      'Z(4) &= 1.12357\\,02706\\,08431\\,2146 \\times 10^{-8} \\pm',
    );
  });
});

describe('decimalLatex', () => {
  it.each([
    ['1.25e-3', '1.25\\times 10^{-3}'],
    ['1e-30', '10^{-30}'],
    ['0.5', '0.5'],
    ['-2.5e+4', '-2.5\\times 10^{4}'],
  ])('%s -> %s', (text, latex) => expect(decimalLatex(text)).toBe(latex));
});

describe('withUncertainty (no digit beyond the uncertainty)', () => {
  it.each([
    [1.23456, 0.01, '1.23', '0.010'],
    [-1.4321, 0.3, '-1.4', '0.30'],
    [1234.5, 20, '1.23e+3', '20'],
    [0.0031, 0.5, '0', '0.50'],
    [2.5, 0, '2.50000', '0'],
  ])('%d ± %d -> %s ± %s', (value, u, v, uu) => {
    expect(withUncertainty(value, u)).toEqual([v, uu]);
  });
});
