/** Shared shapes of the numeric kernels. */

/** Input of the canonical-table kernels: integer weight numerators on a grid from exponent 0. */
export interface NewtonTableInput {
  /** weights[L-1][i] = numerator of the coefficient of t^i in Z_L (t = q^step), L = 1..nMax */
  readonly weights: readonly (readonly bigint[])[];
  /** the common denominator of all weights (> 0) */
  readonly den: bigint;
  readonly nMax: number;
  /** +1 bosons, -1 fermions */
  readonly sign: 1 | -1;
  /** number of grid points below the order: coefficients t^0..t^(length-1) are computed */
  readonly length: number;
  /**
   * optional, per N (index N = 0..nMax, non-increasing): only coefficients below validLengths[N]
   * of Z(N) are wanted; the rest of the row comes back as zeros
   */
  readonly validLengths?: readonly number[];
  /**
   * optional, per N (index N = 0..nMax): a proven upper bound of log2 max |coefficient of Z(N)|
   * below the length, known to the caller (the product form's majorant for a spectrum); the
   * multi-modular run stops at the smaller of it and its own majorant
   */
  readonly log2Bounds?: readonly number[];
  /** called as work proceeds */
  readonly onProgress?: (done: number, total: number) => void;
  /** polled between steps; true stops the run with EngineCancelled */
  readonly shouldStop?: () => boolean;
}

/** Z(N) = num[N][i] / den[N] at t^i, for N = 0..nMax (den[N] the reduced common denominator). */
export interface NewtonTableResult {
  readonly num: bigint[][];
  readonly den: bigint[];
  /** number of word primes used (0 on the BigInt route) */
  readonly primes: number;
  /** true when the weights were certified to give integer Z(N) */
  readonly integral: boolean;
}
