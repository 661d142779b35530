import type { CanonicalRowJson, ValueJson } from '@traceloom/shared/engine';
import type { ExportTable } from '../exports/export-files';
import {
  knownTo,
  leadingTerm,
  leadingTermTex,
  valuation,
  valueTex,
  valueText,
} from './value-format';

/** One line of the canonical table as the screen shows it. */
export interface CanonicalLine {
  N: number;
  value: ValueJson;
  lead: string;
  leadTex: string;
  valuation: string | null;
  termCount: number;
  knownTo: string;
  routes: string[];
  agrees: boolean;
  text: string;
}

/** Human names of the routes to Z(N). */
export const ROUTE_NAMES: Record<string, string> = {
  recursion: 'Newton recursion',
  classSum: 'class sum',
  product: 'product form',
};

/** The canonical table's lines from the result's rows. */
export function canonicalLines(
  rows: readonly CanonicalRowJson[],
  variable: string,
): CanonicalLine[] {
  return rows.map((row) => ({
    N: row.N,
    value: row.value,
    lead: leadingTerm(row.value, variable),
    leadTex: leadingTermTex(row.value, variable),
    valuation: valuation(row.value),
    termCount: row.value.terms.length,
    knownTo: knownTo(row.value, variable),
    routes: row.routes ?? ['recursion'],
    agrees: row.agrees ?? true,
    text: valueText(row.value, variable),
  }));
}

/** The routes' agreement in words (the icon beside it is decoration). */
export function agreementText(line: CanonicalLine): string {
  if (line.routes.length < 2)
    return `one route (${ROUTE_NAMES[line.routes[0] ?? 'recursion'] ?? line.routes[0]})`;
  const names = line.routes.map((r) => ROUTE_NAMES[r] ?? r).join(', ');
  return line.agrees ? `agree: ${names}` : `DISAGREE: ${names}`;
}

/** The canonical table for the CSV/JSON exports (plain values). */
export function canonicalExport(lines: readonly CanonicalLine[]): ExportTable {
  return {
    columns: ['N', 'Z(N)', 'valuation', 'terms', 'known to', 'routes agree'],
    rows: lines.map((l) => [
      String(l.N),
      l.text,
      l.valuation ?? '',
      String(l.termCount),
      l.knownTo,
      l.routes.length < 2 ? 'single route' : l.agrees ? 'yes' : 'no',
    ]),
  };
}

/** The same table with Z(N) in LaTeX, for the booktabs export (column 1 is maths). */
export function canonicalLatex(lines: readonly CanonicalLine[], variable: string): ExportTable {
  return {
    columns: ['N', 'Z(N)', 'known to'],
    rows: lines.map((l) => [String(l.N), valueTex(l.value, variable), l.knownTo]),
  };
}
