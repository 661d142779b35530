import type { Series } from '../series/series.js';
import { cutIndex, firstDifference } from './grid.js';

/** The limit of a class: Z(inf) cut at grid index K, and how K was decided. */
export interface Limit {
  /** Null when not even the constant term is determined. */
  value: Series | null;
  K: number;
  note: string;
}

/**
 * Coefficient-wise limit of the rows Y (sorted by N, one grid). A coefficient counts as
 * determined when two consecutive rows agree on it and on every coefficient below it, and no later
 * row that determines it disagrees: the best consecutive pair (longest common prefix, the later
 * pair on ties) gives the candidate, every later row cuts it at its first disagreement.
 */
export function classLimit(N: readonly number[], Y: readonly Series[]): Limit {
  if (Y.length < 2) return { value: null, K: -Infinity, note: 'fewer than two rows' };
  let best = -1;
  let bestK = -Infinity;
  for (let i = 0; i + 1 < Y.length; i++) {
    const d = firstDifference(Y[i]!, Y[i + 1]!);
    if (d.index >= bestK) {
      bestK = d.index;
      best = i;
    }
  }
  let K = bestK;
  const cand = Y[best + 1]!;
  let cutBy: number | null = null;
  for (let j = best + 2; j < Y.length; j++) {
    const d = firstDifference(cand, Y[j]!);
    if (d.differs && d.index < K) {
      K = d.index;
      cutBy = N[j]!;
    }
  }
  const pair = `rows ${N[best]} and ${N[best + 1]}`;
  const note =
    `determined below the first exponent where ${pair} differ` +
    (cutBy === null
      ? ', and no later row that knows a coefficient there disagrees'
      : `, cut where row ${cutBy} disagrees`);
  if (cand.num.length === 0 || K <= Math.min(cand.start, 0)) return { value: null, K, note };
  return { value: cutIndex(cand, K), K, note };
}

/** Where each row stops agreeing with the limit: first difference, or a lower bound. */
export function stabilizationRows(
  Y: readonly Series[],
  limit: Series,
): { index: number; exact: boolean }[] {
  return Y.map((y) => {
    const d = firstDifference(y, limit);
    return { index: d.index, exact: d.differs };
  });
}
