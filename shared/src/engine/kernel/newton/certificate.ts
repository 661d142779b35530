/**
 * When the multi-modular run may stop, rigorously either way:
 *  - a priori: the primes' product exceeds twice the majorant bound (coefficient-bound.ts, or
 *    the caller's smaller proven bound `log2Bounds`);
 *  - a posteriori: with Y_N the balanced candidates, the integer residual
 *    R_N = sum_L s^(L-1) c_{N,L} w_L Y_(N-L) - N Y_N vanishes modulo every prime used, and a
 *    bound on |R_N| computed from the candidates' sizes is below the product, so R_N = 0 and by
 *    induction on N every candidate is exact.
 * Y_N = d_N Z(N) with d_N = 1 for certified integral weights and d_N = N! D^N otherwise (then
 * c_{N,L} = N!/(N-L)! D^(L-1)).
 */
import { logAbs, newtonCoefficientLog2Bounds } from './coefficient-bound.js';
import { sizeLog2Of, type DigitTable } from './digits.js';
import type { NewtonTableInput } from './types.js';

/** What the stopping rules need to know about the weights and the scaling d_N. */
export interface CertificateBasis {
  /** log2 of the modulus that makes the a priori rule fire */
  readonly aprioriBits: number;
  /** log2 of the l1 norms of the weight numerators w_L */
  readonly normLog2: readonly number[];
  /** below this the residual rule cannot fire yet (the modulus must exceed every |w_L|) */
  readonly minResidualBits: number;
  readonly integral: boolean;
  readonly log2Den: number;
  /** log2 d_N */
  readonly scaleLog2: (N: number) => number;
}

function log2Factorial(n: number): number {
  let s = 0;
  for (let i = 2; i <= n; i++) s += Math.log2(i);
  return s;
}

/** log2(2^a + 2^b) without overflow. */
function log2Add(a: number, b: number): number {
  if (a === -Infinity) return b;
  if (b === -Infinity) return a;
  const m = Math.max(a, b);
  return m + Math.log2(2 ** (a - m) + 2 ** (b - m));
}

/** The sizes both stopping rules compare the modulus with. */
export function certificateBasis(input: NewtonTableInput, integral: boolean): CertificateBasis {
  const { weights, den, nMax, length } = input;
  const log2Den = den === 1n ? 0 : logAbs(den) / Math.LN2;
  const scaleLog2 = (N: number): number => (integral ? 0 : log2Factorial(N) + N * log2Den);
  const majorant = newtonCoefficientLog2Bounds(weights, den, nMax, length);
  let aprioriBits = 2;
  for (let N = 1; N <= nMax; N++) {
    const bound = Math.min(majorant[N]!, input.log2Bounds?.[N] ?? Infinity);
    if (bound !== -Infinity) aprioriBits = Math.max(aprioriBits, bound + scaleLog2(N) + 2);
  }
  const normLog2 = weights.slice(0, nMax).map((w) => {
    let s = -Infinity;
    for (let i = 0; i < Math.min(w.length, length); i++)
      if (w[i] !== 0n) s = log2Add(s, logAbs(w[i]!) / Math.LN2);
    return s;
  });
  const minResidualBits = Math.max(...normLog2) + 2;
  return { aprioriBits, normLog2, minResidualBits, integral, log2Den, scaleLog2 };
}

/** log2 of a bound of max_j |Y_N[j]| per N, or null once one reaches the modulus. */
function candidateSizes(table: DigitTable, log2Modulus: number): number[] | null {
  const { primes, digits, valuation, upto, nMax } = table;
  const prefix = [0];
  for (const pr of primes) prefix.push(prefix.at(-1)! + Math.log2(pr.p));
  const sizeLog2 = [0];
  for (let N = 1; N <= nMax; N++) {
    let m = -Infinity;
    if (digits[0]![N]) {
      for (let j = valuation[N]!; j < upto[N]!; j++) {
        m = Math.max(m, sizeLog2Of(table, prefix, N, j));
        if (m + 1 >= log2Modulus) return null;
      }
    }
    sizeLog2.push(m);
  }
  return sizeLog2;
}

/** True when the residual rule proves every candidate Y_N exact at this modulus. */
export function residualCertified(
  table: DigitTable,
  basis: CertificateBasis,
  log2Modulus: number,
): boolean {
  if (table.primes.length < 2 || log2Modulus < basis.minResidualBits) return false;
  const sizeLog2 = candidateSizes(table, log2Modulus);
  if (sizeLog2 === null) return false;
  const { integral, scaleLog2, log2Den, normLog2 } = basis;
  for (let N = 1; N <= table.nMax; N++) {
    let r = sizeLog2[N]! + Math.log2(N);
    for (let L = 1; L <= N; L++) {
      const c = integral ? 0 : scaleLog2(N) - scaleLog2(N - L) - log2Den;
      r = log2Add(r, c + normLog2[L - 1]! + sizeLog2[N - L]!);
    }
    // margin for the float arithmetic in these logarithms
    if (r + 1 + 1e-6 * r >= log2Modulus) return false;
  }
  return true;
}
