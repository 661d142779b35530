import { lcm } from '../integers.js';
import { frac } from '../rational.js';
import { Series, stepGcd } from './series.js';

/**
 * The sum of many series in one pass: the same value, order and grid as folding `add` over them
 * (order = the least order, grid = the common grid of the terms), but one integer accumulator on
 * the common grid instead of a new series per addition. An empty list is the exact zero.
 */
export function sumSeries(terms: readonly Series[]): Series {
  const list = terms.filter((t) => !t.isZero());
  if (list.length === 0) return Series.constant(frac(0));
  if (list.length === 1) return list[0]!;
  let step = list[0]!.step;
  let den = 1n;
  for (const t of list) {
    step = stepGcd(step, t.step);
    den = lcm(den, t.den);
  }
  const ratio = (t: Series): number => Number(t.step.div(step).n);
  let order: number | null = null;
  let lo = Infinity;
  let hi = -Infinity;
  for (const t of list) {
    const r = ratio(t);
    if (t.order !== null) order = order === null ? t.order * r : Math.min(order, t.order * r);
    if (t.num.length > 0) {
      lo = Math.min(lo, t.start * r);
      hi = Math.max(hi, (t.start + t.num.length - 1) * r + 1);
    }
  }
  if (order !== null) hi = Math.min(hi, order);
  if (lo === Infinity || hi <= lo) return Series.of(step, 0, [], 1n, order);
  const acc = new Array<bigint>(hi - lo).fill(0n);
  for (const t of list) {
    const r = ratio(t);
    const f = den / t.den;
    const base = t.start * r - lo;
    const n = t.num;
    for (let i = 0; i < n.length; i++) {
      const k = base + i * r;
      if (k >= acc.length) break;
      const c = n[i]!;
      if (c !== 0n) acc[k]! += f === 1n ? c : c * f;
    }
  }
  return Series.of(step, lo, acc, den, order);
}
