import Fraction from 'fraction.js';
import type { MathNode } from 'mathjs';
import { EngineError, withField } from './errors.js';
import { evaluateAt, EvalContext, makeContext, Truncation } from './expr/evaluate.js';
import { parseExpression } from './expr/sandbox.js';
import { MAX_SPECTRUM_POINTS, STALL_TERMS } from './limits.js';
import { powerSums } from './series/power-sums.js';
import { coarsen, Series } from './series/series.js';
import type { GasSpec } from './spec/schema.js';

/** The cycle weights Z_1..Z_nMax of a gas, and for a spectrum the lattice values c_p used. */
export interface CycleWeights {
  /** weights[L - 1] = Z_L. */
  weights: Series[];
  /** For a spectrum: c_p at every lattice point used, and whether the lattice was cut off. */
  spectrum?: { points: Series[]; truncated: boolean };
  truncations: Truncation[];
}

/** Shared evaluation settings of one gas. */
export interface GasRing {
  variable: string;
  cap: Fraction | null;
  nMax: number;
  tick?: () => void;
  /** Values every expression of the gas sees (the sector indices in sector mode). */
  bindings?: Readonly<Record<string, number | Fraction>>;
}

function asSeries(v: unknown, field: string): Series {
  if (v instanceof Series) return v;
  throw new EngineError('kappa is only allowed in a grand function', field);
}

/** Evaluate one expression node with index bindings, as a q-series. */
export function seriesAt(
  node: MathNode,
  ring: GasRing,
  field: string,
  truncations: Truncation[],
  bindings: Record<string, number | Fraction> = {},
): Series {
  const all = ring.bindings ? { ...ring.bindings, ...bindings } : bindings;
  const opts = {
    variable: ring.variable,
    cap: ring.cap,
    nMax: ring.nMax,
    bindings: all,
    truncations,
  };
  const ctx: EvalContext = makeContext(ring.tick ? { ...opts, tick: ring.tick } : opts);
  return asSeries(evaluateAt(node, ctx, field), field);
}

/** Z_L for L = 1..nMax from the spec's weight source. */
export function cycleWeights(spec: GasSpec, ring: GasRing): CycleWeights {
  const w = spec.weights;
  const truncations: Truncation[] = [];
  const weights: Series[] = [];
  if (w.kind === 'values') {
    if (w.values.length < ring.nMax) {
      throw new EngineError(
        `lists ${w.values.length} cycle weights but Z_1..Z_${ring.nMax} are needed (nMax = ${ring.nMax})`,
        'weights.values',
      );
    }
    for (let L = 1; L <= ring.nMax; L++) {
      const field = `weights.values.${L - 1}`;
      weights.push(seriesAt(parseExpression(w.values[L - 1]!, field), ring, field, truncations));
    }
    return { weights, truncations };
  }
  const field = 'weights.expression';
  const node = parseExpression(w.expression, field);
  if (w.kind === 'formula') {
    for (let L = 1; L <= ring.nMax; L++) {
      weights.push(seriesAt(node, ring, field, truncations, { L }));
      ring.tick?.();
    }
    return { weights, truncations };
  }
  const { points, truncated } = latticeValues(spec, node, ring, truncations);
  weights.push(...powerSums(withMultiplicity(points), ring.nMax, ring.cap, truncated, ring.tick));
  return { weights, spectrum: { points, truncated }, truncations };
}

/**
 * c_p at p = offset + n (n integer) within [from, to]. An unbounded side is cut off once c_p stays
 * beyond the order for three consecutive points with non-decreasing valuations.
 */
function latticeValues(
  spec: GasSpec,
  node: MathNode,
  ring: GasRing,
  truncations: Truncation[],
): { points: Series[]; truncated: boolean } {
  if (spec.weights.kind !== 'spectrum') throw new EngineError('internal: not a spectrum');
  const { offset, from, to } = spec.weights;
  const off = new Fraction(offset);
  const field = 'weights.expression';
  const lo = from === null ? null : new Fraction(from).sub(off).ceil();
  const hi = to === null ? null : new Fraction(to).sub(off).floor();
  const at = (n: number): Series => {
    try {
      return seriesAt(node, ring, field, truncations, { p: off.add(n) });
    } catch (e) {
      throw withField(e, field);
    }
  };
  const points: Series[] = [];
  if (lo !== null && hi !== null) {
    const a = Number(lo.s * lo.n);
    const b = Number(hi.s * hi.n);
    if (b - a + 1 > MAX_SPECTRUM_POINTS) {
      throw new EngineError(
        `spectrum has more than ${MAX_SPECTRUM_POINTS} lattice points`,
        'weights.to',
      );
    }
    for (let n = a; n <= b; n++) points.push(at(n));
    return { points, truncated: false };
  }
  if (ring.cap === null) {
    throw new EngineError(
      'an unbounded spectrum needs a finite order',
      from === null ? 'weights.from' : 'weights.to',
    );
  }
  const runs: [number, 1 | -1][] = [];
  if (lo !== null) runs.push([Number(lo.s * lo.n), 1]);
  else if (hi !== null) runs.push([Number(hi.s * hi.n), -1]);
  else runs.push([0, 1], [-1, -1]);
  for (const [start, dir] of runs) {
    let quiet = 0;
    let prev: Fraction | null | undefined;
    let best: Fraction | null | undefined;
    let since = 0;
    for (let n = start; ; n += dir) {
      if (points.length > MAX_SPECTRUM_POINTS) {
        throw new EngineError(
          `spectrum needs more than ${MAX_SPECTRUM_POINTS} lattice points`,
          field,
        );
      }
      const c = at(n);
      const v = c.valExponent();
      const beyond = v === null || v.compare(ring.cap) >= 0;
      if (!beyond) points.push(c);
      const rising = prev === undefined || v === null || (prev !== null && v.compare(prev) >= 0);
      quiet = beyond ? (rising ? quiet + 1 : 1) : 0;
      prev = v;
      if (quiet >= 3) break;
      if (best === undefined || (best !== null && (v === null || v.compare(best) > 0))) {
        best = v;
        since = 0;
      } else if (++since > STALL_TERMS) {
        throw new EngineError('spectrum does not converge: valuations of c_p stop growing', field);
      }
      if (n % 64 === 0) ring.tick?.();
    }
  }
  truncations.push({ what: 'spectrum lattice points', terms: points.length });
  return { points, truncated: true };
}

/**
 * Equal lattice values grouped with their multiplicity (symmetric spectra c_p = c_(-p) halve the
 * work), each on its coarsest grid.
 */
function withMultiplicity(points: readonly Series[]): [Series, number][] {
  const groups = new Map<string, [Series, number]>();
  for (const c of points) {
    const key = `${c.step.toFraction()}|${c.start}|${c.den}|${c.order}|${c.num.join(',')}`;
    const g = groups.get(key);
    if (g) g[1]++;
    else groups.set(key, [coarsen(c), 1]);
  }
  return [...groups.values()];
}
