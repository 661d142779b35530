import type { RowVerdict, WeightVerdict } from './checks/grand.js';
import type { OrderAdviceJson } from './canonical/order-advice.js';
import type { ValueJson } from './series/format.js';
import type { GasSpec } from './spec/schema.js';
import type { LargeNJson } from './largen/types.js';
import type { NumericValueJson } from './numeric/estimate.js';
import type { NumericRowVerdict, NumericWeightVerdict } from './numeric/checks.js';

/** A value of the result: an exact or truncated series, or (numeric mode) a number with its error. */
export type AnyValueJson = ValueJson | NumericValueJson;

/** Names of the routes to the canonical table. */
export type Route = 'recursion' | 'classSum' | 'product' | 'fredholm';

/** One row of the class table in the result format. */
export interface ClassRowJson {
  N: number;
  cycleType: [number, number][];
  size: string;
  sign: 1 | -1;
  contribution: AnyValueJson;
}

/** A closed form found for a numeric Z(N) (an integer relation with the basis). */
export interface RecognizedJson {
  expression: string;
  latex: string;
  height: number;
  digitsToSpare: number;
}

/** Numeric-mode additions to a canonical row. */
export interface NumericCanonicalExtras {
  /** Each route's own value and error. */
  routeValues?: Partial<Record<Route, NumericValueJson>>;
  /** The closed form, or null when recognition was asked for and found none. */
  recognized?: RecognizedJson | null;
  /** Why no closed form is shown ("no relation of height <= H at this precision"). */
  recognizeNote?: string;
}

/** The Fermi-gas Airy fit of a numeric table: Z(N) ~ C^(-1/3) e^A Ai[C^(-1/3) (N - B)]. */
export interface AiryFitJson {
  C: { value: number; uncertainty: number };
  B: { value: number; uncertainty: number };
  A: { value: number; uncertainty: number };
  residuals: { N: number; residual: number }[];
  fittedOn: number[];
}

/** One canonical row: Z(N), the routes that ran for it and whether they agree term by term. */
export interface CanonicalRowJson extends NumericCanonicalExtras {
  N: number;
  value: AnyValueJson;
  routes: Route[];
  /** Whether the routes agree term by term; null when the row is not determined (not compared). */
  agrees: boolean | null;
  /**
   * Series rows: false when the value is not determined at the order (every known coefficient is
   * 0: the lowest exponent is at or beyond it); shown as "not determined", never as 0.
   */
  determined?: boolean;
  /** Sector mode: how many sectors contributed to this row (0 for N = 0, set by convention). */
  sectors?: number;
}

/** One sector n of a sector sum: its index vector, weight and the size of its contributions. */
export interface SectorRowJson {
  /** The sector vector n, one integer per index of `spec.sectors.index`. */
  index: number[];
  /** The weight w(n) (series mode: a series; numeric mode: a number with its error). */
  weight: AnyValueJson;
  /**
   * Series mode: valuations[N - 1] for N = 1..nMax is the leading exponent of Z_n(N) (an exact
   * rational string), or null when Z_n(N) has no term below the order it was computed to (the
   * order minus the valuation of w(n): what w(n) Z_n(N) needs). Empty in numeric mode.
   */
  valuations: (string | null)[];
  /**
   * Numeric mode: magnitudes[N - 1] = log10 |w(n) Z_n(N)| (null when it is 0). Empty in series mode.
   */
  magnitudes: (number | null)[];
  /** contributes[N - 1]: whether w(n) Z_n(N) entered row N (a term below the order / error). */
  contributes: boolean[];
  /** Whether the sector entered any row N >= 1. */
  contributed: boolean;
}

/** The sector breakdown of a gas with `sectors` in its spec. */
export interface SectorsJson {
  /** Index names, as in the spec. */
  index: string[];
  /** Sectors computed (the rows below). */
  count: number;
  /** Sectors that entered at least one row. */
  contributing: number;
  /** Whether an unbounded range was cut off by the stopping rule (the rule is in `rule`). */
  truncated: boolean;
  /** How the sum was taken and where it stopped, in words. */
  rule: string;
  /** Z(0) = 1 by convention in sector mode, said in words. */
  convention: string;
  /** Every sector computed, in the order they were enumerated (growing max |n_k|). */
  rows: SectorRowJson[];
}

/** The result `traceloom.result/1` (see docs/spec.md). */
export interface ComputeResult {
  format: 'traceloom.result/1';
  spec: GasSpec;
  weights: { L: number; value: AnyValueJson }[];
  canonical: CanonicalRowJson[];
  classes: ClassRowJson[];
  methods: {
    recursion: { nMax: number };
    classSum?: { nMax: number; agrees: boolean };
    product?: { nMax: number; agrees: boolean; points: number };
    fredholm?: { nMax: number; agrees: boolean; points: number };
  };
  grandCheck?: RowVerdict[] | NumericRowVerdict[];
  impliedWeights?: WeightVerdict[] | NumericWeightVerdict[];
  referenceCheck?: RowVerdict[] | NumericRowVerdict[];
  /** Numeric mode: the requested digits, the working precision and how errors were estimated. */
  numeric?: {
    precision: number;
    workingBits: number;
    errorEstimate: string;
    rule: string;
    points: number[];
    parity: boolean;
  };
  /** Large-N structure: the Airy fit of a numeric table (series tables: see largen/). */
  largeN?: Partial<LargeNJson> & { airy?: AiryFitJson };
  /** Sector mode: the sector breakdown (per sector its valuations and whether it contributed). */
  sectors?: SectorsJson;
  /** Set on a partial result: the phase that did not finish, and why (filled in by the caller). */
  incomplete?: { phase: Progress['phase']; reason: string };
  /** Present when the order is too low for some rows: which, and which order reaches N_max. */
  orderAdvice?: OrderAdviceJson;
  /** Infinite sums, products and lattices cut off at the order, with the terms they used. */
  truncations: { field: string; what: string; terms: number }[];
  timings: {
    totalMs: number;
    weightsMs: number;
    recursionMs: number;
    productMs: number;
    checksMs: number;
    classesMs: number;
    /** The large-N analysis of a series table, when it ran (part of totalMs). */
    largeNMs?: number;
  };
}

/** Progress report: a phase and how far it is. */
export interface Progress {
  phase: 'weights' | 'recursion' | 'product' | 'grand' | 'reference' | 'classSum' | 'sectors';
  /** Work done in this phase, in `unit`s (cycle types of the class table, products of the recursion). */
  done: number;
  total: number;
  /** What done and total count; absent where they count rows N. */
  unit?: string;
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
  /**
   * Receives the result without the class table as soon as the cheap routes and the checks are
   * done (before the class phase), so a caller can keep it if a later phase fails.
   */
  onPartial?: (partial: ComputeResult) => void;
  /** Keep class rows in `result.classes` (default: true unless onClass or onClassText is given). */
  collectClasses?: boolean;
}
