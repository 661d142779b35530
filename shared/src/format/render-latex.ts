import type { ComputeResult } from '../engine/result.js';
import {
  alignDisplay,
  alignRow,
  breakTerms,
  LATEX_PACKAGES,
  longTable,
  mathCell,
} from './latex-layout.js';
import { isNumericValue, numericTex } from './numeric.js';
import {
  airyRows,
  airyTitle,
  decimalLatex,
  errorLatex,
  hasRecognition,
  isNumericResult,
  numericCaution,
} from './numeric-render.js';
import { latexComment, latexText, type ExportTable } from './tables.js';
import { cycleTypeTex, texTerms, type AnyValue } from './values.js';
import type { CanonicalRowLike } from './render.js';

type ClassRow = ComputeResult['classes'][number];

/** Lines of maths of one value: a series broken into lines of terms, a number on one line. */
function valueLines(v: AnyValue, variable: string, width?: number): string[] {
  if (isNumericValue(v)) return [numericTex(v)];
  return breakTerms(texTerms(v, variable), width);
}

/**
 * The canonical table as one `align*` display, `Z(N) &= ...` per row, long series broken
 * across lines; a numeric row carries its closed form after `&&` when one was recognized.
 */
export function canonicalLatex(rows: readonly CanonicalRowLike[], variable: string): string[] {
  return alignDisplay(
    rows.map((c) => {
      if (c.determined === false) {
        return `Z(${c.N}) &= \\text{not determined: } ${valueLines(c.value, variable).join(' ')}`;
      }
      const note = c.recognized ? c.recognized.latex : '';
      return alignRow(`Z(${c.N})`, valueLines(c.value, variable), note);
    }),
  );
}

/**
 * The class table as a `longtable` in maths: cycle type `1^{2}\,2^{1}`, class size, sign and
 * the contribution (fractions as `\tfrac`, long series stacked; numeric: its error beside it).
 */
export function classLatex(rows: readonly ClassRow[], variable: string): string[] {
  const numeric = rows.some((c) => isNumericValue(c.contribution));
  const head = ['$N$', 'cycle type', 'size', 'sign', 'contribution', ...(numeric ? ['error'] : [])];
  const body = rows.map((c) => [
    String(c.N),
    `$${cycleTypeTex(c.cycleType)}$`,
    `$${c.size}$`,
    `$${c.sign > 0 ? '+' : '-'}$`,
    ...(isNumericValue(c.contribution)
      ? [
          `$${numericTex(c.contribution, Infinity, false)}$`,
          `$${errorLatex(c.contribution.error)}$`,
        ]
      : [mathCell(valueLines(c.contribution, variable, 40))]),
  ]);
  return longTable(numeric ? 'rlrrll' : 'rlrrl', head, body);
}

/** The Airy fit of a numeric table as a small `longtable`. */
function airyLatex(r: ComputeResult): string[] {
  const fit = r.largeN?.airy;
  if (!fit) return [];
  const { params, residuals } = airyRows(fit);
  return [
    '',
    latexComment(airyTitle(fit)),
    ...longTable(
      'lrr',
      ['parameter', 'value', 'uncertainty'],
      [
        ...params.map(([k, v, u]) => [`$${k}$`, `$${decimalLatex(v!)}$`, `$${decimalLatex(u!)}$`]),
        ['$N$', 'residual', ''],
        ...residuals.map(([n, res]) => [n!, `$${decimalLatex(res!)}$`, '']),
      ],
    ),
  ];
}

/**
 * The LaTeX export of a result, the one layout of run and dataset exports: comment lines (the
 * caller's heading, the packages needed), the canonical table as a display, the class table,
 * the Airy fit and the caution of a numeric table. Compiles in any document that loads
 * amsmath and longtable.
 */
export function renderLatex(r: ComputeResult, heading: readonly string[] = []): string {
  const x = r.spec.variable;
  const out = [
    ...heading.map(latexComment),
    latexComment(`needs ${LATEX_PACKAGES}`),
    ...(isNumericResult(r) && hasRecognition(r)
      ? [latexComment('after && : the closed form recognized for that row')]
      : []),
    ...canonicalLatex(r.canonical, x),
  ];
  if (r.classes.length > 0) out.push('', ...classLatex(r.classes, x));
  out.push(...airyLatex(r));
  const caution = numericCaution(r);
  if (caution) out.push('', latexComment(caution));
  return out.join('\n') + '\n';
}

/**
 * Any table on screen as a LaTeX `longtable` in the same layout: columns in `mathColumns` hold
 * LaTeX maths already (wrapped in `$...$`), the others are escaped as text.
 */
export function tableLatex(
  table: ExportTable,
  mathColumns: readonly number[] = [],
  title = '',
): string {
  const math = new Set(mathColumns);
  const cell = (text: string, i: number): string => (math.has(i) ? `$${text}$` : latexText(text));
  return (
    [
      ...(title ? [latexComment(title)] : []),
      latexComment(`needs ${LATEX_PACKAGES}`),
      ...longTable(
        table.columns.map(() => 'l').join(''),
        table.columns.map(latexText),
        table.rows.map((row) => row.map(cell)),
      ),
    ].join('\n') + '\n'
  );
}
