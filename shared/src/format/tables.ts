/**
 * Plain tables as text: CSV cells and rows, aligned columns for a terminal, LaTeX text escaping.
 * Every table Traceloom exports goes through these.
 */

/** A table to export: column headings and rows of cell texts. */
export interface ExportTable {
  columns: string[];
  rows: string[][];
}

const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^-?\d+(\/\d+|(\.\d+)?([eE][+-]?\d+)?)$/;

/**
 * One CSV cell: a text starting with = + - @ TAB or CR gets a leading ' so spreadsheets do not
 * run it as a formula (OWASP "CSV Injection"); plain numbers such as -3/4 or -1.5e-3 stay
 * numbers; quotes, commas and line breaks are quoted per RFC 4180.
 */
export function csvCell(text: string): string {
  const guarded = FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
  return /[",\r\n]/.test(guarded) ? `"${guarded.replace(/"/g, '""')}"` : guarded;
}

/** One CSV line of cells. */
export function csvRow(cells: readonly string[]): string {
  return cells.map(csvCell).join(',');
}

/** A whole table as CSV lines (no final line end). */
export function csvLines(table: ExportTable): string[] {
  return [table.columns, ...table.rows].map(csvRow);
}

/** A table as CSV text, one line per row, ending in a line end. */
export function toCsv(table: ExportTable): string {
  return `${csvLines(table).join('\n')}\n`;
}

/** Aligned plain-text columns (every column padded but the last), with a rule under the head. */
export function alignColumns(head: string[], rows: string[][]): string[] {
  const w = head.map((h, i) => Math.max(h.length, ...rows.map((row) => (row[i] ?? '').length)));
  const fmt = (row: string[]): string =>
    row
      .map((c, i) => (i < row.length - 1 ? c.padEnd(w[i]!) : c))
      .join('  ')
      .trimEnd();
  return [fmt(head), fmt(w.map((n) => '-'.repeat(n))), ...rows.map(fmt)];
}

const LATEX_SPECIALS: Record<string, string> = {
  '\\': '\\textbackslash{}',
  '&': '\\&',
  '%': '\\%',
  $: '\\$',
  '#': '\\#',
  _: '\\_',
  '{': '\\{',
  '}': '\\}',
  '~': '\\textasciitilde{}',
  '^': '\\textasciicircum{}',
};

/** Escapes text for LaTeX text mode (line breaks become spaces). */
export function latexText(text: string): string {
  return text.replace(/[\\&%$#_{}~^]/g, (c) => LATEX_SPECIALS[c] ?? c).replace(/[\r\n]+/g, ' ');
}

/** A whole-line LaTeX comment (`% ...`) of any text. */
export function latexComment(text: string): string {
  return `% ${text.replace(/[\r\n]+/g, ' ')}`;
}
