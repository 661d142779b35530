import { describe, expect, it } from 'vitest';
import { tableLatex } from './render-latex.js';
import { csvCell, latexText, toCsv } from './tables.js';

describe('table exports', () => {
  // OWASP CSV Injection cheat sheet: cells starting with = + - @ TAB CR get a leading quote.
  it.each([
    ['=HYPERLINK("x")', `"'=HYPERLINK(""x"")"`],
    ['+1+2', "'+1+2"],
    ['-q^2 + q^3', "'-q^2 + q^3"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['\tTAB', "'\tTAB"],
    ['\rCR', `"'\rCR"`],
  ])('guards %j as %j', (input, expected) => {
    expect(csvCell(input)).toBe(expected);
  });

  it('leaves numbers (also negative, rational and decimal) and plain text as they are', () => {
    expect(csvCell('-3/4')).toBe('-3/4');
    expect(csvCell('-12')).toBe('-12');
    expect(csvCell('-5.05e-2')).toBe('-5.05e-2');
    expect(csvCell('q^(9/2) + O(q^40)')).toBe('q^(9/2) + O(q^40)');
    expect(csvCell('a, b')).toBe('"a, b"');
  });

  it('writes CSV with a header row, one line per row', () => {
    const csv = toCsv({
      columns: ['N', 'Z(N)'],
      rows: [
        ['0', '1'],
        ['1', '-q + O(q^3)'],
      ],
    });
    expect(csv).toBe("N,Z(N)\n0,1\n1,'-q + O(q^3)\n");
  });

  it('writes a longtable with maths columns and escaped text', () => {
    const tex = tableLatex(
      { columns: ['N', 'Z(N)', 'note'], rows: [['3', 'q^{9/2}', '50% & more']] },
      [1],
      'trap_1',
    );
    expect(tex).toContain('\\begin{longtable}{lll}');
    expect(tex).toContain('3 & $q^{9/2}$ & 50\\% \\& more \\\\');
    expect(tex).toContain('% trap_1');
    expect(latexText('a_b^c')).toBe('a\\_b\\textasciicircum{}c');
  });
});
