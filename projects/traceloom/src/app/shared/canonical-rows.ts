import type { CanonicalRowJson, ValueJson } from '@traceloom/shared/engine';
import {
  AnyValue,
  LATEX_PACKAGES,
  NumericRoute,
  NumericRowExtras,
  NumericValueJson,
  RecognizedJson,
  canonicalLatex,
  canonicalTable,
  coefficientMatrixCsv,
  isNumericValue,
  isUndetermined,
  knownTo,
  latexComment,
  leadingTerm,
  leadingTermTex,
  numericDigits,
  numericError,
  routeCheckText,
  routeName,
  toCsv,
  valuation,
  valueText,
} from '@traceloom/shared/format';

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

const ROUTE_ORDER: NumericRoute[] = ['recursion', 'fredholm', 'product', 'classSum'];

function routeValueLines(row: CanonicalRowView): RouteValueLine[] {
  const values = row.routeValues ?? {};
  return ROUTE_ORDER.flatMap((route) => {
    const value = values[route];
    return value
      ? [{ route, name: routeName(route), value, digits: numericDigits(value, true) }]
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

/** The routes' agreement in words (the icon beside it is decoration). */
export function agreementText(line: CanonicalLine): string {
  if (line.routes.length < 2) return `one route (${routeName(line.routes[0] ?? 'recursion')})`;
  const names = line.routes.map(routeName).join(', ');
  if (line.agrees === null) return `not compared (not determined): ${names}`;
  return `${routeCheckText(line)}: ${names}`;
}

/** The rows on screen as the renderers read them. */
function exportRows(lines: readonly CanonicalLine[]) {
  return lines.map((l) => ({
    N: l.N,
    value: l.value,
    routes: l.routes as CanonicalRowJson['routes'],
    agrees: l.agrees,
    ...(l.recognized ? { recognized: l.recognized } : {}),
    ...(l.recognizeNote ? { recognizeNote: l.recognizeNote } : {}),
    ...(l.sectors !== null ? { sectors: l.sectors } : {}),
    ...(l.determined ? {} : { determined: false }),
  }));
}

/** The canonical table as CSV, the same columns as the CLI and the dataset exports. */
export function canonicalCsv(lines: readonly CanonicalLine[], variable: string): string {
  return toCsv(
    canonicalTable(
      exportRows(lines),
      variable,
      lines.some((l) => l.numeric),
    ),
  );
}

/** The canonical table as LaTeX, the layout of the CLI and the dataset exports. */
export function canonicalTex(
  lines: readonly CanonicalLine[],
  variable: string,
  title: string,
): string {
  return (
    [
      latexComment(title),
      latexComment(`needs ${LATEX_PACKAGES}`),
      ...canonicalLatex(exportRows(lines), variable),
    ].join('\n') + '\n'
  );
}

/** The coefficient matrix (N x exponent) of a series table as CSV; null for a numeric one. */
export function canonicalMatrix(
  lines: readonly CanonicalLine[],
  variable: string,
  step: string,
): string | null {
  if (lines.some((l) => l.numeric)) return null;
  return coefficientMatrixCsv(
    lines.map((l) => ({ N: l.N, value: l.value as ValueJson })),
    step,
    variable,
  );
}
