import Fraction from 'fraction.js';
import { EngineError, withField } from '../errors.js';
import { evaluateAt, makeContext, Truncation } from '../expr/evaluate.js';
import { parseExpression } from '../expr/sandbox.js';
import { KSeries, kLog } from '../grand/kseries.js';
import { frac } from '../rational.js';
import { compareSeries, Verdict } from '../series/compare.js';
import { scale } from '../series/arith.js';
import { toValueJson, type ValueJson } from '../series/format.js';
import { Series } from '../series/series.js';
import type { GasSpec } from '../spec/schema.js';

/**
 * A verdict, or "not compared" (`agrees: null`, `determined: false`) when the computed side is
 * not determined at the order: nothing was compared, so nothing agrees.
 */
export type CheckedVerdict =
  Verdict | { agrees: null; agreesBelow: null; firstMismatch: null; determined: false };

/** Verdict for one N (grand and reference checks). */
export type RowVerdict = CheckedVerdict & { N: number };

/**
 * Verdict for one cycle weight implied by a supplied grand function, with the implied Z_L itself
 * (`implied`, shown beside the entered one; absent in results stored before it was added).
 */
export type WeightVerdict = CheckedVerdict & { L: number; implied?: ValueJson };

/** Outcome of the grand check. */
export interface GrandOutcome {
  rows: RowVerdict[];
  impliedWeights: WeightVerdict[];
}

/** The supplied grand function as a series in kappa up to kappa^nMax. */
export function suppliedGrand(
  spec: GasSpec,
  cap: Fraction | null,
  truncations: Truncation[],
): KSeries {
  const g = spec.grand!;
  const opts = { variable: spec.variable, cap, nMax: spec.nMax, truncations };
  if (g.kind === 'coefficients') {
    const coeffs = g.values.slice(0, spec.nMax + 1).map((text, j) => {
      const field = `grand.values.${j}`;
      const v = evaluateAt(parseExpression(text, field), makeContext(opts), field);
      if (!(v instanceof Series))
        throw new EngineError('a coefficient must not contain kappa', field);
      return v;
    });
    return new KSeries(coeffs, spec.nMax);
  }
  const field = 'grand.expression';
  const v = evaluateAt(
    parseExpression(g.expression, field),
    makeContext({ ...opts, allowKappa: true }),
    field,
  );
  return v instanceof KSeries ? v : KSeries.lift(v, spec.nMax);
}

/**
 * Compare a supplied grand function with the computed canonical table (computed
 * against supplied), and the weights implied by its logarithm, Z_L = L s^(L-1) [kappa^L] log Xi,
 * with the entered ones.
 */
export function grandCheck(
  spec: GasSpec,
  canonical: readonly Series[],
  weights: readonly Series[],
  cap: Fraction | null,
  truncations: Truncation[],
): GrandOutcome {
  const xi = suppliedGrand(spec, cap, truncations);
  const count = spec.grand!.kind === 'coefficients' ? xi.coeffs.length : spec.nMax + 1;
  const rows: RowVerdict[] = [];
  for (let N = 0; N < count && N <= spec.nMax; N++) {
    rows.push({ N, ...compareSeries(canonical[N]!, xi.at(N)) });
  }
  const impliedWeights: WeightVerdict[] = [];
  let logXi: KSeries | null = null;
  try {
    logXi = kLog(xi, cap);
  } catch (e) {
    throw withField(e, spec.grand!.kind === 'coefficients' ? 'grand.values' : 'grand.expression');
  }
  const fermion = spec.statistics === 'fermion';
  for (let L = 1; L < count && L <= spec.nMax; L++) {
    const sign = fermion && L % 2 === 0 ? -1 : 1;
    const implied = scale(logXi.at(L), frac(sign * L));
    impliedWeights.push({
      L,
      ...compareSeries(weights[L - 1]!, implied),
      implied: toValueJson(implied),
    });
  }
  return { rows, impliedWeights };
}
