import Fraction from 'fraction.js';

/** Exact rational from numerator and denominator. */
export function frac(n: bigint | number, d: bigint | number = 1n): Fraction {
  return new Fraction(BigInt(n), BigInt(d));
}

/** Signed numerator of a fraction. */
export function numer(f: Fraction): bigint {
  return f.s * f.n;
}

/** `n/d` (or `n` when d = 1): the exact rational string of the result format. */
export function fracString(f: Fraction): string {
  return f.toFraction();
}

/** Integer k-th root of a non-negative bigint, or null when it is not a perfect power. */
export function exactRoot(x: bigint, k: number): bigint | null {
  if (x < 0n) return null;
  if (x < 2n) return x;
  const kb = BigInt(k);
  // Newton iteration from an upper bound.
  let r = 1n << BigInt(Math.ceil(x.toString(2).length / k) + 1);
  for (;;) {
    const next = ((kb - 1n) * r + x / r ** (kb - 1n)) / kb;
    if (next >= r) break;
    r = next;
  }
  return r ** kb === x ? r : null;
}
