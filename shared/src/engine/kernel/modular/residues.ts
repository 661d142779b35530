/**
 * BigInt coefficients reduced modulo word primes (the way back, Garner's mixed-radix
 * reconstruction, lives with its only user in newton/assemble.ts).
 */
import { mulMod } from './word.js';

const SAFE = BigInt(Number.MAX_SAFE_INTEGER);

/** x mod p as a number in [0, p), for any BigInt x. */
export function bigResidue(x: bigint, p: number, pBig: bigint = BigInt(p)): number {
  if (x <= SAFE && x >= -SAFE) {
    const f = Number(x);
    return f - p * Math.floor(f / p);
  }
  const r = Number(x % pBig);
  return r < 0 ? r + p : r;
}

/** Residues of a coefficient array modulo p, written into an Int32Array of length `size`. */
export function residueArray(
  values: readonly bigint[],
  p: number,
  size: number,
  scale = 1,
): Int32Array {
  const out = new Int32Array(size);
  const pBig = BigInt(p);
  const lim = Math.min(values.length, size);
  for (let i = 0; i < lim; i++) {
    const v = values[i]!;
    if (v === 0n) continue;
    const r = bigResidue(v, p, pBig);
    out[i] = scale === 1 ? r : mulMod(r, scale, p);
  }
  return out;
}
