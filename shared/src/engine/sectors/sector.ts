import Fraction from 'fraction.js';
import type { MathNode } from 'mathjs';
import { classSum } from '../canonical/classes.js';
import { spectrumProduct } from '../canonical/product.js';
import { newtonRecursion } from '../canonical/recursion.js';
import { EngineCancelled, EngineError, withField } from '../errors.js';
import type { Truncation } from '../expr/evaluate.js';
import { Series } from '../series/series.js';
import type { GasSpec } from '../spec/schema.js';
import { cycleWeights, seriesAt } from '../weights.js';

/** Everything one sector n contributes, before it is weighted: Z_n by each route, its class rows. */
export interface SectorPart {
  index: number[];
  /** w(n). */
  weight: Series;
  /** Z_n(0..nMax) by the Newton recursion. */
  canonical: Series[];
  /** Z_n(0..nMax) by the product form (spectrum gases only). */
  product?: Series[];
  /** Lattice points of the spectrum used (spectrum gases only). */
  points?: number;
  /** Class contributions of Z_n(N) for N = 1..classTable, in the class sum's order. */
  classes: { N: number; cycleType: [number, number][]; size: string; sign: 1 | -1; c: Series }[];
  truncations: Truncation[];
  /** The weight is exactly 0: nothing of the sector was computed. */
  zero?: boolean;
}

/** Settings shared by every sector of one computation. */
export interface SectorContext {
  spec: GasSpec;
  cap: Fraction | null;
  weightNode: MathNode;
  tick?: () => void;
  shouldStop?: () => boolean;
}

/** Bindings of the sector indices to the integers of n. */
export function sectorBindings(spec: GasSpec, n: readonly number[]): Record<string, number> {
  const b: Record<string, number> = {};
  spec.sectors!.index.forEach((name, k) => (b[name] = n[k]!));
  return b;
}

/**
 * The order Z_n is needed to: w(n) Z_n is wanted to O(q^order), so Z_n to O(q^(order - val w)),
 * rounded up to the grid of the gas (valuation-aware truncation: far sectors cost little).
 */
function sectorCap(cap: Fraction | null, weight: Series, step: Fraction): Fraction | null {
  if (cap === null) return null;
  const v = weight.valExponent()!;
  const need = cap.sub(v).div(step).ceil().mul(step);
  return need.compare(step) < 0 ? step : need;
}

/**
 * The largest N whose Z_n(N) can have a term below `cap`: with every c_p of valuation >= 0,
 * val Z_n(N) >= the sum of the N least valuations (fermions: N distinct states) or N times the
 * least (bosons); rows beyond are O(q^cap) without being computed. Points left out of a cut
 * lattice lie beyond `cap`, so they cannot lower the bound below it.
 */
function rowsBelow(
  points: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction,
): number {
  const vals = points.map((c) => c.valExponent() ?? cap);
  if (vals.some((v) => v.compare(0) < 0)) return nMax;
  vals.sort((a, b) => a.compare(b));
  let bound = new Fraction(0);
  for (let N = 1; N <= nMax; N++) {
    const v = fermion ? vals[N - 1] : vals[0];
    if (v === undefined) return N - 1;
    bound = bound.add(v);
    if (bound.compare(cap) >= 0) return N - 1;
  }
  return nMax;
}

/** A sector of weight exactly 0: it contributes nothing, and its gas is not computed. */
function zeroPart(spec: GasSpec, n: readonly number[], weight: Series): SectorPart {
  const zero = Series.constant(new Fraction(0));
  const canonical = [Series.constant(new Fraction(1))];
  for (let N = 1; N <= spec.nMax; N++) canonical.push(zero);
  return { index: n.slice(), weight, canonical, classes: [], truncations: [], zero: true };
}

/** Write n as "(n=1, m=-2)" for messages. */
export function sectorLabel(spec: GasSpec, n: readonly number[]): string {
  return spec.sectors!.index.map((name, k) => `${name}=${n[k]}`).join(', ');
}

/**
 * The gas of one sector n: its weights with the indices bound, Z_n(N) by the recursion (and the
 * product form for a spectrum), the class rows up to classTable, and the sector weight w(n).
 * A failing expression is reported with its field and the sector it failed in.
 */
export function sectorPart(ctx: SectorContext, n: readonly number[]): SectorPart {
  const { spec } = ctx;
  const bindings = sectorBindings(spec, n);
  const truncations: Truncation[] = [];
  const fermion = spec.statistics === 'fermion';
  const full = { variable: spec.variable, cap: ctx.cap, nMax: spec.nMax, bindings };
  try {
    const weight = seriesAt(ctx.weightNode, full, 'sectors.weight', truncations);
    if (weight.isZero()) return zeroPart(spec, n, weight);
    const cap = sectorCap(ctx.cap, weight, new Fraction(spec.step));
    const ring = { ...full, cap, ...(ctx.tick && { tick: ctx.tick }) };
    const w = cycleWeights(spec, ring);
    truncations.push(...w.truncations);
    const rows =
      w.spectrum && cap ? rowsBelow(w.spectrum.points, spec.nMax, fermion, cap) : spec.nMax;
    const pad = (table: Series[]): Series[] => {
      for (let N = rows + 1; N <= spec.nMax; N++) table.push(Series.bigO(cap!));
      return table;
    };
    const canonical = pad(
      newtonRecursion(w.weights.slice(0, rows), rows, fermion, cap, undefined, ctx.shouldStop),
    );
    const part: SectorPart = { index: n.slice(), weight, canonical, classes: [], truncations };
    if (w.spectrum) {
      const { points, truncated } = w.spectrum;
      part.product = pad(spectrumProduct(points, rows, fermion, cap, truncated));
      part.points = points.length;
    }
    for (let N = 1; N <= spec.classTable; N++) {
      classSum(N, w.weights, fermion, cap, (row) =>
        part.classes.push({
          N,
          cycleType: row.cycleType,
          size: row.size,
          sign: row.sign,
          c: row.contribution,
        }),
      );
    }
    return part;
  } catch (e) {
    const err = withField(e, 'sectors');
    if (err instanceof EngineCancelled) throw err;
    throw new EngineError(`${err.message} (in the sector ${sectorLabel(spec, n)})`, err.field);
  }
}
