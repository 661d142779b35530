import { classRowJsonText } from '@traceloom/shared';
import { largeNTableLines } from './largen-render.js';
import { sectorCsvLines, sectorTableLines } from './sectors-render.js';
import type { ClassRowJson, ComputeResult, ValueJson } from '@traceloom/shared';
import {
  isNumericResult,
  isNumericValue,
  isNumericVerdict,
  numericText,
  type AnyRowVerdict,
  type AnyValue,
  type AnyWeightVerdict,
} from '../compute/numeric-values.js';
import {
  airyRows,
  airyTableLines,
  airyTitle,
  alignColumns,
  closedFormText,
  decimalLatex,
  hasRecognition,
  numericCaution,
  numericCells,
  numericHeading,
  numericLatex,
  numericVerdictLine,
} from './render-numeric.js';

/**
 * Text of a result value: a series in the expression language, e.g. `1 + 2*q^(1/2) + O(q^5)`;
 * a numeric value as its determined digits and error, `0.0123 ± 3e-21`.
 */
export function valueText(v: AnyValue, variable: string): string {
  return isNumericValue(v) ? numericText(v) : seriesText(v, variable);
}

function seriesText(v: ValueJson, variable: string): string {
  const pow = (e: string): string =>
    e === '1' ? variable : /^\d+$/.test(e) ? `${variable}^${e}` : `${variable}^(${e})`;
  const parts: string[] = [];
  for (const [e, c] of v.terms) {
    const negative = c.startsWith('-');
    const mag = negative ? c.slice(1) : c;
    const body = e === '0' ? mag : mag === '1' ? pow(e) : `${mag}*${pow(e)}`;
    parts.push(`${negative ? '-' : '+'} ${body}`);
  }
  if (v.order !== null) parts.push(`+ O(${pow(v.order)})`);
  if (parts.length === 0) return '0';
  const s = parts.join(' ');
  return s.startsWith('+ ') ? s.slice(2) : `-${s.slice(2)}`;
}

/** LaTeX of a result value (fractions as \tfrac; a numeric value with \pm its error). */
export function valueLatex(v: AnyValue, variable: string): string {
  return isNumericValue(v) ? numericLatex(v) : seriesLatex(v, variable);
}

function seriesLatex(v: ValueJson, variable: string): string {
  const num = (c: string): string => {
    const [n, d] = c.split('/');
    return d === undefined ? n! : `\\tfrac{${n}}{${d}}`;
  };
  const parts: string[] = [];
  for (const [e, c] of v.terms) {
    const negative = c.startsWith('-');
    const mag = negative ? c.slice(1) : c;
    const power = e === '0' ? '' : `${variable}^{${e}}`;
    const coeff = power === '' || mag !== '1' ? num(mag) : '';
    parts.push(`${negative ? '-' : '+'} ${coeff}${power}`);
  }
  if (v.order !== null) parts.push(`+ O(${variable}^{${v.order}})`);
  if (parts.length === 0) return '0';
  const s = parts.join(' ');
  return s.startsWith('+ ') ? s.slice(2) : `-${s.slice(2)}`;
}

const cycleText = (ct: [number, number][]): string => ct.map(([L, m]) => `${L}^${m}`).join(' ');

