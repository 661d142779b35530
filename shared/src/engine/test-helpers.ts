// Helpers shared by the engine's spec files (not exported from the package).
import Fraction from 'fraction.js';
import { evaluateSeries } from './expr/evaluate.js';
import type { AnyValueJson } from './result.js';
import type { ValueJson } from './series/format.js';
import { Series } from './series/series.js';

/** A value of a series-mode result as a series value (fails the test on a numeric value). */
export function seriesOf(v: AnyValueJson): ValueJson {
  if (!('terms' in v)) throw new Error(`expected a series value, got ${JSON.stringify(v)}`);
  return v;
}

/** Evaluate an expression in q at order `order` (null = exact). */
export function ser(text: string, order: string | number | null = null, bindings = {}): Series {
  return evaluateSeries(text, {
    variable: 'q',
    cap: order === null ? null : new Fraction(order),
    bindings,
  });
}

/** Coefficients of q^0..q^(n-1) of a series on an integer grid, as numbers. */
export function coeffs(s: Series, n: number): number[] {
  const out: number[] = [];
  for (let e = 0; e < n; e++) {
    const idx = new Fraction(e).div(s.step);
    const c = idx.d === 1n ? s.coeffAt(Number(idx.s * idx.n)) : new Fraction(0);
    if (c === undefined) throw new Error(`coefficient of q^${e} not determined`);
    out.push(c.valueOf());
  }
  return out;
}

/** Minimal gas spec with overrides. */
export function gas(over: Record<string, unknown>): Record<string, unknown> {
  return {
    format: 'traceloom.gas/1',
    statistics: 'fermion',
    variable: 'q',
    step: '1',
    order: '20',
    nMax: 4,
    classTable: 0,
    ...over,
  };
}
