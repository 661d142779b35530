/**
 * File exports from the screens: CSV (with the OWASP CSV-injection guard), JSON and a LaTeX
 * booktabs table, handed to the browser as a download (Blob + object URL).
 */

/** One table to export: column headings and rows of cell texts. */
export interface ExportTable {
  columns: string[];
  rows: string[][];
}

const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^-?\d+(\.\d+)?(\/\d+)?$/;

/**
 * One CSV cell: a text starting with = + - @ TAB or CR is prefixed with ' so spreadsheets do not
 * run it as a formula (OWASP "CSV Injection"); plain numbers such as -3/4 stay numbers; quotes,
 * commas and line breaks are quoted per RFC 4180.
 */
export function csvCell(text: string): string {
  const guarded = FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
  return /[",\r\n]/.test(guarded) ? `"${guarded.replace(/"/g, '""')}"` : guarded;
}

/** A whole table as CSV text (CRLF line ends, RFC 4180). */
export function toCsv(table: ExportTable): string {
  const lines = [table.columns, ...table.rows].map((row) => row.map(csvCell).join(','));
  return `${lines.join('\r\n')}\r\n`;
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

/** Escapes text for a LaTeX text cell. */
export function latexText(text: string): string {
  return text.replace(/[\\&%$#_{}~^]/g, (c) => LATEX_SPECIALS[c] ?? c);
}

/**
 * A booktabs table (`\toprule`, `\midrule`, `\bottomrule`). Columns listed in `mathColumns` hold
 * LaTeX maths already and are wrapped in `$...$`; the others are escaped as text.
 */
export function toLatexTable(
  table: ExportTable,
  options: { caption?: string; mathColumns?: number[] } = {},
): string {
  const math = new Set(options.mathColumns ?? []);
  const cell = (text: string, i: number) => (math.has(i) ? `$${text}$` : latexText(text));
  const lines = [
    '% needs \\usepackage{booktabs}',
    '\\begin{table}[ht]',
    '\\centering',
    `\\begin{tabular}{${table.columns.map(() => 'l').join('')}}`,
    '\\toprule',
    `${table.columns.map(latexText).join(' & ')} \\\\`,
    '\\midrule',
    ...table.rows.map((row) => `${row.map(cell).join(' & ')} \\\\`),
    '\\bottomrule',
    '\\end{tabular}',
  ];
  if (options.caption) lines.push(`\\caption{${latexText(options.caption)}}`);
  lines.push('\\end{table}');
  return `${lines.join('\n')}\n`;
}

/** Pretty JSON with a final newline. */
export function toJson(value: unknown): string {
  return `${JSON.stringify(value, null, 2)}\n`;
}

/** A file name made of safe characters from a title (`harmonic trap` -> `harmonic-trap`). */
export function fileStem(title: string): string {
  const stem = title
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');
  return stem || 'traceloom';
}

/** Hands `text` to the browser as a file download named `filename`. */
export function downloadText(text: string, filename: string, type: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
