import { coarsen, stepGcd, Series } from '../series/series.js';

/** Exclusive upper end of the known range, as a grid index (Infinity when exact). */
export const knownEnd = (s: Series): number => s.order ?? Infinity;

/** All series on one common grid (the coarsest that holds every one of them). */
export function onCommonGrid(list: readonly Series[]): Series[] {
  if (list.length === 0) return [];
  const coarse = list.map(coarsen);
  let g = coarse[0]!.step;
  for (const s of coarse) g = stepGcd(g, s.step);
  return coarse.map((s) => s.onStep(g));
}

/** Coefficient at grid index i as numerator over s.den (0n outside the stored range). */
const numAt = (s: Series, i: number): bigint => {
  const k = i - s.start;
  return k >= 0 && k < s.num.length ? s.num[k]! : 0n;
};

/**
 * First grid index below both known ranges (and >= `from`) where a and b differ, on one grid;
 * `{ index: end, differs: false }` when they agree on all of it (end may be Infinity).
 */
export function firstDifference(
  a: Series,
  b: Series,
  from = -Infinity,
): { index: number; differs: boolean } {
  const end = Math.min(knownEnd(a), knownEnd(b));
  const lo = Math.max(from, Math.min(a.num.length ? a.start : end, b.num.length ? b.start : end));
  const hi = Math.min(end, Math.max(a.start + a.num.length, b.start + b.num.length));
  for (let i = lo; i < hi; i++) {
    if (numAt(a, i) * b.den !== numAt(b, i) * a.den) return { index: i, differs: true };
  }
  return { index: end, differs: false };
}

/** s truncated at grid index k (k may be Infinity: unchanged). */
export function cutIndex(s: Series, k: number): Series {
  if (k === Infinity || (s.order !== null && s.order <= k)) return s;
  return Series.of(s.step, s.start, [...s.num], s.den, k);
}