/** A cell that a spreadsheet will not run as a formula (numbers stay numbers). */
export function csvCell(s: string): string {
  let t = s;
  if (/^[=+\-@\t\r]/.test(t) && !/^-?\d+(\/\d+|(\.\d+)?([eE][+-]?\d+)?)$/.test(t)) t = `'${t}`;
  return /[",\n\r]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
}

/** A canonical row's value, or "not determined (O(q^k))" when no coefficient of it is known. */
function rowValueText(c: ComputeResult['canonical'][number], variable: string): string {
  return c.determined === false
    ? `not determined (${valueText(c.value, variable)})`
    : valueText(c.value, variable);
}

/** A canonical row's route agreement: yes, NO, or not compared (row not determined). */
const agreeText = (agrees: boolean | null): string =>
  agrees === null ? 'not compared' : agrees ? 'yes' : 'NO';

function verdictLine(label: string, k: number, v: AnyRowVerdict | AnyWeightVerdict): string {
  if (isNumericVerdict(v)) return numericVerdictLine(label, k, v);
  if (v.agrees === null) return `${label} ${k}: not compared (not determined at the order)`;
  const below = v.agreesBelow === null ? 'exactly' : `below exponent ${v.agreesBelow}`;
  if (v.agrees) return `${label} ${k}: agrees ${below}`;
  const m = v.firstMismatch!;
  return `${label} ${k}: differs at exponent ${m.exponent}: expected ${m.expected}, found ${m.found}`;
}

/** Lines for the checks of a result (plain text). */
function checkLines(r: ComputeResult): string[] {
  const out: string[] = [];
  for (const v of r.grandCheck ?? []) out.push(verdictLine('grand check N =', v.N, v));
  for (const v of r.impliedWeights ?? []) out.push(verdictLine('implied weight L =', v.L, v));
  for (const v of r.referenceCheck ?? []) out.push(verdictLine('reference N =', v.N, v));
  const numeric = isNumericResult(r);
  // a cut repeated in many sectors is said once, with how often and the range of terms
  const groups = new Map<string, { field: string; what: string; terms: number[] }>();
  for (const t of r.truncations) {
    const key = `${t.field}\u0000${t.what}`;
    const g = groups.get(key) ?? { field: t.field, what: t.what, terms: [] };
    g.terms.push(t.terms);
    groups.set(key, g);
  }
  for (const g of groups.values()) {
    const lo = Math.min(...g.terms);
    const hi = Math.max(...g.terms);
    const terms = lo === hi ? `${lo} terms` : `${lo}–${hi} terms`;
    const times = g.terms.length > 1 ? ` (${g.terms.length} times)` : '';
    out.push(
      numeric
        ? `${g.field}: ${g.what} stopped by the tolerance rule after ${terms}${times}`
        : `${g.field}: ${g.what} cut off at the order after ${terms}${times}`,
    );
  }
  return out;
}

/** Aligned plain-text tables: canonical table, class table, checks (numeric: with errors). */
export function renderTable(r: ComputeResult): string {
  if (isNumericResult(r)) return numericTable(r);
  const x = r.spec.variable;
  const lines: string[] = [];
  lines.push(`${r.spec.title ?? 'gas'} — ${r.spec.statistics}s, order ${r.spec.order ?? 'exact'}`);
  lines.push('');
  const rows = r.canonical.map((c) => [
    String(c.N),
    c.routes.join('+'),
    agreeText(c.agrees),
    rowValueText(c, x),
  ]);
  const head = ['N', 'routes', 'agree', 'Z(N)'];
  const w = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i]!.length)));
  const fmt = (row: string[]): string =>
    row.map((c, i) => (i < 3 ? c.padEnd(w[i]!) : c)).join('  ');
  lines.push(fmt(head), fmt(w.map((n, i) => '-'.repeat(i < 3 ? n : 4))));
  for (const row of rows) lines.push(fmt(row));
  if (r.classes.length > 0) {
    lines.push('', 'class table');
    for (const c of r.classes) {
      lines.push(
        `N=${c.N}  ${cycleText(c.cycleType)}  size ${c.size}  sign ${c.sign > 0 ? '+' : '-'}  ${valueText(c.contribution, x)}`,
      );
    }
  }
  lines.push(...sectorTableLines(r));
  lines.push(...largeNTableLines(r.largeN, (v) => valueText(v, x)));
  const checks = checkLines(r);
  if (checks.length) lines.push('', ...checks);
  if (r.orderAdvice) lines.push('', r.orderAdvice.message);
  return lines.join('\n') + '\n';
}

/**
 * CSV: the canonical table, then (after a blank line) the class table when there is one. A
 * numeric result has an error column beside each value, its closed forms and its Airy fit.
 */
export function renderCsv(r: ComputeResult): string {
  if (isNumericResult(r)) return numericCsv(r);
  const x = r.spec.variable;
  const lines = ['N,Z(N),routes,agree'];
  for (const c of r.canonical) {
    lines.push(
      [
        String(c.N),
        rowValueText(c, x),
        c.routes.join('+'),
        c.agrees === null ? 'not compared' : String(c.agrees),
      ]
        .map(csvCell)
        .join(','),
    );
  }
  if (r.classes.length > 0) {
    lines.push('', 'N,cycle type,size,sign,contribution');
    for (const c of r.classes) {
      lines.push(
        [String(c.N), cycleText(c.cycleType), c.size, String(c.sign), valueText(c.contribution, x)]
          .map(csvCell)
          .join(','),
      );
    }
  }
  lines.push(...sectorCsvLines(r, csvCell));
  return lines.join('\n') + '\n';
}

/** LaTeX (booktabs) tables of the canonical table and the class table (numeric: with errors). */
export function renderLatex(r: ComputeResult): string {
  if (isNumericResult(r)) return numericLatexTables(r);
  const x = r.spec.variable;
  const out = ['\\begin{tabular}{rl}', '\\toprule', `$N$ & $Z(N)$ \\\\`, '\\midrule'];
  for (const c of r.canonical) {
    const tex = valueLatex(c.value, x);
    out.push(`${c.N} & $${c.determined === false ? `\\text{not determined: } ${tex}` : tex}$ \\\\`);
  }
  out.push('\\bottomrule', '\\end{tabular}');
  if (r.classes.length > 0) {
    out.push(
      '',
      '\\begin{tabular}{rlrrl}',
      '\\toprule',
      '$N$ & cycle type & size & sign & contribution \\\\',
      '\\midrule',
    );
    for (const c of r.classes) {
      const ct = c.cycleType.map(([L, m]) => `${L}^{${m}}`).join('\\,');
      out.push(
        `${c.N} & $${ct}$ & ${c.size} & $${c.sign > 0 ? '+' : '-'}$ & $${valueLatex(c.contribution, x)}$ \\\\`,
      );
    }
    out.push('\\bottomrule', '\\end{tabular}');
  }
  return out.join('\n') + '\n';
}

