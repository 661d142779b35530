import type { RowVerdict, WeightVerdict } from './checks/grand.js';
import type { ValueJson } from './series/format.js';
import type { GasSpec } from './spec/schema.js';

/** Names of the routes to the canonical table. */
export type Route = 'recursion' | 'classSum' | 'product';

/** One row of the class table in the result format. */
export interface ClassRowJson {
  N: number;
  cycleType: [number, number][];
  size: string;
  sign: 1 | -1;
  contribution: ValueJson;
}

/** One canonical row: Z(N), the routes that ran for it and whether they agree term by term. */
export interface CanonicalRowJson {
  N: number;
  value: ValueJson;
  routes: Route[];
  agrees: boolean;
}

/** The result `traceloom.result/1` (see docs/spec.md). */
export interface ComputeResult {
  format: 'traceloom.result/1';
  spec: GasSpec;
  weights: { L: number; value: ValueJson }[];
  canonical: CanonicalRowJson[];
  classes: ClassRowJson[];
  methods: {
    recursion: { nMax: number };
    classSum?: { nMax: number; agrees: boolean };
    product?: { nMax: number; agrees: boolean; points: number };
  };
  grandCheck?: RowVerdict[];
  impliedWeights?: WeightVerdict[];
  referenceCheck?: RowVerdict[];
  /** Infinite sums, products and lattices cut off at the order, with the terms they used. */
  truncations: { field: string; what: string; terms: number }[];
  timings: {
    totalMs: number;
    weightsMs: number;
    recursionMs: number;
    productMs: number;
    checksMs: number;
    classesMs: number;
  };
}

/** Progress report: a phase and how far it is. */
export interface Progress {
  phase: 'weights' | 'recursion' | 'product' | 'grand' | 'reference' | 'classes';
  done: number;
  total: number;
}

/** Callbacks and switches of `compute`. */
export interface ComputeOptions {
  /** Called at phase changes and at least every ~100 ms of work (throttled to ~50 ms). */
  onProgress?: (p: Progress) => void;
  /** Polled during the work; returning true ends it with EngineCancelled. */
  shouldStop?: () => boolean;
  /** Receives each class-table row as it is produced (streaming). */
  onClass?: (row: ClassRowJson) => void;
  /**
   * Receives each class-table row as its JSON text (parses to what onClass would get); with exact
   * weights and neither onClass nor collectClasses, the rows are written straight from integers.
   */
  onClassText?: (text: string) => void;
  /** Keep class rows in `result.classes` (default: true unless onClass or onClassText is given). */
  collectClasses?: boolean;
}
