/**
 * The engine's integer primitives, one copy each: greatest common divisors (BigInt and number),
 * factorials, factorisation of small integers, and dividing a row of numerators over a common
 * denominator by their common factor. Everything else in shared/ imports them from here.
 */

/** 2^53: below it a BigInt gcd can finish in float arithmetic. */
const FLOAT_SAFE = 0x20000000000000n;

/** Greatest common divisor of BigInts (non-negative result), with a float fast path below 2^53. */
export function gcd(a: bigint, b: bigint): bigint {
  if (a < 0n) a = -a;
  if (b < 0n) b = -b;
  while (b !== 0n) {
    if (a < FLOAT_SAFE && b < FLOAT_SAFE) return BigInt(gcdInt(Number(a), Number(b)));
    [a, b] = [b, a % b];
  }
  return a;
}

/** Greatest common divisor of safe integers (non-negative result). */
export function gcdInt(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

/** Least common multiple of two positive BigInts. */
export function lcm(a: bigint, b: bigint): bigint {
  return (a / gcd(a, b)) * b;
}

/** n! as a BigInt. */
export function factorial(n: number): bigint {
  let r = 1n;
  for (let i = 2; i <= n; i++) r *= BigInt(i);
  return r;
}

/**
 * The factorisation of a positive safe integer by trial division: [prime l, l^e] for every prime
 * power l^e exactly dividing n, primes ascending (n = 1 gives []).
 */
export function primePowers(n: number): [number, number][] {
  const out: [number, number][] = [];
  let m = n;
  for (let d = 2; d * d <= m; d++) {
    if (m % d !== 0) continue;
    let power = 1;
    while (m % d === 0) {
      m /= d;
      power *= d;
    }
    out.push([d, power]);
  }
  if (m > 1) out.push([m, m]);
  return out;
}

/**
 * Numerators over a common positive denominator, with the common factor of the denominator and
 * every non-zero numerator divided out (zeros are kept). Returns the input row itself when the
 * fraction was already reduced.
 */
export function reduceRow(num: bigint[], den: bigint): { num: bigint[]; den: bigint } {
  let g = den;
  for (let i = 0; i < num.length && g !== 1n; i++) {
    const c = num[i]!;
    if (c !== 0n && c % g !== 0n) g = gcd(g, c);
  }
  if (g === 1n) return { num, den };
  return { num: num.map((c) => (c === 0n ? 0n : c / g)), den: den / g };
}

/**
 * reduceRow for a denominator extra * base^count (base, extra > 0) without a gcd of two huge
 * numbers: the common factor with base^count comes out one gcd with `base` at a time (at most
 * `count` rounds, each dividing by gcd(base, every numerator)), then the one with `extra`. For a
 * prime l, round i removes min(v_l(base), what is left of the row's v_l), so the rounds together
 * remove min(v_l(row), count v_l(base)): the same reduced row as reduceRow.
 */
export function reduceRowScaled(
  num: bigint[],
  base: bigint,
  count: number,
  extra: bigint,
): { num: bigint[]; den: bigint } {
  let row = num;
  let g = 1n;
  const common = (m: bigint): bigint => {
    let h = m;
    for (let i = 0; i < row.length && h !== 1n; i++) {
      const c = row[i]!;
      if (c !== 0n) h = gcd(h, c % h);
    }
    return h;
  };
  const divide = (h: bigint): void => {
    row = row.map((c) => (c === 0n ? 0n : c / h));
    g *= h;
  };
  for (let i = 0; i < count; i++) {
    const h = common(base);
    if (h === 1n) break;
    divide(h);
  }
  const h = common(extra);
  if (h !== 1n) divide(h);
  return { num: row, den: (extra * base ** BigInt(count)) / g };
}
