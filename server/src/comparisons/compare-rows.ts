import Fraction from 'fraction.js';
import {
  add,
  compareSeries,
  evaluateSeries,
  mul,
  Series,
  type ValueJson,
  type Verdict,
} from '@traceloom/shared/engine';

/** A row verdict as the API gives it. */
export interface RowVerdictDto extends Verdict {
  N: number;
}

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
    const z = seriesFromJson(task.canonical[row.N]!);
    const factor = evaluateSeries(task.normalization, options('normalization', row.N));
    const found = evaluateSeries(row.value, options(`line ${row.line}`, row.N));
    return { N: row.N, ...compareSeries(mul(factor, z, cap), found) };
  });
}
