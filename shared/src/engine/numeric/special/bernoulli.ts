/**
 * Bernoulli numbers B_2, B_4, ... as exact BigInt fractions, from the tangent numbers T_n
 * (tan x = sum T_n x^(2n-1)/(2n-1)!), which an integer-only O(n^2) recurrence gives:
 * B_2n = (-1)^(n-1) 2n T_n / (4^n (4^n - 1)).
 */

let tangent: bigint[] = [0n]; // tangent[n] = T_n, n >= 1

function tangentNumbers(N: number): bigint[] {
  const T: bigint[] = new Array<bigint>(N + 1).fill(0n);
  T[1] = 1n;
  for (let k = 2; k <= N; k++) T[k] = BigInt(k - 1) * T[k - 1]!;
  for (let k = 2; k <= N; k++) {
    for (let j = k; j <= N; j++) T[j] = BigInt(j - k) * T[j - 1]! + BigInt(j - k + 2) * T[j]!;
  }
  return T;
}

function gcd(a: bigint, b: bigint): bigint {
  if (a < 0n) a = -a;
  while (b !== 0n) [a, b] = [b, a % b];
  return a;
}

/** B_2n = [numerator, denominator] in lowest terms, denominator > 0, for n >= 1 (cached). */
export function bernoulli2n(n: number): [bigint, bigint] {
  if (n < 1 || !Number.isInteger(n))
    throw new RangeError('bernoulli2n: n must be a positive integer');
  if (n >= tangent.length) tangent = tangentNumbers(Math.max(n, 2 * (tangent.length - 1), 16));
  const four = 1n << BigInt(2 * n);
  let num = BigInt(2 * n) * tangent[n]!;
  let den = four * (four - 1n);
  const g = gcd(num, den);
  num /= g;
  den /= g;
  return [n % 2 === 1 ? num : -num, den];
}
