import type { NumericRowVerdictDto, ReferenceRow, RowVerdictDto } from '@traceloom/shared/api';
import Fraction from 'fraction.js';
import {
  compareReferenceRows,
  compute,
  EngineError,
  fromValueJson,
  impliedReferenceWeights,
  type GasSpec,
  type ValueJson,
  type WeightVerdict,
} from '@traceloom/shared/engine';

/** What the worker needs to compare a finished run with a reference table. */
export interface CompareTask {
  /** The run's canonical table: Z(0), Z(1), ... in the result format. */
  canonical: ValueJson[];
  variable: string;
  /** The run's series order (the cap expressions are truncated at), or null for exact. */
  order: string | null;
  normalization: string;
  rows: ReferenceRow[];
  /** The run's cycle weights Z_1, Z_2, ... and statistics, for the Z_L the table implies. */
  weights?: ValueJson[];
  fermion?: boolean;
}

/**
 * The Z_L a table's rows imply (Newton identities, after dividing out the normalization) beside
 * the run's entered Z_L; null when the task carries no weights.
 */
export function impliedWeightsOfRows(task: CompareTask): WeightVerdict[] | null {
  if (!task.weights || task.fermion === undefined) return null;
  try {
    return impliedWeights(task, task.weights, task.fermion);
  } catch (e) {
    // e.g. a normalization that vanishes at some N: the rows then determine no Z(N) there; the
    // row verdicts stand on their own.
    if (e instanceof EngineError) return null;
    throw e;
  }
}

function impliedWeights(task: CompareTask, weights: ValueJson[], fermion: boolean) {
  return impliedReferenceWeights(
    weights.map(fromValueJson),
    task.normalization,
    task.rows.map((row) => ({ N: row.N, value: row.value, field: `line ${row.line}` })),
    {
      variable: task.variable,
      cap: task.order === null ? null : new Fraction(task.order),
      nMax: task.canonical.length - 1,
    },
    fermion,
    'normalization',
  );
}

/**
 * Row-by-row verdicts by the engine's reference check: normalization(N) * Z(N) (computed)
 * against each row's value (supplied), only where both are determined. Errors are EngineErrors
 * whose field names the row's line (`line 4`) or `normalization`.
 */
export function compareSeriesRows(task: CompareTask): RowVerdictDto[] {
  // a row whose Z(N) is not determined at the order is not compared (PRODUCT.md, "Honest rows")
  const undetermined = (N: number): boolean => {
    const v = task.canonical[N];
    return v !== undefined && v.order !== null && v.terms.length === 0;
  };
  const compared = compareReferenceRows(
    task.canonical.map(fromValueJson),
    task.normalization,
    task.rows
      .filter((row) => !undetermined(row.N))
      .map((row) => ({ N: row.N, value: row.value, field: `line ${row.line}` })),
    {
      variable: task.variable,
      cap: task.order === null ? null : new Fraction(task.order),
      nMax: task.canonical.length - 1,
    },
    { normalizationField: 'normalization', withSeries: true },
  );
  let next = 0;
  return task.rows.map((row) =>
    undetermined(row.N)
      ? { N: row.N, agrees: null, agreesBelow: null, firstMismatch: null, determined: false }
      : compared[next++]!,
  );
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
