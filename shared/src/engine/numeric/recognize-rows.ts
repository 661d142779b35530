import type { ComputeResult } from '../result.js';
import type { GasSpec } from '../spec/schema.js';
import type { Estimate } from './estimate.js';
import type { Real } from './real.js';
import { recognize } from './recognize.js';
import { twoPrecision } from './weights.js';

/**
 * Closed-form recognition of every canonical row N >= 1 over the spec's basis: the relation is
 * reported only with the acceptance margin of `recognize`; otherwise the row says why not.
 */
export function recognizeRows(
  spec: GasSpec,
  canonical: readonly Estimate[],
  result: ComputeResult,
  q: Real | undefined,
  prec: number,
): void {
  const r = spec.recognize!;
  const names = q === undefined ? [] : [spec.variable];
  const values = q === undefined ? [] : [q];
  const basis = r.basis.map((text, i) => ({
    text,
    value: twoPrecision(text, names, prec, `recognize.basis.${i}`, [])(values).value,
  }));
  for (const row of result.canonical) {
    if (row.N === 0) continue;
    const e = canonical[row.N]!;
    const found = recognize(
      e.value,
      e.error,
      basis,
      r.maxHeight === undefined ? {} : { maxHeight: r.maxHeight },
    );
    if ('none' in found) {
      row.recognized = null;
      row.recognizeNote = found.none;
    } else row.recognized = found;
  }
}
