import type { CanonicalRowJson } from '@traceloom/shared/engine';
import type { ExportTable } from '../exports/export-files';
import {
  NumericRoute,
  NumericRowExtras,
  NumericValueJson,
  RecognizedJson,
  isNumericValue,
  numericDigits,
  numericError,
  numericTex,
  errorTex,
} from './numeric-value';
import {
  AnyValue,
  NOT_DETERMINED,
  isUndetermined,
  knownTo,
  leadingTerm,
  leadingTermTex,
  valuation,
  valueTex,
  valueText,
} from './value-format';

/** A canonical row as the client reads it: series or numeric value, numeric extras optional. */
export type CanonicalRowView = Omit<CanonicalRowJson, 'value' | 'routes' | 'agrees'> & {
  value: AnyValue;
  routes?: readonly string[];
  agrees?: boolean | null;
} & NumericRowExtras;

/** One route's own value of a numeric row. */
export interface RouteValueLine {
  route: string;
  name: string;
  value: NumericValueJson;
  /** Determined digits, grouped in fives. */
  digits: string;
}

/** One line of the canonical table as the screen shows it. */
export interface CanonicalLine {
  N: number;
  value: AnyValue;
  /** Numeric mode: the value is `{real, error}`. */
  numeric: boolean;
  /** Numeric mode: determined digits, grouped in fives, and the error. */
  digits: string;
  error: string;
  routeValues: RouteValueLine[];
  recognized: RecognizedJson | null;
  recognizeNote: string | null;
  lead: string;
  leadTex: string;
  valuation: string | null;
  termCount: number;
  knownTo: string;
  routes: string[];
  /** null: the row is not determined at the order, so the routes were not compared. */
  agrees: boolean | null;
  /** False when no coefficient of Z(N) is determined at the order. */
  determined: boolean;
  text: string;
  /** Sector mode: how many sectors made this row (null outside sector mode). */
  sectors: number | null;
}

/** Human names of the routes to Z(N). */
export const ROUTE_NAMES: Record<string, string> = {
  recursion: 'Newton recursion',
  classSum: 'class sum',
  product: 'product form',
  fredholm: 'Fredholm determinant',
};

const ROUTE_ORDER: NumericRoute[] = ['recursion', 'fredholm', 'product', 'classSum'];

function routeValueLines(row: CanonicalRowView): RouteValueLine[] {
  const values = row.routeValues ?? {};
  return ROUTE_ORDER.flatMap((route) => {
    const value = values[route];
    return value
      ? [{ route, name: ROUTE_NAMES[route] ?? route, value, digits: numericDigits(value, true) }]
      : [];
  });
}

/** True when the rows hold numeric values (a numeric run). */
export function isNumericTable(rows: readonly CanonicalRowView[]): boolean {
  return rows.some((r) => isNumericValue(r.value));
}

/** The canonical table's lines from the result's rows. */
export function canonicalLines(
  rows: readonly CanonicalRowView[],
  variable: string,
): CanonicalLine[] {
  return rows.map((row) => ({
    N: row.N,
    value: row.value,
    numeric: isNumericValue(row.value),
    digits: isNumericValue(row.value) ? numericDigits(row.value, true) : '',
    error: isNumericValue(row.value) ? numericError(row.value) : '',
    routeValues: routeValueLines(row),
    recognized: row.recognized ?? null,
    recognizeNote: row.recognizeNote ?? null,
    lead: leadingTerm(row.value, variable),
    leadTex: leadingTermTex(row.value, variable),
    valuation: valuation(row.value),
    termCount: isNumericValue(row.value) ? 0 : row.value.terms.length,
    knownTo: knownTo(row.value, variable),
    routes: [...(row.routes ?? ['recursion'])],
    agrees: isUndetermined(row.value) ? null : (row.agrees ?? true),
    determined: !isUndetermined(row.value),
    text: valueText(row.value, variable),
    sectors: row.sectors ?? null,
  }));
}

