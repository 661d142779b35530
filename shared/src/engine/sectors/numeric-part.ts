import { EngineError } from '../errors.js';
import type { Truncation } from '../expr/evaluate.js';
import type { ClassRowJson } from '../result.js';
import type { GasSpec } from '../spec/schema.js';
import { GUARD_DIGITS } from '../numeric/compute-numeric.js';
import { mulEstimates, size, type Estimate } from '../numeric/estimate.js';
import { bitsFor, fromInt, type Real } from '../numeric/real.js';
import { classSumNumeric, newtonNumeric, productNumeric, type Pace } from '../numeric/routes.js';
import { fixedVariable, numericWeights, twoPrecision } from '../numeric/weights.js';
import { isBounded, lastShell, sectorBox, shell, type SectorBox } from './enumerate.js';
import { MAX_SECTORS, QUIET_SHELLS, STALL_SHELLS } from './walk.js';

/** What every sector of a numeric sector sum is computed with. */
export interface NumericSectorContext {
  spec: GasSpec;
  digits: number;
  prec: number;
  fermion: boolean;
  /** The variable's fixed value (`at`), when the gas has one. */
  q: Real | undefined;
  weightOf: (values: Real[]) => Estimate;
  truncations: Truncation[];
  pace: Pace;
}

/**
 * One sector's share, already weighted by w(n): plain data (a Real is {m, e}), so a worker thread
 * can compute it and post it back. `terms[N]` = |w(n) Z_n(N)| drives the stopping rule.
 */
export interface NumericSectorPart {
  index: number[];
  weight: Estimate;
  recursion: Estimate[];
  product?: Estimate[];
  points: number;
  classes: { key: string; row: Omit<ClassRowJson, 'contribution'>; c: Estimate }[];
  terms: number[];
  truncations: Truncation[];
}

/** The context of a numeric sector sum (the working precision from the requested digits). */
export function numericSectorContext(spec: GasSpec, pace: Pace = {}): NumericSectorContext {
  const digits = spec.precision!;
  const prec = bitsFor(digits + GUARD_DIGITS);
  const truncations: Truncation[] = [];
  const q = fixedVariable(spec, prec, truncations);
  const names = [...spec.sectors!.index, ...(q === undefined ? [] : [spec.variable])];
  const weightOf = twoPrecision(spec.sectors!.weight, names, prec, 'sectors.weight', truncations);
  const fermion = spec.statistics === 'fermion';
  return { spec, digits, prec, fermion, q, weightOf, truncations, pace };
}

/**
 * Sector n of a numeric sector sum: the gas with the indices bound, Z_n(N) by the Newton recursion,
 * the product form for spectra and the class rows, each times w(n). Pure per sector.
 */
export function numericSectorPart(
  ctx: NumericSectorContext,
  n: readonly number[],
): NumericSectorPart {
  const { spec, prec, fermion, q, pace } = ctx;
  const nMax = spec.nMax;
  const at = n.map(fromInt);
  const w = ctx.weightOf([...at, ...(q === undefined ? [] : [q])]);
  const gas = numericWeights(spec, prec, pace, { names: spec.sectors!.index, values: at });
  const Z = newtonNumeric(gas.weights, nMax, fermion, prec, pace);
  const weighted = (table: readonly Estimate[]): Estimate[] =>
    table.map((z, N) => (N === 0 ? z : mulEstimates(w, z, prec)));
  const part: NumericSectorPart = {
    index: [...n],
    weight: w,
    recursion: weighted(Z),
    points: gas.spectrum?.points.length ?? 0,
    classes: [],
    terms: Z.map((z) => size(w.value) * size(z.value)),
    truncations: gas.truncations,
  };
  if (gas.spectrum)
    part.product = weighted(
      productNumeric(gas.spectrum.points, nMax, fermion, prec, gas.spectrum.tail, pace),
    );
  for (let N = 1; N <= spec.classTable; N++)
    classSumNumeric(
      N,
      gas.weights,
      fermion,
      prec,
      ({ contribution, ...row }) =>
        part.classes.push({
          key: `${N}:${row.cycleType.join(';')}`,
          row,
          c: mulEstimates(w, contribution, prec),
        }),
      pace,
    );
  return part;
}

/**
 * The stopping rule of a numeric sector sum, shell by shell: `next()` gives the next shell's
 * vectors (null when the sum is done), `accept(terms)` records |w(n) Z_n(N)| of each of its
 * sectors. An unbounded sum stops after QUIET_SHELLS shells whose every contribution lies below
 * 10^-(D+2) times the largest contribution of its row so far, with the shell maxima falling; it
 * is refused (field `sectors`) when the maxima stop falling or beyond MAX_SECTORS sectors.
 */
export class NumericSectorWalk {
  readonly box: SectorBox;
  readonly bounded: boolean;
  readonly tol: number;
  /** Per N the largest single contribution seen. */
  readonly scale: number[];
  /** Per shell and N the sum of the contributions. */
  readonly shellSums: number[][] = [];
  count = 0;
  private r = 0;
  private quiet = 0;
  private record = Infinity;
  private since = 0;
  private done = false;

  constructor(private readonly spec: GasSpec) {
    this.box = sectorBox(spec.sectors!);
    this.bounded = isBounded(this.box);
    this.tol = 10 ** -(spec.precision! + 2);
    this.scale = new Array<number>(spec.nMax + 1).fill(0);
  }

  /** The vectors of the next shell, or null when the sum is complete. */
  next(): number[][] | null {
    if (this.done || (this.bounded && this.r > lastShell(this.box))) return null;
    const list = shell(this.box, this.r++);
    if (this.count + list.length > MAX_SECTORS)
      throw new EngineError(
        `the sector sum does not stop within ${MAX_SECTORS} sectors`,
        'sectors',
      );
    return list;
  }

  /** Records the shell just computed (each sector's terms[N]) and decides whether to go on. */
  accept(terms: readonly (readonly number[])[]): void {
    const nMax = this.spec.nMax;
    const here = new Array<number>(nMax + 1).fill(0);
    for (const t of terms) {
      for (let N = 1; N <= nMax; N++) {
        this.scale[N] = Math.max(this.scale[N]!, t[N]!);
        here[N] = here[N]! + t[N]!;
      }
    }
    this.count += terms.length;
    this.shellSums.push(here);
    if (this.bounded) return;
    const peak = Math.max(...here.slice(1));
    const silent = here.every((t, N) => N === 0 || t <= this.tol * this.scale[N]!);
    this.quiet = silent ? this.quiet + 1 : 0;
    if (peak < this.record) {
      this.record = peak;
      this.since = 0;
    } else if (++this.since > STALL_SHELLS)
      throw new EngineError(
        'the sector sum does not converge: the contributions stop falling',
        'sectors',
      );
    if (this.quiet >= QUIET_SHELLS && this.shellSums.length >= 2) this.done = true;
  }

  /** The left-out sectors per row, estimated by extending the last two shells geometrically. */
  tails(): number[] {
    const nMax = this.spec.nMax;
    if (this.bounded || this.shellSums.length < 2) return new Array<number>(nMax + 1).fill(0);
    const last = this.shellSums[this.shellSums.length - 1]!;
    const prev = this.shellSums[this.shellSums.length - 2]!;
    const tails = [0];
    for (let N = 1; N <= nMax; N++) {
      const ratio = Math.min(prev[N]! > 0 ? last[N]! / prev[N]! : 0, 0.9);
      tails.push((last[N]! * ratio) / (1 - ratio) + last[N]!);
    }
    return tails;
  }
}
