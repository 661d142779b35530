import type { ComputeResult } from '../engine/result.js';
import type { ValueJson } from '../engine/series/format.js';
import { knownSentence } from './known.js';
import { largeNTableLines } from './largen-text.js';
import { coefficientMatrixCsv } from './matrix.js';
import { sectorCsvLines, sectorTableLines } from './sectors-text.js';
import { isNumericValue } from './numeric.js';
import {
  airyRows,
  airyTableLines,
  airyTitle,
  closedFormText,
  hasRecognition,
  isNumericResult,
  numericCaution,
  numericCells,
} from './numeric-render.js';
import { alignColumns, csvLines, csvRow, type ExportTable } from './tables.js';
import { verdictText } from './verdicts.js';
import { cycleTypeText, knownTo, NOT_DETERMINED, valuation, valueText } from './values.js';
import { VERDICT } from './vocabulary.js';

type CanonicalRow = ComputeResult['canonical'][number];
type ClassRow = ComputeResult['classes'][number];

/** A canonical row as the renderers read it (`determined`/`agrees: null` for rows not known). */
export type CanonicalRowLike = Pick<CanonicalRow, 'N' | 'value' | 'routes'> &
  Partial<Pick<CanonicalRow, 'recognized' | 'recognizeNote' | 'sectors'>> & {
    agrees: boolean | null;
    determined?: boolean;
  };

/** The route check of a row in one word: agrees, differs, one route, or not compared. */
export function routeCheckText(row: { routes: readonly string[]; agrees: boolean | null }): string {
  if (row.routes.length < 2) return 'one route';
  if (row.agrees === null) return 'not compared';
  return row.agrees ? VERDICT.agrees : VERDICT.differs;
}

/** Z(N) as text: the value, or `not determined` for a row beyond the order. */
function zText(row: CanonicalRowLike, variable: string): string {
  return row.determined === false
    ? `${NOT_DETERMINED} (${valueText(row.value, variable)})`
    : valueText(row.value, variable);
}

/**
 * The canonical table as the CSV exports write it, from the CLI, the server and the screens
 * alike. Series: N, Z(N), lowest exponent, terms, known to, routes, route check. Numeric: N,
 * Z(N) (determined digits), error, routes, route check, and the closed form when recognition ran.
 * A sector sum adds a last column `sectors` (how many sectors made the row).
 */
export function canonicalTable(
  rows: readonly CanonicalRowLike[],
  variable: string,
  numeric: boolean,
): ExportTable {
  const table = numeric ? numericCanonical(rows) : seriesCanonical(rows, variable);
  if (!rows.some((c) => c.sectors !== undefined)) return table;
  return {
    columns: [...table.columns, 'sectors'],
    rows: table.rows.map((r, i) => [...r, String(rows[i]!.sectors ?? '')]),
  };
}

function numericCanonical(rows: readonly CanonicalRowLike[]): ExportTable {
  const recognize = rows.some((c) => c.recognized !== undefined || c.recognizeNote !== undefined);
  return {
    columns: ['N', 'Z(N)', 'error', 'routes', 'route check', ...(recognize ? ['closed form'] : [])],
    rows: rows.map((c) => [
      String(c.N),
      ...numericCells(c.value),
      c.routes.join('+'),
      routeCheckText(c),
      ...(recognize ? [c.recognized?.expression ?? ''] : []),
    ]),
  };
}

function seriesCanonical(rows: readonly CanonicalRowLike[], variable: string): ExportTable {
  return {
    columns: ['N', 'Z(N)', 'lowest exponent', 'terms', 'known to', 'routes', 'route check'],
    rows: rows.map((c) => [
      String(c.N),
      zText(c, variable),
      valuation(c.value) ?? '',
      isNumericValue(c.value) ? '' : String(c.value.terms.length),
      knownTo(c.value, variable),
      c.routes.join('+'),
      routeCheckText(c),
    ]),
  };
}

