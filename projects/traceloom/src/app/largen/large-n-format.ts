import type { LargeNClassJson, LargeNJson } from '@traceloom/shared/engine';
import type { ExportTable } from '@traceloom/shared/format';
import { valueTex, valueText } from '@traceloom/shared/format';

/** `x^(...)` groups of an expression turned into `x^{...}` (balanced parentheses). */
function bracePowers(s: string): string {
  let out = '';
  for (let i = 0; i < s.length; i++) {
    if (s[i] === '^' && s[i + 1] === '(') {
      let depth = 0;
      let j = i + 1;
      for (; j < s.length; j++) {
        if (s[j] === '(') depth++;
        else if (s[j] === ')' && --depth === 0) break;
      }
      out += `^{${bracePowers(s.slice(i + 2, j))}}`;
      i = j;
    } else if (s[i] === '^' && /\d/.test(s[i + 1] ?? '')) {
      const m = /^\d+/.exec(s.slice(i + 1))![0];
      out += `^{${m}}`;
      i += m.length;
    } else out += s[i];
  }
  return out;
}

/** LaTeX of a formula in N (and the variable) from the expression language: `N^2/2 + 1`. */
export function formulaTex(expr: string): string {
  return bracePowers(expr).replace(/\*/g, '\\,');
}

/** The product form as LaTeX: prod_{n >= 1} (1 - q^n)^{-a_n} on the grid of n. */
export function productTex(variable: string, step: string): string {
  const n = step === '1' ? 'n' : `${step.includes('/') ? `(${step})` : step}n`;
  return `\\prod_{n\\ge 1} \\left(1 - ${variable}^{${n}}\\right)^{-a_n}`;
}

/** One row of the N table: agreement with Z(inf) and the first correction terms. */
export interface LargeNRow {
  N: number;
  agrees: string;
  correction: string;
  correctionTex: string;
}

/** The rows of a class for the N table (agreement text honest: `>= 10` when only a bound). */
export function classRows(c: LargeNClassJson, variable: string): LargeNRow[] {
  return c.stabilization.map((s, i) => {
    const corr = c.correctionTerms[i];
    return {
      N: s.N,
      agrees: s.agreesBelow ?? (s.atLeast ? `≥ ${s.atLeast}` : 'everywhere known'),
      correction: corr ? valueText(corr.value, variable) : '',
      correctionTex: corr ? valueTex(corr.value, variable, 3) : '',
    };
  });
}

/** The block as one export table: class, N, agrees below, Z(N)/Z(inf) - 1. */
export function largeNExportTable(block: LargeNJson, latex = false): ExportTable {
  const rows: string[][] = [];
  for (const c of block.classes) {
    for (const r of classRows(c, block.variable)) {
      const agrees = latex ? r.agrees.replace('≥', '\\geq') : r.agrees.replace('≥', '>=');
      rows.push([c.parity, String(r.N), agrees, latex ? r.correctionTex : r.correction]);
    }
  }
  return { columns: ['class', 'N', 'agrees below', 'Z(N)/Z(inf) - 1'], rows };
}

/** Points (N, exponent) where a row stops agreeing with the limit (exact rows only). */
export function stabilizationPoints(c: LargeNClassJson): { x: number; y: number }[] {
  return c.stabilization
    .filter((s) => s.agreesBelow !== null)
    .map((s) => ({ x: s.N, y: rationalValue(s.agreesBelow!) }));
}

/** Points (N, coefficient) of the m-th correction term of each row that shows one. */
export function correctionPoints(c: LargeNClassJson, m: number): { x: number; y: number }[] {
  const out: { x: number; y: number }[] = [];
  for (const r of c.correctionTerms) {
    const t = r.value.terms[m - 1];
    if (t) out.push({ x: r.N, y: rationalValue(t[1]) });
  }
  return out;
}

/** A rational text `-3/4` as a float (plots only). */
export function rationalValue(t: string): number {
  const [n, d] = t.split('/');
  return Number(n) / (d === undefined ? 1 : Number(d));
}

/** The value of a linear formula `a*N + b` in N at N (plots only: evaluates the fitted line). */
export function linearAt(expr: string, N: number): number | null {
  const text = expr.replace(/\s+/g, '');
  const m = /^([+-]?[\d/]*\*?)?N(\/(\d+))?([+-][\d/]+)?$|^([+-]?[\d/]+)$/.exec(text);
  if (!m) return null;
  if (m[5] !== undefined) return rationalValue(m[5]);
  const coef =
    m[1] === undefined || m[1] === '' || m[1] === '+'
      ? '1'
      : m[1] === '-'
        ? '-1'
        : m[1].replace('*', '');
  const a = rationalValue(coef) / (m[3] ? Number(m[3]) : 1);
  return a * N + (m[4] ? rationalValue(m[4]) : 0);
}
