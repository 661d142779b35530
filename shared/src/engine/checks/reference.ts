import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { Truncation } from '../expr/evaluate.js';
import { parseExpression } from '../expr/sandbox.js';
import { mul } from '../series/arith.js';
import { compareSeries } from '../series/compare.js';
import { toValueJson, type ValueJson } from '../series/format.js';
import { Series } from '../series/series.js';
import type { GasSpec } from '../spec/schema.js';
import { seriesAt } from '../weights.js';
import type { RowVerdict } from './grand.js';

/** A supplied row of a reference table: N, its value (an expression) and the field it came from. */
export interface SuppliedRow {
  N: number;
  value: string;
  /** Where an error in this row's value is reported (`reference.rows.3.value`, `line 4`). */
  field: string;
}

/** The ring the supplied values are read in: variable, order cap and nMax. */
export interface ReferenceRing {
  variable: string;
  cap: Fraction | null;
  nMax: number;
}

/** Switches of `compareReferenceRows`. */
export interface CompareRowsOptions {
  /** Collects the infinite sums and products cut off at the order. */
  truncations?: Truncation[];
  /** Where an error in the normalization is reported (default `reference.normalization`). */
  normalizationField?: string;
  /** A row that differs carries both sides whole (`series`), to show every difference. */
  withSeries?: boolean;
}

/** A reference verdict; with `withSeries`, a differing row carries both sides whole. */
export type ReferenceRowVerdict = RowVerdict & {
  series?: { computed: ValueJson; supplied: ValueJson };
};

/**
 * Row-by-row verdicts against supplied rows: normalization(N) * Z(N) (the computed side) is
 * compared with each row's value (the supplied side) where both are determined. The one
 * implementation of the reference check, used by `compute` and by stored comparisons.
 */
export function compareReferenceRows(
  canonical: readonly Series[],
  normalization: string,
  rows: readonly SuppliedRow[],
  ring: ReferenceRing,
  options: CompareRowsOptions = {},
): ReferenceRowVerdict[] {
  const truncations = options.truncations ?? [];
  const normalizationField = options.normalizationField ?? 'reference.normalization';
  const norm = parseExpression(normalization, normalizationField);
  return rows.map((row) => {
    const z = canonical[row.N];
    if (z === undefined) {
      throw new EngineError(`N = ${row.N} is beyond N_max = ${canonical.length - 1}`, row.field);
    }
    const factor = seriesAt(norm, ring, normalizationField, truncations, { N: row.N });
    const value = seriesAt(parseExpression(row.value, row.field), ring, row.field, truncations, {
      N: row.N,
    });
    const computed = mul(factor, z, ring.cap);
    const verdict = compareSeries(computed, value);
    if (verdict.agrees || !options.withSeries) return { N: row.N, ...verdict };
    return {
      N: row.N,
      ...verdict,
      series: { computed: toValueJson(computed), supplied: toValueJson(value) },
    };
  });
}

/** The spec's own reference check (`spec.reference`) against the computed canonical table. */
export function referenceCheck(
  spec: GasSpec,
  canonical: readonly Series[],
  cap: Fraction | null,
  truncations: Truncation[],
): RowVerdict[] {
  const ref = spec.reference!;
  ref.rows.forEach((row, i) => {
    if (row.N > spec.nMax) {
      throw new EngineError(`N = ${row.N} is beyond N_max = ${spec.nMax}`, `reference.rows.${i}.N`);
    }
  });
  const rows = ref.rows.map((r, i) => ({
    N: r.N,
    value: r.value,
    field: `reference.rows.${i}.value`,
  }));
  return compareReferenceRows(
    canonical,
    ref.normalization,
    rows,
    { variable: spec.variable, cap, nMax: spec.nMax },
    { truncations },
  );
}
