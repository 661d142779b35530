import type { ValueJson } from '../series/format.js';

/** A formula in N fitted on some rows and checked on the others (exact rationals throughout). */
export interface FitJson {
  /** The formula in the expression language, e.g. `N + 1` or `N^2/2`. */
  expression: string;
  /** Rows the formula was solved from. */
  fittedOn: number[];
  /** Rows that agree with it and were not used to find it (empty: not verified). */
  verifiedOn: number[];
}

/** One product exponent: prod (1 - q^n)^(-a) with n an exponent on the refined grid. */
export interface ProductExponentJson {
  n: string;
  a: string;
}

/** Product form prod_{n>=1} (1 - q^n)^(-a_n) of a series with constant term 1. */
export interface ProductFormJson {
  exponents: ProductExponentJson[];
  /** Exponent grid of n (e.g. "1", "1/2"). */
  step: string;
  /** Every a_n with n below this exponent is determined (null: all, an exact finite product). */
  determinedBelow: string | null;
  /** A pattern that holds on every determined n (periodic or polynomial in n), or null. */
  pattern: string | null;
  /** Plain sentence about the pattern, or why there is none. */
  patternNote: string;
}

/** Stabilization of one row: below which exponent the normalized Z(N) agrees with Z(inf). */
export interface StabilizationRowJson {
  N: number;
  /** First exponent where they differ; null when no difference is visible in the known range. */
  agreesBelow: string | null;
  /** When agreesBelow is null: they agree at least below this exponent. */
  atLeast?: string;
}

/** The leading terms of Z(N)/Z(inf) - 1 for one row. */
export interface CorrectionRowJson {
  N: number;
  value: ValueJson;
}

/** Correction order m: the m-th term of Z(N)/Z(inf) - 1 as exponent and coefficient in N. */
export interface CorrectionFitJson {
  m: number;
  status: 'found' | 'none';
  /** Linear in N, e.g. `N + 1`; null when not found. */
  exponent: string | null;
  /** Polynomial in N, e.g. `-1`; null when not found. */
  coefficient: string | null;
  fittedOn: number[];
  verifiedOn: number[];
  note?: string;
}

/** How each row was normalized. */
export interface NormalizationJson {
  source: 'fitted' | 'given';
  /** Leading exponent of Z(N) as a formula in N with its fit (fitted normalizations only). */
  leadingExponent?: FitJson;
  /** Leading coefficients divided out, when not all 1. */
  leadingCoefficients?: { N: number; c: string }[];
}

/** Everything the table says about N -> inf for one parity class of rows. */
export interface LargeNClassJson {
  parity: 'even' | 'odd' | 'all';
  /** Rows N of this class that took part (determined, non-zero, N >= 1). */
  rows: number[];
  /** The factor each Z(N) is multiplied by, an expression in N and the variable. */
  normalization: string;
  normalizationDetail: NormalizationJson;
  /** Z(inf) to the order it is determined; null when no coefficient is. */
  limit: ValueJson | null;
  /** How the limit order was decided. */
  limitNote: string;
  productExponents: ProductExponentJson[];
  product: ProductFormJson | null;
  stabilization: StabilizationRowJson[];
  /** Linear fit of agreesBelow in N verified on every row, or null. */
  stabilizationFit: string | null;
  stabilizationDetail: FitJson | null;
  stabilizationNote: string;
  correctionTerms: CorrectionRowJson[];
  corrections: CorrectionFitJson[];
}

/** The `largeN` block of the result. */
export interface LargeNJson {
  variable: string;
  classes: LargeNClassJson[];
  notes: string[];
}

/** The product form of one series asked for on request: f = c q^v prod (1 - q^n)^(-a_n). */
export interface SeriesProductJson {
  /** What the series is, e.g. `Z(3)` or `Z_2`. */
  of: string;
  /** v, the exponent of the leading term divided out. */
  leadingExponent: string;
  /** c, the leading coefficient divided out. */
  leadingCoefficient: string;
  product: ProductFormJson;
}

/** The grand function as prod_{N>=1} prod_n (1 - kappa^N q^n)^(-a_(N,n)). */
export interface GrandProductJson {
  of: 'Xi';
  /** c_N(q) = sum_n a_(N,n) q^n for N = 1..nMax, each to its known order. */
  factors: { N: number; value: ValueJson }[];
  /** `c_N = 0 for N > K` when every later c_N vanishes on the known range, else null. */
  pattern: string | null;
  patternNote: string;
}
