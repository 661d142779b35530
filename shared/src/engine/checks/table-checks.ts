import type Fraction from 'fraction.js';
import type { Truncation } from '../expr/evaluate.js';
import { parseExpression } from '../expr/sandbox.js';
import { largeNAnalysis } from '../largen/index.js';
import type { ComputeResult, Progress } from '../result.js';
import type { Series } from '../series/series.js';
import type { GasSpec } from '../spec/schema.js';
import { seriesAt, type GasRing } from '../weights.js';
import { grandCheck } from './grand.js';
import { referenceCheck } from './reference.js';

/** Tag truncation records with the spec field they come from. */
export function tagged(
  field: string,
  list: Truncation[],
): { field: string; what: string; terms: number }[] {
  return list.map((t) => ({ field, ...t }));
}

/**
 * The grand and reference checks of a series canonical table, written into `result` (verdicts,
 * implied weights, truncations). `weights` are the cycle weights the implied ones are compared with.
 */
export function runTableChecks(
  spec: GasSpec,
  Z: readonly Series[],
  weights: readonly Series[],
  cap: Fraction | null,
  result: ComputeResult,
  phase: (p: Progress['phase'], total: number) => void,
): void {
  if (spec.grand) {
    phase('grand', spec.nMax);
    const list: Truncation[] = [];
    const g = grandCheck(spec, Z, weights, cap, list);
    result.grandCheck = g.rows;
    result.impliedWeights = g.impliedWeights;
    result.truncations.push(...tagged('grand', list));
  }
  if (spec.reference) {
    phase('reference', spec.reference.rows.length);
    const list: Truncation[] = [];
    result.referenceCheck = referenceCheck(spec, Z, cap, list);
    result.truncations.push(...tagged('reference', list));
  }
}

/** The large-N analysis of a series canonical table (nMax >= 4 or asked for), into `result`. */
export function runLargeN(
  spec: GasSpec,
  Z: readonly Series[],
  ring: GasRing,
  result: ComputeResult,
): void {
  // a table of plain numbers (every Z(N) free of the variable) has no large-N structure in it
  const constant = Z.every((z) => z.isConstant());
  if (spec.largeN === undefined && (spec.nMax < 4 || constant)) return;
  let normalization: Series[] | undefined;
  const text = spec.largeN?.normalization;
  if (text !== undefined) {
    const field = 'largeN.normalization';
    const node = parseExpression(text, field);
    const list: Truncation[] = [];
    normalization = Z.map((_, N) => seriesAt(node, ring, field, list, { N }));
    result.truncations.push(...tagged('largeN', list));
  }
  const started = Date.now();
  const analysis = largeNAnalysis([...Z], spec, normalization ? { normalization } : {});
  result.timings.largeNMs = Date.now() - started;
  if (analysis) result.largeN = analysis;
}
