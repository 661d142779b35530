/**
 * The one place where coefficient arrays are multiplied. Everything in the engine that multiplies
 * series goes through `mulTrunc`, so a faster kernel can be swapped in here with a one-line change.
 */

/**
 * First `n` coefficients of the product of two integer coefficient arrays (schoolbook, skipping
 * zero coefficients of the shorter factor).
 */
export function mulTrunc(a: readonly bigint[], b: readonly bigint[], n: number): bigint[] {
  if (a.length > b.length) [a, b] = [b, a];
  const len = Math.min(n, a.length + b.length - 1);
  const out: bigint[] = new Array<bigint>(Math.max(0, len)).fill(0n);
  for (let i = 0; i < a.length && i < len; i++) {
    const ai = a[i]!;
    if (ai === 0n) continue;
    const lim = Math.min(b.length, len - i);
    for (let j = 0; j < lim; j++) {
      const bj = b[j]!;
      if (bj !== 0n) out[i + j]! += ai * bj;
    }
  }
  return out;
}
