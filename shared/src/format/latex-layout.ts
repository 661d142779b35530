/**
 * The page layout of every LaTeX export: series broken across lines inside `align*` (amsmath)
 * and class tables as `longtable` (the LaTeX tools bundle), so a long table and a long series
 * both break across lines and pages. Needs only `\usepackage{amsmath,longtable}`.
 */

/** The packages an export needs, as the comment at its top says. */
export const LATEX_PACKAGES = '\\usepackage{amsmath,longtable}';

/** Roughly how much LaTeX source fits on one line of a display before it should break. */
const LINE_SOURCE = 64;

/** Characters of a term as typeset, roughly: braces and commands count little. */
function width(term: string): number {
  return term.replace(/\\tfrac/g, '').replace(/[{}\\]/g, '').length;
}

/**
 * Signed terms (`+ a`, `- b`) joined into lines no wider than `max` (at least one term a
 * line); the first line without its leading `+ `, or with `-` for a negative first term.
 */
export function breakTerms(parts: readonly string[], max = LINE_SOURCE): string[] {
  if (parts.length === 0) return ['0'];
  const lines: string[][] = [[]];
  let used = 0;
  for (const p of parts) {
    const w = width(p) + 1;
    if (used > 0 && used + w > max) {
      lines.push([]);
      used = 0;
    }
    lines.at(-1)!.push(p);
    used += w;
  }
  const text = lines.map((l) => l.join(' '));
  const first = text[0]!;
  text[0] = first.startsWith('+ ') ? first.slice(2) : `-${first.slice(2)}`;
  return text;
}

/** One display row `lhs &= ...` whose continuation lines start `&\quad`. */
export function alignRow(lhs: string, lines: readonly string[], note = ''): string {
  const tail = note ? ` && ${note}` : '';
  const [first, ...rest] = lines;
  return [
    `${lhs} &= ${first}${rest.length ? '' : tail}`,
    ...rest.map((l, i) => `  &\\quad ${l}${i === rest.length - 1 ? tail : ''}`),
  ].join(' \\\\\n');
}

/**
 * An `align*` display of rows, inside a group that allows page breaks between rows (the
 * declaration does not leak into the rest of the document).
 */
export function alignDisplay(rows: readonly string[]): string[] {
  return [
    '\\begingroup\\allowdisplaybreaks',
    '\\begin{align*}',
    rows.join(' \\\\\n'),
    '\\end{align*}',
    '\\endgroup',
  ];
}

/** A cell holding lines of maths: one line as `$...$`, several stacked in `aligned`. */
export function mathCell(lines: readonly string[]): string {
  if (lines.length === 1) return `$${lines[0]}$`;
  return `$\\begin{aligned}[t] &${lines.join(' \\\\ &\\quad ')}\\end{aligned}$`;
}

/**
 * A `longtable` with a rule above and below its head (repeated on every page) and at its end;
 * `spec` is the column specification (`rlrrl`).
 */
export function longTable(
  spec: string,
  head: readonly string[],
  rows: readonly string[][],
): string[] {
  const line = (cells: readonly string[]): string => `${cells.join(' & ')} \\\\`;
  return [
    `\\begin{longtable}{${spec}}`,
    '\\hline',
    line(head),
    '\\hline',
    '\\endhead',
    ...rows.map(line),
    '\\hline',
    '\\end{longtable}',
  ];
}
