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
  const { spec, cap } = ctx;
  const bindings = sectorBindings(spec, n);
  const truncations: Truncation[] = [];
  const ring = {
    variable: spec.variable,
    cap,
    nMax: spec.nMax,
    bindings,
    ...(ctx.tick && { tick: ctx.tick }),
  };
  const fermion = spec.statistics === 'fermion';
  try {
    const weight = seriesAt(ctx.weightNode, ring, 'sectors.weight', truncations);
    const w = cycleWeights(spec, ring);
    truncations.push(...w.truncations);
    const canonical = newtonRecursion(
      w.weights,
      spec.nMax,
      fermion,
      cap,
      undefined,
      ctx.shouldStop,
    );
    const part: SectorPart = { index: n.slice(), weight, canonical, classes: [], truncations };
    if (w.spectrum) {
      part.product = spectrumProduct(
        w.spectrum.points,
        spec.nMax,
        fermion,
        cap,
        w.spectrum.truncated,
      );
      part.points = w.spectrum.points.length;
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
