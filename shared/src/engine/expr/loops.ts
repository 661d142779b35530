import { EngineError } from '../errors.js';
import { MAX_TERMS, STALL_TERMS } from '../limits.js';
import { frac } from '../rational.js';
import { KSeries } from '../grand/kseries.js';
import { cutAt, Series } from '../series/series.js';
import type { EvalContext } from './evaluate.js';
import { Value, vAdd, vMul, vSub, vValuation } from './values.js';

type Kind = 'sum' | 'prod';
/** Consecutive terms beyond the order, with non-decreasing valuations, that end an infinite run. */
const QUIET_RUN = 3;

const identity = (kind: Kind): Value => Series.constant(frac(kind === 'sum' ? 0 : 1));

/** sum or product of at(k) for k = from..to (finite). */
export function runFinite(
  kind: Kind,
  at: (k: number) => Value,
  from: number,
  to: number,
  ctx: EvalContext,
): Value {
  if (to - from + 1 > MAX_TERMS) throw new EngineError(`${kind}: more than ${MAX_TERMS} terms`);
  let acc = identity(kind);
  for (let k = from; k <= to; k++) {
    if ((k - from) % 64 === 63) ctx.tick?.();
    const t = at(k);
    acc = kind === 'sum' ? vAdd(acc, t, ctx) : vMul(acc, t, ctx);
  }
  return acc;
}

/**
 * An unbounded sum or product, cut off once the terms (sum) or factors minus 1 (prod) stay beyond
 * the order for a few consecutive indices with non-decreasing valuations. A run whose valuations
 * stop reaching new highs is an error, never a hang. Records how many terms were used.
 */
export function runInfinite(
  kind: Kind,
  at: (k: number) => Value,
  from: number | null,
  to: number | null,
  ctx: EvalContext,
  what: string,
): Value {
  const cap = ctx.cap;
  if (cap === null) throw new EngineError(`${what} to inf needs a finite order`);
  const runs: [number, 1 | -1][] =
    from !== null
      ? [[from, 1]]
      : to !== null
        ? [[to, -1]]
        : [
            [0, 1],
            [-1, -1],
          ];
  let acc = identity(kind);
  let used = 0;
  for (const [start, dir] of runs) {
    let quiet = 0;
    let prev: ReturnType<typeof vValuation> | undefined;
    let best: ReturnType<typeof vValuation> | undefined;
    let sinceRecord = 0;
    for (let k = start, steps = 0; ; k += dir, steps++) {
      if (steps >= MAX_TERMS) throw new EngineError(`${what}: more than ${MAX_TERMS} terms`);
      if (steps % 64 === 63) ctx.tick?.();
      const t = at(k);
      const v = vValuation(kind === 'sum' ? t : vSub(t, identity('prod'), ctx));
      const beyond = v === null || v.compare(cap) >= 0;
      if (!beyond) {
        acc = kind === 'sum' ? vAdd(acc, t, ctx) : vMul(acc, t, ctx);
        used++;
      }
      const rising =
        prev === undefined || prev === null
          ? prev === undefined || v === null
          : v === null || v.compare(prev) >= 0;
      quiet = beyond && rising ? quiet + 1 : beyond ? 1 : 0;
      prev = v;
      if (quiet >= QUIET_RUN) break;
      if (best === undefined || (best !== null && (v === null || v.compare(best) > 0))) {
        best = v;
        sinceRecord = 0;
      } else if (++sinceRecord > STALL_TERMS) {
        throw new EngineError(`${what} does not converge: term valuations stop growing`);
      }
    }
  }
  ctx.truncations.push({ what, terms: used });
  // the omitted terms lie at or beyond the order: the result is known only below it
  if (acc instanceof Series) return cutAt(acc, cap);
  const padded = Array.from({ length: acc.nMax + 1 }, (_, j) => cutAt(acc.at(j), cap));
  return new KSeries(padded, acc.nMax);
}
