import Fraction from 'fraction.js';
import type { ComputeResult } from '../engine/result.js';
import { rowsText } from '../engine/canonical/order-advice.js';
import { isNumericValue } from './numeric.js';
import { isNumericResult } from './numeric-render.js';

/** "a", "a and b", "a, b and c". */
function listText(items: string[]): string {
  return items.length < 2
    ? (items[0] ?? '')
    : `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`;
}

/**
 * The order a series table is truncated at: the spec's order when any row is truncated, null when
 * every row is exact (or the table is numeric).
 */
export function seriesOrder(r: Pick<ComputeResult, 'spec' | 'canonical'>): string | null {
  const truncated = r.canonical.some((c) => !isNumericValue(c.value) && c.value.order !== null);
  return truncated ? (r.spec.order ?? null) : null;
}

/**
 * One sentence of what is known about a result's values, for dataset headers and exports:
 * exact, a series to O(x^k) (with the rows not determined), or numeric with the requested digits and how errors were estimated.
 */
export function knownSentence(r: Pick<ComputeResult, 'spec' | 'numeric' | 'canonical'>): string {
  if (isNumericResult(r)) {
    const n = r.numeric;
    const digits = n?.precision ?? r.spec.precision;
    const at = Object.entries(r.spec.at ?? {})
      .map(([k, v]) => `${k} = ${v}`)
      .join(', ');
    const how =
      n && n.points.length > 0
        ? `comparing resolutions of the kernel (${listText(n.points.map(String))} points; ${n.rule}) and the rounding of every operation`
        : 'evaluating at two working precisions and the rounding of every operation';
    return `numeric${at ? ` at ${at}` : ''}, ${digits} digits requested, errors estimated by ${how} (an estimate, not a bound)`;
  }
  const cut = seriesOrder(r);
  if (cut === null) return 'exact (every coefficient determined)';
  const x = r.spec.variable;
  const pw = (e: string): string => `${x}^${/^\d+$/.test(e) ? e : `(${e})`}`;
  // the lowest order of any row: a row's order may lie below the spec's (negative exponents)
  const orders = r.canonical.flatMap((c) =>
    !isNumericValue(c.value) && c.value.order !== null ? [c.value.order] : [],
  );
  const low = orders.reduce((a, b) => (new Fraction(b).compare(a) < 0 ? b : a), cut);
  const reach =
    low === cut
      ? `series to O(${pw(cut)}): every coefficient below ${pw(cut)} determined`
      : `series to O(${pw(cut)}), some rows only to O(${pw(low)}): each row says its own order`;
  const open = r.canonical.filter((c) => c.determined === false).map((c) => c.N);
  return open.length > 0
    ? `${reach}; Z(N) for N = ${rowsText(open)} not determined at this order`
    : reach;
}
