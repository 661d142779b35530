import { classRowJsonText } from '@traceloom/shared';
import type { ClassRowJson, ComputeResult, ValueJson } from '@traceloom/shared';

/** Text of a result value in the expression language, e.g. `1 + 2*q^(1/2) + O(q^5)`. */
export function valueText(v: ValueJson, variable: string): string {
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

/** LaTeX of a result value (fractions as \tfrac). */
export function valueLatex(v: ValueJson, variable: string): string {
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
  if (/^[=+\-@\t\r]/.test(t) && !/^-?\d+(\/\d+)?$/.test(t)) t = `'${t}`;
  return /[",\n\r]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
}

function verdictLine(
  label: string,
  k: number,
  v: {
    agrees: boolean;
    agreesBelow: string | null;
    firstMismatch: { exponent: string; expected: string; found: string } | null;
  },
): string {
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
  for (const t of r.truncations)
    out.push(`${t.field}: ${t.what} cut off at the order after ${t.terms} terms`);
  return out;
}

/** Aligned plain-text tables: canonical table, class table, checks. */
export function renderTable(r: ComputeResult): string {
  const x = r.spec.variable;
  const lines: string[] = [];
  lines.push(`${r.spec.title ?? 'gas'} — ${r.spec.statistics}s, order ${r.spec.order ?? 'exact'}`);
  lines.push('');
  const rows = r.canonical.map((c) => [
    String(c.N),
    c.routes.join('+'),
    c.agrees ? 'yes' : 'NO',
    valueText(c.value, x),
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
  const checks = checkLines(r);
  if (checks.length) lines.push('', ...checks);
  return lines.join('\n') + '\n';
}

/** CSV: the canonical table, then (after a blank line) the class table when there is one. */
export function renderCsv(r: ComputeResult): string {
  const x = r.spec.variable;
  const lines = ['N,Z(N),routes,agree'];
  for (const c of r.canonical) {
    lines.push(
      [String(c.N), valueText(c.value, x), c.routes.join('+'), String(c.agrees)]
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
  return lines.join('\n') + '\n';
}

/** LaTeX (booktabs) tables of the canonical table and the class table. */
export function renderLatex(r: ComputeResult): string {
  const x = r.spec.variable;
  const out = ['\\begin{tabular}{rl}', '\\toprule', `$N$ & $Z(N)$ \\\\`, '\\midrule'];
  for (const c of r.canonical) out.push(`${c.N} & $${valueLatex(c.value, x)}$ \\\\`);
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

/** JSON text of a class row (the engine's direct writer; 215,307 rows for S_1..S_40). */
export const classRowText: (r: ClassRowJson) => string = classRowJsonText;
