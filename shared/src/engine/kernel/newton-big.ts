/**
 * The Newton recursion in plain BigInt arithmetic (products through mulTrunc), for inputs the
 * multi-modular route does not take. Works on X_N = N! D^N Z(N), which is integral:
 * X_N = sum_L s^(L-1) w_L X_(N-L) D^(L-1) (N-1)!/(N-L)!.
 */
import { gcdBig } from './gcd.js';
import { mulTrunc } from './mul-trunc.js';
import { KernelStopped, type NewtonTableInput, type NewtonTableResult } from './types.js';

/** The BigInt route of newtonTable (same contract). */
export function newtonTableBig(input: NewtonTableInput): NewtonTableResult {
  const { weights, den, nMax, sign, length } = input;
  if (den <= 0n) throw new RangeError('den must be positive');
  const x: bigint[][] = [[1n]];
  const scale: bigint[] = [1n];
  for (let N = 1; N <= nMax; N++) {
    if (input.shouldStop?.()) throw new KernelStopped();
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
    scale.push(scale[N - 1]! * BigInt(N) * den);
    input.onProgress?.(N, nMax);
  }
  const num: bigint[][] = [];
  const dens: bigint[] = [];
  for (let N = 0; N <= nMax; N++) {
    let g = scale[N]!;
    const row = x[N]!.slice(0, length);
    while (row.length < length) row.push(0n);
    for (const c of row) if (c !== 0n && g !== 1n) g = gcdBig(g, c);
    num.push(g === 1n ? row : row.map((c) => c / g));
    dens.push(scale[N]! / g);
  }
  return { num, den: dens, primes: 0, integral: false };
}
