/** Greatest common divisor of BigInts (non-negative result), with a float fast path below 2^53. */
export function gcdBig(a: bigint, b: bigint): bigint {
  if (a < 0n) a = -a;
  if (b < 0n) b = -b;
  while (b !== 0n) {
    if (a < 0x20000000000000n && b < 0x20000000000000n) {
      let x = Number(a);
      let y = Number(b);
      while (y !== 0) [x, y] = [y, x % y];
      return BigInt(x);
    }
    [a, b] = [b, a % b];
  }
  return a;
}
