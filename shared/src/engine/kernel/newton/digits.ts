/**
 * The multi-modular run's state: for each word prime used so far, the mixed-radix (Garner)
 * digit of every wanted coefficient of every Z(N) (common practice; D. E. Knuth, TAOCP vol. 2,
 * 4.3.2), and what can be read off the digits without rebuilding the integers.
 */
import { invMod, type TransformPrime } from '../modular/word.js';

/** Digits of the balanced integers Y_N[j] modulo the primes' product, j in [valuation, upto). */
export interface DigitTable {
  readonly primes: TransformPrime[];
  /** digits[i][N][j]: the i-th mixed-radix digit (null row: Z(N) vanishes below the length) */
  readonly digits: (Int32Array | null)[][];
  /** lower bounds of the valuations of Z(N) */
  readonly valuation: readonly number[];
  /** per N, how many leading coefficients are wanted */
  readonly upto: readonly number[];
  readonly nMax: number;
  readonly length: number;
}

/**
 * Turns the residues of one more prime into its mixed-radix digits in place (Garner's step) and
 * appends them to the table.
 */
export function addPrimeDigits(
  table: DigitTable,
  prime: TransformPrime,
  res: (Int32Array | null)[],
): void {
  const { primes, digits, valuation, upto, nMax } = table;
  const p = prime.p;
  const invRow = primes.map((q) => invMod(q.p, p));
  for (let N = 1; N <= nMax; N++) {
    const row = res[N];
    if (!row) continue;
    for (let t = 0; t < primes.length; t++) {
      const dt = digits[t]![N]!;
      const c = invRow[t]!;
      const cq = c / p;
      for (let j = valuation[N]!; j < upto[N]!; j++) {
        // digits are below 2^24, exact in the float quotient
        const e0 = dt[j]!;
        let d = row[j]! - (e0 - p * Math.floor(e0 / p));
        d += (d >> 31) & p;
        let r = (d * c - p * Math.floor(d * cq)) | 0;
        r += (r >> 31) & p;
        r -= p;
        r += (r >> 31) & p;
        row[j] = r;
      }
    }
  }
  primes.push(prime);
  digits.push(res);
}

/** s such that |Y| <= p_0 ... p_(s-1) from the mixed-radix digits of one coefficient. */
export function significantDigits(table: DigitTable, N: number, j: number): number {
  const { primes, digits } = table;
  const K = primes.length;
  const top = digits[K - 1]![N]![j]!;
  const neg = top === primes[K - 1]!.p - 1;
  if (top !== 0 && !neg) return K;
  let s = K - 1;
  while (s > 0 && digits[s - 1]![N]![j]! === (neg ? primes[s - 1]!.p - 1 : 0)) s--;
  return s;
}

/** log2 of an upper bound of |Y| for one coefficient, read off its mixed-radix digits. */
export function sizeLog2Of(
  table: DigitTable,
  prefixLog2: readonly number[],
  N: number,
  j: number,
): number {
  const { primes, digits } = table;
  const s = significantDigits(table, N, j);
  if (s === primes.length) return prefixLog2[s]!;
  if (s === 0) return 0;
  const top = digits[s - 1]![N]![j]!;
  const neg = digits[primes.length - 1]![N]![j]! !== 0;
  // positive: Y < (top + 1) P_(s-1); negative: |Y| <= (p_(s-1) - top) P_(s-1)
  return prefixLog2[s - 1]! + Math.log2(neg ? primes[s - 1]!.p - top : top + 1);
}
