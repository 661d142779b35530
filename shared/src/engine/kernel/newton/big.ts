/**
 * The Newton recursion in plain BigInt arithmetic (products through mulTrunc), for inputs the
 * multi-modular route does not take. Works on X_N = N! D^N Z(N), which is integral:
 * X_N = sum_L s^(L-1) w_L X_(N-L) D^(L-1) (N-1)!/(N-L)!.
 */
import { EngineCancelled } from '../../errors.js';
import { factorial, reduceRowScaled } from '../../integers.js';
import { mulTrunc } from '../multiply/mul-trunc.js';
import type { NewtonTableInput, NewtonTableResult } from './types.js';

/** The BigInt route of newtonTable (same contract). */
export function newtonTableBig(input: NewtonTableInput): NewtonTableResult {
  const { weights, den, nMax, sign, length } = input;
  if (den <= 0n) throw new RangeError('den must be positive');
  const x: bigint[][] = [[1n]];
  for (let N = 1; N <= nMax; N++) {
    if (input.shouldStop?.()) throw new EngineCancelled();
    const acc = new Array<bigint>(length).fill(0n);
    let falling = 1n; // (N-1)!/(N-L)!
    let denPow = 1n; // D^(L-1)
    for (let L = 1; L <= N; L++) {
      if (L > 1) {
        falling *= BigInt(N - L + 1);
        denPow *= den;
      }
      const w = weights[L - 1] ?? [];
      const prod = mulTrunc(w, x[N - L]!, length);
      let f = falling * denPow;
      if (sign === -1 && L % 2 === 0) f = -f;
      for (let i = 0; i < prod.length; i++) if (prod[i] !== 0n) acc[i]! += f * prod[i]!;
    }
    x.push(acc);
    input.onProgress?.(N, nMax);
  }
  const num: bigint[][] = [];
  const dens: bigint[] = [];
  for (let N = 0; N <= nMax; N++) {
    const row = x[N]!.slice(0, length);
    while (row.length < length) row.push(0n);
    // over N! D^N: the common factor with D^N one gcd with D at a time (no gcd of huge numbers)
    const r = reduceRowScaled(row, den, N, factorial(N));
    num.push(r.num);
    dens.push(r.den);
  }
  return { num, den: dens, primes: 0, integral: false };
}
