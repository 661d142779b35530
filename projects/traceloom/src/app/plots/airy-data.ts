import type { Point } from './plot-data';
import { airyLogZ } from './airy';
import { isNumericValue, numericLog } from '@traceloom/shared/format';

/** The Airy fit of a numeric table, `result.largeN.airy`. */
export interface AiryFit {
  C: { value: number; uncertainty: number };
  B: { value: number; uncertainty: number };
  A: { value: number; uncertainty: number };
  residuals: { N: number; residual: number }[];
  fittedOn: number[];
}

/** `result.largeN.airy` when the run has one (numeric tables), else null. */
export function airyFitOf(result: unknown): AiryFit | null {
  const airy = (result as { largeN?: { airy?: unknown } } | null)?.largeN?.airy;
  return typeof airy === 'object' && airy !== null && 'C' in airy ? (airy as AiryFit) : null;
}

/** ln Z(N) of the table's numeric rows with at least one determined digit (N >= 1). */
export function logZPoints(rows: readonly { N: number; value: unknown }[]): Point[] {
  return rows
    .filter((r) => r.N >= 1 && isNumericValue(r.value))
    .map((r) => ({ x: r.N, y: numericLog(r.value as { real: string; error: string }) }))
    .filter((p) => Number.isFinite(p.y));
}

/** The fitted curve ln Z(N), sampled every `step` in N over [from, to], where Ai > 0. */
export function airyCurvePoints(fit: AiryFit, from: number, to: number, step = 0.1): Point[] {
  const out: Point[] = [];
  for (let k = 0; from + k * step <= to + 1e-9; k++) {
    const x = from + k * step;
    const y = airyLogZ(fit, x);
    if (Number.isFinite(y)) out.push({ x, y });
  }
  return out;
}
