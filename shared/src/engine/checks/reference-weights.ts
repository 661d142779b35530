import { parseExpression } from '../expr/sandbox.js';
import { frac } from '../rational.js';
import { div, mul, scale, sub } from '../series/arith.js';
import { compareSeries } from '../series/compare.js';
import { toValueJson } from '../series/format.js';
import { Series } from '../series/series.js';
import { seriesAt } from '../weights.js';
import type { WeightVerdict } from './grand.js';
import type { ReferenceRing, SuppliedRow } from './reference.js';

/** True when nothing of the value is known (no coefficient below its order). */
function undetermined(v: Series): boolean {
  return v.order !== null && v.num.length === 0;
}

/**
 * The cycle weights implied by a canonical table through the Newton identities,
 * N Z(N) = sum_{L=1..N} s^(L-1) Z_L Z(N-L) (s = -1 fermions, +1 bosons), solved for Z_L:
 * Z_L = s^(L-1) (L Z(L) - sum_{k=1..L-1} s^(k-1) Z_k Z(L-k)), with Z(0) = 1. Entry L-1 is Z_L for
 * L = 1..lMax; it is null where the table does not determine it: Z_L needs every Z(1..L), so a
 * missing row leaves it and every later weight undetermined. Orders are tracked by the series
 * arithmetic (a product is known only as far as both factors are).
 */
export function weightsFromCanonical(
  z: ReadonlyMap<number, Series>,
  fermion: boolean,
  cap: ReferenceRing['cap'],
  lMax: number,
): Array<Series | null> {
  const s = (k: number) => (fermion && k % 2 === 0 ? -1 : 1); // s^(k-1)
  const Z = (n: number) => (n === 0 ? Series.constant(frac(1)) : z.get(n));
  const out: Array<Series | null> = [];
  for (let L = 1; L <= lMax; L++) {
    const zl = Z(L);
    if (!zl || out.some((w) => w === null)) {
      out.push(null);
      continue;
    }
    let acc = scale(zl, frac(L));
    for (let k = 1; k < L; k++) {
      acc = sub(acc, scale(mul(out[k - 1]!, Z(L - k)!, cap), frac(s(k))));
    }
    out.push(scale(acc, frac(s(L))));
  }
  return out;
}

/**
 * The Z_L implied by a reference table's rows beside the entered ones: each row's value divided
 * by the normalization at its N gives Z(N); the Newton identities give Z_L for L = 1..(largest
 * N of the table). An implied weight the rows do not determine (a missing row, or nothing known
 * below the order) is "not compared" and carries no value; a determined one is compared with the
 * entered Z_L where both are known (`implied` is the supplied side).
 */
export function impliedReferenceWeights(
  weights: readonly Series[],
  normalization: string,
  rows: readonly SuppliedRow[],
  ring: ReferenceRing,
  fermion: boolean,
  normalizationField = 'reference.normalization',
): WeightVerdict[] {
  const norm = parseExpression(normalization, normalizationField);
  const z = new Map<number, Series>();
  for (const row of rows) {
    if (row.N === 0) continue; // Z(0) = 1 by convention; the row's own verdict says if it agrees
    const factor = seriesAt(norm, ring, normalizationField, [], { N: row.N });
    const value = seriesAt(parseExpression(row.value, row.field), ring, row.field, [], {
      N: row.N,
    });
    z.set(row.N, div(value, factor, ring.cap));
  }
  const lMax = Math.min(Math.max(0, ...rows.map((r) => r.N)), weights.length);
  return weightsFromCanonical(z, fermion, ring.cap, lMax).map((implied, i) => {
    const L = i + 1;
    if (implied === null || undetermined(implied) || undetermined(weights[i]!)) {
      return { L, agrees: null, agreesBelow: null, firstMismatch: null, determined: false };
    }
    return { L, ...compareSeries(weights[i]!, implied), implied: toValueJson(implied) };
  });
}
