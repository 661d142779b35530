import type Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { mul } from '../series/arith.js';
import type { Series } from '../series/series.js';
import type { GasSpec } from '../spec/schema.js';
import { boxSize, isBounded, lastShell, sectorBox, shell, type SectorBox } from './enumerate.js';
import type { SectorPart } from './sector.js';

/** Said in every sector result: the sum over sectors does not converge at N = 0. */
export const ZERO_CONVENTION =
  'Z(0) = 1 by convention: every sector gives Z_n(0) = 1 and their sum does not converge, so the ' +
  'sum over sectors is taken for N >= 1 only.';

/** Most sectors one computation may use. */
export const MAX_SECTORS = 20000;
/** Consecutive shells without any term below the order after which an unbounded sum stops. */
export const QUIET_SHELLS = 2;
/** Shells without a new record least valuation after which an unbounded sum is divergent. */
export const STALL_SHELLS = 12;

/** A computed sector with its weighted contributions w(n) Z_n(N), N = 0..nMax (index 0 unused). */
export interface WeightedSector {
  part: SectorPart;
  terms: Series[];
}

/** Whether a series has a term below its order (or is a non-zero exact series). */
export function hasTerms(s: Series): boolean {
  return s.num.length > 0;
}

/**
 * The walk over the sectors of a gas, shell by shell (growing max_k |n_k - centre_k|): a bounded
 * box is walked whole; an unbounded one stops once QUIET_SHELLS shells in a row have no
 * contribution below the order, after the least valuations of the contributing shells stopped
 * falling; it is refused as divergent when no new record valuation comes for STALL_SHELLS shells.
 */
export class SectorWalk {
  readonly box: SectorBox;
  readonly bounded: boolean;
  readonly sectors: WeightedSector[] = [];
  private r = 0;
  private quiet = 0;
  private seen = false;
  private record: Fraction | null = null;
  private since = 0;
  private minima: Fraction[] = [];
  private finished = false;

  constructor(
    private readonly spec: GasSpec,
    private readonly cap: Fraction | null,
  ) {
    this.box = sectorBox(spec.sectors!);
    this.bounded = isBounded(this.box);
    if (this.bounded && boxSize(this.box) > MAX_SECTORS)
      throw new EngineError(`hold more than ${MAX_SECTORS} sectors`, 'sectors');
    if (!this.bounded && cap === null)
      throw new EngineError('an unbounded sector range needs a finite order', 'sectors');
  }

  /** The sectors of the next shell, or null when the walk is over. */
  next(): number[][] | null {
    if (this.finished) return null;
    if (this.bounded && this.r > lastShell(this.box)) return null;
    const list = shell(this.box, this.r);
    if (this.sectors.length + list.length > MAX_SECTORS)
      throw new EngineError(
        `the sector sum does not stop within ${MAX_SECTORS} sectors: contributions w(n) Z_n(N) stay below the order`,
        'sectors',
      );
    return list;
  }

  /** Record the computed sectors of the shell `next` gave, and decide whether to go on. */
  accept(parts: SectorPart[]): void {
    let least: Fraction | null = null;
    for (const part of parts) {
      const terms = part.canonical.map((z, N) => (N === 0 ? z : mul(part.weight, z, this.cap)));
      this.sectors.push({ part, terms });
      for (let N = 1; N <= this.spec.nMax; N++) {
        const t = terms[N]!;
        if (!hasTerms(t)) continue;
        const v = t.valExponent()!;
        if (least === null || v.compare(least) < 0) least = v;
      }
    }
    this.r++;
    if (this.bounded) return;
    // a shell of weights exactly 0 (e.g. w(n) = (1 + (-1)^n)/2 on odd n) says nothing either way
    if (parts.length > 0 && parts.every((p) => p.zero)) {
      this.checkStarted();
      return;
    }
    if (least === null) {
      this.quiet++;
    } else {
      this.quiet = 0;
      this.seen = true;
      this.minima.push(least);
    }
    if (this.record === null || (least !== null && least.compare(this.record) > 0)) {
      if (least !== null) this.record = least;
      this.since = 0;
    } else this.since++;
    const m = this.minima;
    const rising = m.length < 2 || m[m.length - 1]!.compare(m[m.length - 2]!) >= 0;
    if (this.seen && rising && this.quiet >= QUIET_SHELLS) {
      this.finished = true;
      return;
    }
    this.checkStarted();
    if (this.since > STALL_SHELLS)
      throw new EngineError(
        'the sector sum does not converge: the valuations of w(n) Z_n(N) stop growing',
        'sectors',
      );
  }

  /** Refuse a sum of which no sector contributed within the first STALL_SHELLS shells. */
  private checkStarted(): void {
    if (!this.seen && this.r > STALL_SHELLS)
      throw new EngineError(
        `no sector within max |n| <= ${this.r - 1} contributes below the order; bound the ranges or raise the order`,
        'sectors',
      );
  }

  /**
   * The walk a sequence of computed shells makes (e.g. shells computed elsewhere, in worker
   * threads): each shell is accepted in order, so the stopping decisions are the same.
   */
  static replay(spec: GasSpec, cap: Fraction | null, shells: SectorPart[][]): SectorWalk {
    const walk = new SectorWalk(spec, cap);
    for (const parts of shells) {
      if (walk.next() === null) break;
      walk.accept(parts);
    }
    return walk;
  }

  /** Sectors the walk will visit when the box is bounded; 0 (not known in advance) otherwise. */
  get total(): number {
    return this.bounded ? boxSize(this.box) : 0;
  }

  /** Shells walked so far. */
  get shells(): number {
    return this.r;
  }
}
