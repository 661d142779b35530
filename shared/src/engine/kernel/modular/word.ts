/**
 * Machine-word modular arithmetic in float64. Every modulus is below 2^26, so a product of two
 * residues is below 2^52 and exact in a double; the quotient estimate is corrected by one step.
 */
import { primePowers } from '../../integers.js';

/** Largest modulus the float64 helpers accept (products must stay below 2^53). */
export const MAX_WORD_MODULUS = 2 ** 26;

/** a * b mod p for residues 0 <= a, b < p < 2^26 (exact). */
export function mulMod(a: number, b: number, p: number): number {
  const x = a * b;
  let r = x - p * Math.floor(x / p);
  if (r < 0) r += p;
  else if (r >= p) r -= p;
  return r;
}

/** base^exp mod p by repeated squaring (exp a non-negative integer below 2^53). */
export function powMod(base: number, exp: number, p: number): number {
  if (p >= MAX_WORD_MODULUS) throw new RangeError(`modulus ${p} is not below 2^26`);
  let result = 1 % p;
  let b = base % p;
  let e = exp;
  while (e > 0) {
    if (e % 2 === 1) result = mulMod(result, b, p);
    b = mulMod(b, b, p);
    e = Math.floor(e / 2);
  }
  return result;
}

/** Inverse of a modulo the prime p (a not divisible by p). */
export function invMod(a: number, p: number): number {
  const r = ((a % p) + p) % p;
  if (r === 0) throw new RangeError(`no inverse of ${a} modulo ${p}`);
  return powMod(r, p - 2, p);
}

/** True when n (a safe integer) is prime, by trial division (fast for n below 2^26). */
export function isPrimeSmall(n: number): boolean {
  if (!Number.isSafeInteger(n) || n < 2) return false;
  if (n % 2 === 0) return n === 2;
  for (let d = 3; d * d <= n; d += 2) if (n % d === 0) return false;
  return true;
}

/** A prime of the form c * 2^k + 1 suitable for number-theoretic transforms of length 2^k. */
export interface TransformPrime {
  readonly p: number;
  /** the exponent: 2^k divides p - 1 */
  readonly k: number;
  /** a primitive 2^k-th root of unity modulo p */
  readonly root: number;
}

/** Smallest primitive root modulo the prime p. */
export function primitiveRoot(p: number): number {
  const factors = primePowers(p - 1).map(([l]) => l);
  for (let g = 2; g < p; g++) {
    if (factors.every((f) => powMod(g, (p - 1) / f, p) !== 1)) return g;
  }
  throw new RangeError(`no primitive root modulo ${p}`);
}

const primeCache = new Map<string, TransformPrime[]>();

/**
 * `count` distinct primes p = c * 2^j + 1 (j >= k) below `limit`, largest first, each with a
 * primitive 2^k-th root of unity. Deterministic, so runs are reproducible.
 */
export function transformPrimes(count: number, k: number, limit: number): TransformPrime[] {
  const key = `${k}:${limit}`;
  let list = primeCache.get(key);
  if (!list) {
    list = [];
    primeCache.set(key, list);
  }
  const step = 2 ** k;
  let c = list.length === 0 ? Math.floor((limit - 2) / step) : (list.at(-1)!.p - 1) / step - 1;
  while (list.length < count) {
    if (c < 1)
      throw new RangeError(`only ${list.length} transform primes below ${limit} for 2^${k}`);
    const p = c * step + 1;
    if (isPrimeSmall(p)) {
      const g = primitiveRoot(p);
      list.push({ p, k, root: powMod(g, (p - 1) / step, p) });
    }
    c--;
  }
  return list.slice(0, count);
}
