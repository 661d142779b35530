import Fraction from 'fraction.js';
import type { CheckedVerdict } from '../checks/grand.js';
import type { ComputeResult } from '../result.js';
import type { Series } from '../series/series.js';
import { isDetermined, lowestExponentBounds, orderAdvice } from './order-advice.js';

const NOT_COMPARED = {
  agrees: null,
  agreesBelow: null,
  firstMismatch: null,
  determined: false,
} as const satisfies CheckedVerdict;

/**
 * Honest rows of a series result (PRODUCT.md, "Honest rows"): a canonical row whose value is not
 * determined at the order carries `determined: false` and `agrees: null`; a grand or reference
 * check on it, and an implied-weight check on a weight that is not determined, is "not compared";
 * when some row is not determined, `orderAdvice` says which order would reach N_max.
 */
export function markHonestRows(
  result: ComputeResult,
  Z: readonly Series[],
  weights: readonly Series[],
  spectrum?: { points: readonly Series[]; truncated: boolean },
): void {
  const known = Z.map(isDetermined);
  result.canonical = result.canonical.map((row) =>
    known[row.N] ? { ...row, determined: true } : { ...row, agrees: null, determined: false },
  );
  const rows = <T extends { N: number }>(list: T[] | undefined): T[] | undefined =>
    list?.map((v) => (known[v.N] === false ? { ...v, ...NOT_COMPARED } : v));
  if (result.grandCheck) result.grandCheck = rows(result.grandCheck as { N: number }[]) as never;
  if (result.referenceCheck) {
    result.referenceCheck = rows(result.referenceCheck as { N: number }[]) as never;
  }
  if (result.impliedWeights) {
    result.impliedWeights = (result.impliedWeights as { L: number }[]).map((v) =>
      weights[v.L - 1] && !isDetermined(weights[v.L - 1]!) ? { ...v, ...NOT_COMPARED } : v,
    ) as never;
  }
  const spec = result.spec;
  const cap = spec.order == null ? null : new Fraction(spec.order);
  const advice = orderAdvice({
    Z,
    bounds: lowestExponentBounds(weights, spec.nMax, spec.statistics === 'fermion', spectrum, cap),
    nMax: spec.nMax,
    order: cap,
    step: new Fraction(spec.step ?? '1'),
    variable: spec.variable,
  });
  if (advice) result.orderAdvice = advice;
}
