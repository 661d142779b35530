import type { ComputeResult } from '../engine/result.js';
import { errorTex, isNumericValue, numericDigits, numericError } from './numeric.js';
import type { AnyValue } from './values.js';
import { alignColumns } from './tables.js';

type AiryFit = NonNullable<NonNullable<ComputeResult['largeN']>['airy']>;
type CanonicalRow = ComputeResult['canonical'][number];

/** True when a result was computed in numeric mode. */
export function isNumericResult(r: Pick<ComputeResult, 'spec' | 'numeric'>): boolean {
  return r.numeric !== undefined || r.spec.precision !== undefined;
}

/** A numeric value's determined digits (ungrouped, for pasting) and its error, as two cells. */
export function numericCells(v: AnyValue): [real: string, error: string] {
  return isNumericValue(v) ? [numericDigits(v), numericError(v)] : ['', ''];
}

/** LaTeX of a decimal text: `1.25e-3` -> `1.25\times 10^{-3}`. */
export function decimalLatex(text: string): string {
  const m = /^([+-]?[\d.]+)[eE]([+-]?\d+)$/.exec(text);
  if (!m) return text;
  const exp = Number(m[2]);
  return m[1] === '1' ? `10^{${exp}}` : `${m[1]}\\times 10^{${exp}}`;
}

/** True when any row asked for a closed form (recognition ran). */
export function hasRecognition(r: Pick<ComputeResult, 'canonical'>): boolean {
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
export function numericCaution(r: Pick<ComputeResult, 'numeric'>): string | null {
  return r.numeric ? `caution: ${r.numeric.errorEstimate}` : null;
}

/** Plain-text lines of a numeric result's Airy fit (empty when there is none). */
export function airyTableLines(r: Pick<ComputeResult, 'largeN'>): string[] {
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

/** LaTeX of an error text (`3e-30` -> `3 \times 10^{-30}`; `0` stays `0`). */
export function errorLatex(error: string): string {
  return error === '' || error === '0' ? '0' : errorTex(error);
}
