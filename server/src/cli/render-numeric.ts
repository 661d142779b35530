import type { ComputeResult } from '@traceloom/shared';
import {
  isNumericValue,
  knownSentence,
  type AnyValue,
  type NumericValue,
  type NumericVerdict,
} from '../compute/numeric-values.js';

type AiryFit = NonNullable<NonNullable<ComputeResult['largeN']>['airy']>;
type CanonicalRow = ComputeResult['canonical'][number];

/** A numeric value's determined digits and its error, as two cells. */
export function numericCells(v: AnyValue): [real: string, error: string] {
  return isNumericValue(v) ? [v.real, v.error] : ['', ''];
}

/** LaTeX of a decimal text: `1.25e-3` -> `1.25\times 10^{-3}`. */
export function decimalLatex(text: string): string {
  const m = /^([+-]?[\d.]+)[eE]([+-]?\d+)$/.exec(text);
  if (!m) return text;
  const exp = Number(m[2]);
  return m[1] === '1' ? `10^{${exp}}` : `${m[1]}\\times 10^{${exp}}`;
}

/** LaTeX of a numeric value: digits, then `\pm` error when it is not 0. */
export function numericLatex(v: NumericValue): string {
  return v.error === '0'
    ? decimalLatex(v.real)
    : `${decimalLatex(v.real)} \\pm ${decimalLatex(v.error)}`;
}

/** True when any row asked for a closed form (recognition ran). */
export function hasRecognition(r: ComputeResult): boolean {
  return r.canonical.some((c) => c.recognized !== undefined || c.recognizeNote !== undefined);
}

/** The closed-form cell of a row: the expression, or why there is none. */
export function closedFormText(c: CanonicalRow): string {
  if (c.recognized)
    return `${c.recognized.expression} (height ${c.recognized.height}, ${c.recognized.digitsToSpare} digits to spare)`;
  return c.recognizeNote ?? '';
}

/**
 * A float shown to the digits its uncertainty allows: the value rounded at the uncertainty's
 * leading digit, the uncertainty to two digits (no digit beyond what the fit determines).
 */
export function withUncertainty(value: number, uncertainty: number): [string, string] {
  if (!Number.isFinite(value)) return [String(value), String(uncertainty)];
  if (!(uncertainty > 0) || !Number.isFinite(uncertainty)) {
    return [value.toPrecision(6), Number.isFinite(uncertainty) ? '0' : 'unknown'];
  }
  const lead = (x: number): number => Math.floor(Math.log10(Math.abs(x)));
  const digits = value === 0 ? 1 : lead(value) - lead(uncertainty) + 1;
  if (digits < 1) return ['0', uncertainty.toPrecision(2)];
  return [value.toPrecision(Math.min(15, digits)), uncertainty.toPrecision(2)];
}

/** The Airy fit as rows: [parameter, value, uncertainty], then the residuals [N, residual]. */
export function airyRows(fit: AiryFit): { params: string[][]; residuals: string[][] } {
  const params = (['C', 'B', 'A'] as const).map((k) => [
    k,
    ...withUncertainty(fit[k].value, fit[k].uncertainty),
  ]);
  const residuals = fit.residuals.map((r) => [String(r.N), r.residual.toPrecision(3)]);
  return { params, residuals };
}

/** The sentence that names the Airy form and the rows it was fitted on. */
export function airyTitle(fit: AiryFit): string {
  return `Airy fit Z(N) ~ C^(-1/3) e^A Ai[C^(-1/3) (N - B)], fitted on N = ${fit.fittedOn.join(', ')}`;
}

/** The numeric block's caution (how the errors were estimated), or none. */
export function numericCaution(r: ComputeResult): string | null {
  return r.numeric ? `caution: ${r.numeric.errorEstimate}` : null;
}

/** The heading of a numeric table: statistics and what is known. */
export function numericHeading(r: ComputeResult): string {
  return `${r.spec.title ?? 'gas'} — ${r.spec.statistics}s, ${knownSentence(r)}`;
}

/** One line for a numeric verdict: agreement within the tolerance, or the difference beyond it. */
export function numericVerdictLine(label: string, k: number, v: NumericVerdict): string {
  if (v.agrees) return `${label} ${k}: agrees within ${v.tolerance} (difference ${v.difference})`;
  return `${label} ${k}: differs by ${v.difference}, beyond the tolerance ${v.tolerance}: computed ${v.computed.real} ± ${v.computed.error}, supplied ${v.supplied.real} ± ${v.supplied.error}`;
}

/** Aligned plain-text columns (every column padded but the last). */
export function alignColumns(head: string[], rows: string[][]): string[] {
  const w = head.map((h, i) => Math.max(h.length, ...rows.map((row) => (row[i] ?? '').length)));
  const fmt = (row: string[]): string =>
    row
      .map((c, i) => (i < row.length - 1 ? c.padEnd(w[i]!) : c))
      .join('  ')
      .trimEnd();
  return [fmt(head), fmt(w.map((n) => '-'.repeat(n))), ...rows.map(fmt)];
}

/** Plain-text lines of a numeric result's Airy fit (empty when there is none). */
export function airyTableLines(r: ComputeResult): string[] {
  const fit = r.largeN?.airy;
  if (!fit) return [];
  const { params, residuals } = airyRows(fit);
  return [
    airyTitle(fit),
    ...alignColumns(['parameter', 'value', 'uncertainty'], params),
    '',
    ...alignColumns(['N', 'residual'], residuals),
  ];
}
