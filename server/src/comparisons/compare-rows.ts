import Fraction from 'fraction.js';
import {
  add,
  compareSeries,
  compute,
  EngineError,
  evaluateSeries,
  mul,
  Series,
  toValueJson,
  type GasSpec,
  type RowVerdict,
  type ValueJson,
} from '@traceloom/shared/engine';
import type { NumericVerdict } from '../compute/numeric-values.js';

/**
 * A series row verdict as the API gives it ("not compared" when Z(N) is not determined). A row
 * that differs carries both sides whole, so every differing coefficient can be shown:
 * normalization(N) * Z(N) as computed, and the table's value as supplied.
 */
export type SeriesRowVerdictDto = RowVerdict & {
  series?: { computed: ValueJson; supplied: ValueJson };
};

/** A numeric row verdict: computed and supplied values compared within the combined tolerance. */
export type NumericRowVerdictDto = NumericVerdict & { N: number };

/** A row verdict as the API gives it (series, or numeric with its tolerance). */
export type RowVerdictDto = SeriesRowVerdictDto | NumericRowVerdictDto;

/** A reference row as stored: its file line, N, the value expression and a note. */
export interface ReferenceRow {
  line: number;
  N: number;
  value: string;
  note: string;
}

/** What the worker needs to compare a finished run with a reference table. */
export interface CompareTask {
  /** The run's canonical table: Z(0), Z(1), ... in the result format. */
  canonical: ValueJson[];
  variable: string;
  /** The run's series order (the cap expressions are truncated at), or null for exact. */
  order: string | null;
  normalization: string;
  rows: ReferenceRow[];
}

/** Rebuilds an engine series from its result-format JSON. */
export function seriesFromJson(value: ValueJson): Series {
  let s =
    value.order === null
      ? Series.constant(new Fraction(0))
      : Series.bigO(new Fraction(value.order));
  for (const [exponent, coefficient] of value.terms) {
    s = add(s, Series.monomial(new Fraction(coefficient), new Fraction(exponent)));
  }
  return s;
}

/**
 * Row-by-row verdicts: normalization(N) * Z(N) (expected) against each row's value (found), only
 * where both are determined — the same rule as the engine's reference check. Errors are
 * EngineErrors whose field names the row's line (`line 4`) or `normalization`.
 */
export function compareReferenceRows(task: CompareTask): RowVerdictDto[] {
  const cap = task.order === null ? null : new Fraction(task.order);
  const nMax = task.canonical.length - 1;
  const options = (field: string, N: number) => ({
    variable: task.variable,
    cap,
    nMax,
    bindings: { N },
    field,
  });
  return task.rows.map((row) => {
    const value = task.canonical[row.N]!;
    if (value.order !== null && value.terms.length === 0) {
      // Z(N) is not determined at the order: nothing to compare (PRODUCT.md, "Honest rows")
      const notCompared = { agrees: null, agreesBelow: null, firstMismatch: null } as const;
      return { N: row.N, ...notCompared, determined: false as const };
    }
    const z = seriesFromJson(value);
    const factor = evaluateSeries(task.normalization, options('normalization', row.N));
    const found = evaluateSeries(row.value, options(`line ${row.line}`, row.N));
    const computed = mul(factor, z, cap);
    const verdict = compareSeries(computed, found);
    if (verdict.agrees) return { N: row.N, ...verdict };
    return {
      N: row.N,
      ...verdict,
      series: { computed: toValueJson(computed), supplied: toValueJson(found) },
    };
  });
}

/** What the worker needs to compare a numeric run with a reference table. */
export interface NumericCompareTask {
  /** The run's numeric spec (precision and `at` as it was computed). */
  spec: GasSpec;
  normalization: string;
  rows: ReferenceRow[];
}

/**
 * Numeric verdicts: the run's spec is computed again up to the largest N of the table, with the
 * table as its reference, so the engine's numeric reference check compares normalization(N) *
 * Z(N) with each row within the combined error (a decimal row is known to half a unit of its
 * last printed digit). Errors name the row's line or `normalization`.
 */
export function compareReferenceRowsNumeric(task: NumericCompareTask): NumericRowVerdictDto[] {
  const nMax = Math.max(0, ...task.rows.map((r) => r.N));
  const { grand: _g, recognize: _r, ...rest } = task.spec;
  const spec = {
    ...rest,
    nMax,
    classTable: 0,
    reference: {
      normalization: task.normalization,
      rows: task.rows.map(({ N, value }) => ({ N, value })),
    },
  };
  try {
    return (compute(spec).referenceCheck ?? []) as NumericRowVerdictDto[];
  } catch (e) {
    if (!(e instanceof EngineError)) throw e;
    const row = /^reference\.rows\.(\d+)/.exec(e.field ?? '');
    if (row) throw new EngineError(e.message, `line ${task.rows[Number(row[1])]!.line}`);
    if (e.field === 'reference.normalization') throw new EngineError(e.message, 'normalization');
    throw e;
  }
}