/** True when the lines come from a sector sum (each says how many sectors made it). */
export function hasSectorCounts(lines: readonly CanonicalLine[]): boolean {
  return lines.some((l) => l.sectors !== null);
}

/** The table with a last column `sectors` (the count per row) when the run summed sectors. */
function withSectorCounts(table: ExportTable, lines: readonly CanonicalLine[]): ExportTable {
  if (!hasSectorCounts(lines)) return table;
  return {
    columns: [...table.columns, 'sectors'],
    rows: table.rows.map((r, i) => [...r, String(lines[i]!.sectors ?? '')]),
  };
}

/** The routes' agreement in words (the icon beside it is decoration). */
export function agreementText(line: CanonicalLine): string {
  if (line.routes.length < 2)
    return `one route (${ROUTE_NAMES[line.routes[0] ?? 'recursion'] ?? line.routes[0]})`;
  const names = line.routes.map((r) => ROUTE_NAMES[r] ?? r).join(', ');
  if (line.agrees === null) return `not compared (not determined): ${names}`;
  return line.agrees ? `agree: ${names}` : `DISAGREE: ${names}`;
}

/** The canonical table for the CSV/JSON exports (plain values). */
export function canonicalExport(lines: readonly CanonicalLine[]): ExportTable {
  if (lines.some((l) => l.numeric)) return withSectorCounts(numericExport(lines), lines);
  return withSectorCounts(plainExport(lines), lines);
}

function plainExport(lines: readonly CanonicalLine[]): ExportTable {
  return {
    columns: ['N', 'Z(N)', 'valuation', 'terms', 'known to', 'routes agree'],
    rows: lines.map((l) => [
      String(l.N),
      l.determined ? l.text : `${NOT_DETERMINED} (${l.text})`,
      l.determined ? (l.valuation ?? '') : '',
      String(l.termCount),
      l.knownTo,
      agreeCell(l),
    ]),
  };
}

/** The same table with Z(N) in LaTeX, for the booktabs export (column 1 is maths). */
export function canonicalLatex(lines: readonly CanonicalLine[], variable: string): ExportTable {
  if (lines.some((l) => l.numeric)) return numericLatex(lines);
  return {
    columns: ['N', 'Z(N)', 'known to'],
    rows: lines.map((l) => [
      String(l.N),
      l.determined
        ? valueTex(l.value, variable)
        : `\\text{${NOT_DETERMINED}: } ${valueTex(l.value, variable)}`,
      l.knownTo,
    ]),
  };
}

function agreeCell(l: CanonicalLine): string {
  if (l.routes.length < 2) return 'single route';
  return l.agrees === null ? 'not compared' : l.agrees ? 'yes' : 'no';
}

/**
 * A numeric table for CSV: only determined digits (ungrouped, so a spreadsheet reads them), the
 * error in its own column, the closed form when one was recognized.
 */
function numericExport(lines: readonly CanonicalLine[]): ExportTable {
  return {
    columns: ['N', 'Z(N)', 'error', 'closed form', 'routes agree'],
    rows: lines.map((l) => [
      String(l.N),
      isNumericValue(l.value) ? numericDigits(l.value) : l.text,
      l.error,
      l.recognized?.expression ?? '',
      agreeCell(l),
    ]),
  };
}

/** Columns of the LaTeX export that hold maths, series or numeric. */
export function canonicalMathColumns(lines: readonly CanonicalLine[]): number[] {
  return lines.some((l) => l.numeric) ? [1, 2, 3] : [1];
}

/**
 * The same for LaTeX: determined digits of Z(N) (thin spaces between groups of five), the error
 * and the closed form, each as maths.
 */
function numericLatex(lines: readonly CanonicalLine[]): ExportTable {
  return {
    columns: ['N', 'Z(N)', 'error', 'closed form'],
    rows: lines.map((l) => [
      String(l.N),
      isNumericValue(l.value) ? numericTex(l.value, Infinity, false) : valueTex(l.value),
      l.error === '' || l.error === '0' ? '0' : errorTex(l.error),
      l.recognized ? l.recognized.latex : '{}',
    ]),
  };
}