/** The numeric canonical table: determined digits, ± error, routes, closed form. */
function numericTable(r: ComputeResult): string {
  const lines = [numericHeading(r), ''];
  const recognize = hasRecognition(r);
  const head = ['N', 'routes', 'agree', 'Z(N)', '± error', ...(recognize ? ['closed form'] : [])];
  const rows = r.canonical.map((c) => [
    String(c.N),
    c.routes.join('+'),
    agreeText(c.agrees),
    ...numericCells(c.value),
    ...(recognize ? [closedFormText(c)] : []),
  ]);
  lines.push(...alignColumns(head, rows));
  if (r.classes.length > 0) {
    lines.push('', 'class table');
    const classRows = r.classes.map((c) => [
      String(c.N),
      cycleText(c.cycleType),
      c.size,
      c.sign > 0 ? '+' : '-',
      ...numericCells(c.contribution),
    ]);
    lines.push(
      ...alignColumns(['N', 'cycle type', 'size', 'sign', 'contribution', '± error'], classRows),
    );
  }
  lines.push(...sectorTableLines(r));
  const airy = airyTableLines(r);
  if (airy.length) lines.push('', ...airy);
  const checks = checkLines(r);
  if (checks.length) lines.push('', ...checks);
  const caution = numericCaution(r);
  if (caution) lines.push('', caution);
  return lines.join('\n') + '\n';
}

function numericCsv(r: ComputeResult): string {
  const recognize = hasRecognition(r);
  const row = (cells: string[]): string => cells.map(csvCell).join(',');
  const lines = [
    row(['N', 'Z(N)', 'error', 'routes', 'agree', ...(recognize ? ['closed form'] : [])]),
  ];
  for (const c of r.canonical) {
    const form = recognize ? [c.recognized?.expression ?? ''] : [];
    lines.push(
      row([String(c.N), ...numericCells(c.value), c.routes.join('+'), String(c.agrees), ...form]),
    );
  }
  if (r.classes.length > 0) {
    lines.push('', row(['N', 'cycle type', 'size', 'sign', 'contribution', 'error']));
    for (const c of r.classes) {
      lines.push(
        row([
          String(c.N),
          cycleText(c.cycleType),
          c.size,
          String(c.sign),
          ...numericCells(c.contribution),
        ]),
      );
    }
  }
  const fit = r.largeN?.airy;
  if (fit) {
    const { params, residuals } = airyRows(fit);
    lines.push('', row([airyTitle(fit)]), row(['parameter', 'value', 'uncertainty']));
    for (const p of params) lines.push(row(p));
    lines.push('', row(['N', 'residual']), ...residuals.map(row));
  }
  const caution = numericCaution(r);
  if (caution) lines.push('', row([caution]));
  return lines.join('\n') + '\n';
}

function numericLatexTables(r: ComputeResult): string {
  const recognize = hasRecognition(r);
  const out = [
    `\\begin{tabular}{rll${recognize ? 'l' : ''}}`,
    '\\toprule',
    `$N$ & $Z(N)$ & error${recognize ? ' & closed form' : ''} \\\\`,
    '\\midrule',
  ];
  for (const c of r.canonical) {
    const [real, error] = numericCells(c.value);
    const form = recognize ? ` & ${c.recognized ? `$${c.recognized.latex}$` : ''}` : '';
    out.push(`${c.N} & $${decimalLatex(real)}$ & $${decimalLatex(error)}$${form} \\\\`);
  }
  out.push('\\bottomrule', '\\end{tabular}');
  if (r.classes.length > 0) {
    out.push('', '\\begin{tabular}{rlrrll}', '\\toprule');
    out.push('$N$ & cycle type & size & sign & contribution & error \\\\', '\\midrule');
    for (const c of r.classes) {
      const ct = c.cycleType.map(([L, m]) => `${L}^{${m}}`).join('\\,');
      const [real, error] = numericCells(c.contribution);
      out.push(
        `${c.N} & $${ct}$ & ${c.size} & $${c.sign > 0 ? '+' : '-'}$ & $${decimalLatex(real)}$ & $${decimalLatex(error)}$ \\\\`,
      );
    }
    out.push('\\bottomrule', '\\end{tabular}');
  }
  const fit = r.largeN?.airy;
  if (fit) {
    const { params, residuals } = airyRows(fit);
    out.push('', `% ${airyTitle(fit)}`, '\\begin{tabular}{lrr}', '\\toprule');
    out.push('parameter & value & uncertainty \\\\', '\\midrule');
    for (const [k, v, u] of params)
      out.push(`$${k}$ & $${decimalLatex(v!)}$ & $${decimalLatex(u!)}$ \\\\`);
    out.push('\\midrule', '$N$ & residual & \\\\');
    for (const [n, res] of residuals) out.push(`${n} & $${decimalLatex(res!)}$ & \\\\`);
    out.push('\\bottomrule', '\\end{tabular}');
  }
  const caution = numericCaution(r);
  if (caution) out.push('', `% ${caution.replace(/[\r\n]+/g, ' ')}`);
  return out.join('\n') + '\n';
}

/** JSON text of a class row (the engine's direct writer; 215,307 rows for S_1..S_40). */
export const classRowText: (r: ClassRowJson) => string = classRowJsonText;
