/** The exact table from the mixed-radix digits: balanced integers, then reduced rows. */
import { reduceRow } from '../../integers.js';
import { significantDigits, type DigitTable } from './digits.js';
import type { NewtonTableResult } from './types.js';

/** The balanced integer |Y| <= P/2 whose mixed-radix digits are at (N, j). */
function balancedValue(
  table: DigitTable,
  P: readonly bigint[],
  prefix: readonly bigint[],
  halfDigit: readonly number[],
  N: number,
  j: number,
): bigint {
  const { primes, digits } = table;
  const K = primes.length;
  let neg = false;
  for (let i = K - 1; i >= 0; i--) {
    const d = digits[i]![N]![j]!;
    if (d !== halfDigit[i]) {
      neg = d > halfDigit[i]!;
      break;
    }
  }
  const s = significantDigits(table, N, j);
  let low: bigint;
  if (s <= 2) {
    // two digits below 2^24 each: exact in a double
    const d0 = s > 0 ? digits[0]![N]![j]! : 0;
    const d1 = s > 1 ? digits[1]![N]![j]! : 0;
    low = BigInt(d0 + primes[0]!.p * d1);
  } else {
    low = BigInt(digits[s - 1]![N]![j]!);
    for (let i = s - 2; i >= 0; i--) low = low * P[i]! + BigInt(digits[i]![N]![j]!);
  }
  return neg ? low - prefix[s]! : low;
}

/** Z(N) = num[N] / den[N] with Y_N = scale[N] Z(N) rebuilt from the digit table. */
export function assembleTable(
  table: DigitTable,
  scale: readonly bigint[],
  integral: boolean,
): NewtonTableResult {
  const { primes, digits, valuation, upto, nMax, length } = table;
  const P = primes.map((pr) => BigInt(pr.p));
  const prefix = [1n];
  for (const p of P) prefix.push(prefix.at(-1)! * p);
  const halfDigit = primes.map((pr) => (pr.p - 1) / 2);
  const num: bigint[][] = [[1n, ...new Array<bigint>(length - 1).fill(0n)]];
  const den: bigint[] = [1n];
  for (let N = 1; N <= nMax; N++) {
    const row = new Array<bigint>(length).fill(0n);
    if (digits[0]![N]) {
      for (let j = valuation[N]!; j < upto[N]!; j++)
        row[j] = balancedValue(table, P, prefix, halfDigit, N, j);
    }
    const r = reduceRow(row, scale[N]!);
    num.push(r.num);
    den.push(r.den);
  }
  return { num, den, primes: primes.length, integral };
}