/** The class table for CSV: N, cycle type, size, sign, contribution (numeric: and its error). */
export function classTable(rows: readonly ClassRow[], variable: string): ExportTable {
  const numeric = rows.some((c) => isNumericValue(c.contribution));
  return {
    columns: ['N', 'cycle type', 'size', 'sign', 'contribution', ...(numeric ? ['error'] : [])],
    rows: rows.map((c) => [
      String(c.N),
      cycleTypeText(c.cycleType),
      c.size,
      String(c.sign),
      ...(numeric ? numericCells(c.contribution) : [valueText(c.contribution, variable)]),
    ]),
  };
}

/** Lines for the checks of a result (plain text). */
function checkLines(r: ComputeResult): string[] {
  const x = r.spec.variable;
  const out: string[] = [];
  for (const v of r.grandCheck ?? []) out.push(`grand check N = ${v.N}: ${verdictText(v, x)}`);
  for (const v of r.impliedWeights ?? [])
    out.push(`implied weight L = ${v.L}: ${verdictText(v, x)}`);
  for (const v of r.referenceCheck ?? []) out.push(`reference N = ${v.N}: ${verdictText(v, x)}`);
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

/** The heading line of a result: title, statistics and what is known of its values. */
export function resultHeading(r: ComputeResult): string {
  return `${r.spec.title ?? 'gas'} — ${r.spec.statistics}s, ${knownSentence(r)}`;
}

/** Aligned plain-text tables: canonical table, class table, large N, checks (numeric: errors). */
export function renderTable(r: ComputeResult): string {
  const x = r.spec.variable;
  const numeric = isNumericResult(r);
  const lines = [resultHeading(r), ''];
  const recognize = numeric && hasRecognition(r);
  const head = ['N', 'routes', 'route check', 'Z(N)', ...(numeric ? ['± error'] : [])];
  const rows = r.canonical.map((c) => [
    String(c.N),
    c.routes.join('+'),
    routeCheckText(c),
    ...(numeric ? numericCells(c.value) : [zText(c, x)]),
    ...(recognize ? [closedFormText(c)] : []),
  ]);
  lines.push(...alignColumns(recognize ? [...head, 'closed form'] : head, rows));
  if (r.classes.length > 0) {
    const t = classTable(r.classes, x);
    lines.push('', 'class table', ...alignColumns(t.columns, t.rows));
  }
  lines.push(...sectorTableLines(r));
  if (r.orderAdvice) lines.push('', r.orderAdvice.message);
  lines.push(...largeNTableLines(r.largeN, (v: ValueJson) => valueText(v, x)));
  const airy = airyTableLines(r);
  if (airy.length) lines.push('', ...airy);
  const checks = checkLines(r);
  if (checks.length) lines.push('', ...checks);
  const caution = numericCaution(r);
  if (caution) lines.push('', caution);
  return lines.join('\n') + '\n';
}

/**
 * CSV: the canonical table, then (after a blank line) the class table when there is one; a
 * numeric result adds its Airy fit and the caution on how its errors were estimated.
 */
export function renderCsv(r: ComputeResult): string {
  const x = r.spec.variable;
  const numeric = isNumericResult(r);
  const lines = csvLines(canonicalTable(r.canonical, x, numeric));
  if (r.classes.length > 0) lines.push('', ...csvLines(classTable(r.classes, x)));
  if (!numeric) lines.push(...sectorCsvLines(r));
  const fit = r.largeN?.airy;
  if (fit) {
    const { params, residuals } = airyRows(fit);
    lines.push('', csvRow([airyTitle(fit)]), csvRow(['parameter', 'value', 'uncertainty']));
    for (const p of params) lines.push(csvRow(p));
    lines.push('', csvRow(['N', 'residual']), ...residuals.map(csvRow));
  }
  const caution = numericCaution(r);
  if (caution) lines.push('', csvRow([caution]));
  return lines.join('\n') + '\n';
}

/**
 * The coefficient matrix (N x exponent) of a series table as CSV; refused for a numeric table,
 * which has no coefficients.
 */
export function renderMatrix(r: ComputeResult): string {
  if (isNumericResult(r)) {
    throw new Error('A numeric table has no coefficient matrix; export CSV instead.');
  }
  const rows = r.canonical.map((c) => ({ N: c.N, value: c.value as ValueJson }));
  return coefficientMatrixCsv(rows, r.spec.step ?? '1', r.spec.variable);
}
