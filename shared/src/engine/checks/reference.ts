import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { Truncation } from '../expr/evaluate.js';
import { parseExpression } from '../expr/sandbox.js';
import { mul } from '../series/arith.js';
import { compareSeries } from '../series/compare.js';
import { Series } from '../series/series.js';
import type { GasSpec } from '../spec/schema.js';
import { seriesAt } from '../weights.js';
import type { RowVerdict } from './grand.js';

/**
 * Row-by-row verdicts against a reference table: the normalization (an expression in N and the
 * variable) times Z(N) is compared with each row's value (expected = computed, found = row).
 */
export function referenceCheck(
  spec: GasSpec,
  canonical: readonly Series[],
  cap: Fraction | null,
  truncations: Truncation[],
): RowVerdict[] {
  const ref = spec.reference!;
  const ring = { variable: spec.variable, cap, nMax: spec.nMax };
  const norm = parseExpression(ref.normalization, 'reference.normalization');
  return ref.rows.map((row, i) => {
    if (row.N > spec.nMax) {
      throw new EngineError(`N = ${row.N} is beyond nMax = ${spec.nMax}`, `reference.rows.${i}.N`);
    }
    const factor = seriesAt(norm, ring, 'reference.normalization', truncations, { N: row.N });
    const field = `reference.rows.${i}.value`;
    const value = seriesAt(parseExpression(row.value, field), ring, field, truncations, {
      N: row.N,
    });
    return { N: row.N, ...compareSeries(mul(factor, canonical[row.N]!), value) };
  });
}
