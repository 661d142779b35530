/**
 * JSON text of class-table rows, written directly (a class table of S_1..S_40 has 215,307 rows).
 * Every string in a row is a number or a rational, so nothing needs escaping. The text parses to
 * the same ClassRowJson that compute's `onClass` receives.
 */
import type { CycleTypeVisit } from '../kernel/index.js';
import type { ClassRowJson } from '../result.js';

/** JSON text of one class row in the result format. */
export function classRowJsonText(r: ClassRowJson): string {
  const ct = r.cycleType.map(([L, m]) => `[${L},${m}]`).join(',');
  const v = r.contribution;
  if (!('terms' in v)) return JSON.stringify(r);
  const terms = v.terms.map(([e, c]) => `["${e}","${c}"]`).join(',');
  const order = v.order === null ? 'null' : `"${v.order}"`;
  return `{"N":${r.N},"cycleType":[${ct}],"size":"${r.size}","sign":${r.sign},"contribution":{"order":${order},"terms":[${terms}]}}`;
}

/** The constant pieces of an exact row's text, by sign. */
const AFTER_SIZE = {
  [1]: '","sign":1,"contribution":{"order":null,"terms":[',
  [-1]: '","sign":-1,"contribution":{"order":null,"terms":[',
} as const;
const rowStarts: string[] = [];

/**
 * The same text for an exact rational contribution num/den (reduced, den > 0) straight from a
 * walk's visit and its cycle type's JSON pairs ("[1,2],[3,1]"), without building the row object;
 * the constant pieces are joined once, so a row is nine strings put together.
 */
export function exactClassRowText(
  visit: CycleTypeVisit,
  sign: 1 | -1,
  num: bigint,
  den: bigint,
  pairs: string,
): string {
  const n = visit.n;
  const start = (rowStarts[n] ??= `{"N":${n},"cycleType":[`);
  const head = start + pairs + '],"size":"' + visit.size + AFTER_SIZE[sign];
  if (num === 0n) return head + ']}}';
  if (den === 1n) return head + '["0","' + num + '"]]}}';
  return head + '["0","' + num + '/' + den + '"]]}}';
}
