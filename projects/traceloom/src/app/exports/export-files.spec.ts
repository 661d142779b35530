import { csvCell, fileStem, latexText, toCsv, toLatexTable } from './export-files';

describe('exports', () => {
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

  it('leaves numbers (also negative and rational) and plain text as they are', () => {
    expect(csvCell('-3/4')).toBe('-3/4');
    expect(csvCell('-12')).toBe('-12');
    expect(csvCell('q^(9/2) + O(q^40)')).toBe('q^(9/2) + O(q^40)');
    expect(csvCell('a, b')).toBe('"a, b"');
  });

  it('writes RFC 4180 CSV with a header row and CRLF line ends', () => {
    const csv = toCsv({
      columns: ['N', 'Z(N)'],
      rows: [
        ['0', '1'],
        ['1', '-q + O(q^3)'],
      ],
    });
    expect(csv).toBe("N,Z(N)\r\n0,1\r\n1,'-q + O(q^3)\r\n");
  });

  it('writes a booktabs table with maths columns and escaped text', () => {
    const tex = toLatexTable(
      { columns: ['N', 'Z(N)', 'note'], rows: [['3', 'q^{9/2}', '50% & more']] },
      { caption: 'trap_1', mathColumns: [1] },
    );
    expect(tex).toContain('\\toprule');
    expect(tex).toContain('\\midrule');
    expect(tex).toContain('\\bottomrule');
    expect(tex).toContain('3 & $q^{9/2}$ & 50\\% \\& more \\\\');
    expect(tex).toContain('\\caption{trap\\_1}');
    expect(latexText('a_b^c')).toBe('a\\_b\\textasciicircum{}c');
  });

  it('makes safe file names', () => {
    expect(fileStem('Harmonic trap, N ≤ 8')).toBe('harmonic-trap-n-8');
    expect(fileStem('***')).toBe('traceloom');
  });
});
