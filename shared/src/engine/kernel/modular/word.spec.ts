import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { invMod, isPrimeSmall, mulMod, powMod, primitiveRoot, transformPrimes } from './word.js';
import {
  cyclicConvolution,
  forwardTransform,
  inverseTransformUnscaled,
  transformPlan,
} from './ntt.js';

/** Independent primality test: Miller-Rabin in BigInt with bases 2, 3, 5, 7 (deterministic below 3.2e9; common practice). */
function millerRabin(n: bigint): boolean {
  if (n < 2n) return false;
  for (const p of [2n, 3n, 5n, 7n]) if (n % p === 0n) return n === p;
  let d = n - 1n;
  let s = 0;
  while (d % 2n === 0n) {
    d /= 2n;
    s++;
  }
  const pow = (b: bigint, e: bigint): bigint => {
    let r = 1n;
    b %= n;
    while (e > 0n) {
      if (e & 1n) r = (r * b) % n;
      b = (b * b) % n;
      e >>= 1n;
    }
    return r;
  };
  for (const a of [2n, 3n, 5n, 7n]) {
    let x = pow(a, d);
    if (x === 1n || x === n - 1n) continue;
    let ok = false;
    for (let i = 1; i < s; i++) {
      x = (x * x) % n;
      if (x === n - 1n) {
        ok = true;
        break;
      }
    }
    if (!ok) return false;
  }
  return true;
}

describe('word primes', () => {
  it('agrees with an independent primality test on small numbers', () => {
    for (let n = 0; n < 5000; n++) expect(isPrimeSmall(n)).toBe(millerRabin(BigInt(n)));
  });

  it('finds transform primes c*2^k+1 below the limit that are prime, with roots of exact order 2^k', () => {
    const primes = transformPrimes(30, 15, 2 ** 23);
    expect(new Set(primes.map((x) => x.p)).size).toBe(30);
    for (const { p, k, root } of primes) {
      expect(p).toBeLessThan(2 ** 23);
      expect((p - 1) % 2 ** k).toBe(0);
      expect(millerRabin(BigInt(p))).toBe(true);
      expect(powMod(root, 2 ** k, p)).toBe(1);
      expect(powMod(root, 2 ** (k - 1), p)).toBe(p - 1);
    }
  });

  it('knows the transform prime 7340033 = 7*2^20+1 with primitive root 3 (common practice, from memory)', () => {
    expect(isPrimeSmall(7340033)).toBe(true);
    expect(primitiveRoot(7340033)).toBe(3);
  });

  it('refuses moduli too large for exact float64 products', () => {
    expect(() => powMod(3, 5, 998244353)).toThrow(/2\^26/);
  });

  it('multiplies and inverts exactly against BigInt', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2 ** 23 - 1 }),
        fc.integer({ min: 0, max: 2 ** 23 - 1 }),
        (a, b) => {
          const p = 8257537;
          const x = a % p;
          const y = b % p;
          expect(mulMod(x, y, p)).toBe(Number((BigInt(x) * BigInt(y)) % BigInt(p)));
          if (x !== 0) expect(mulMod(invMod(x, p), x, p)).toBe(1);
        },
      ),
    );
  });
});

describe('number-theoretic transform', () => {
  const prime = transformPrimes(1, 15, 2 ** 23)[0]!;

  it('inverse after forward gives size times the input', () => {
    const size = 64;
    const plan = transformPlan(prime, size);
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: prime.p - 1 }), { minLength: size, maxLength: size }),
        (xs) => {
          const a = Int32Array.from(xs);
          forwardTransform(a, plan);
          inverseTransformUnscaled(a, plan);
          const back = Array.from(a, (v) => mulMod(v, plan.invSize, prime.p));
          expect(back).toEqual(xs);
        },
      ),
    );
  });

  it('gives the same transform with the upper-half-zero shortcut', () => {
    const size = 64;
    const plan = transformPlan(prime, size);
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: prime.p - 1 }), { minLength: 32, maxLength: 32 }),
        (xs) => {
          const a = new Int32Array(size);
          a.set(xs);
          const b = a.slice();
          forwardTransform(a, plan);
          forwardTransform(b, plan, true);
          expect(Array.from(b)).toEqual(Array.from(a));
        },
      ),
    );
  });

  it('computes cyclic convolutions like the schoolbook formula', () => {
    const size = 32;
    const plan = transformPlan(prime, size);
    const p = BigInt(prime.p);
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: prime.p - 1 }), { minLength: size, maxLength: size }),
        fc.array(fc.integer({ min: 0, max: prime.p - 1 }), { minLength: size, maxLength: size }),
        (xs, ys) => {
          const expected = new Array<bigint>(size).fill(0n);
          for (let i = 0; i < size; i++) {
            for (let j = 0; j < size; j++)
              expected[(i + j) % size]! += BigInt(xs[i]!) * BigInt(ys[j]!);
          }
          const got = cyclicConvolution(Int32Array.from(xs), Int32Array.from(ys), plan);
          expect(Array.from(got)).toEqual(expected.map((v) => Number(v % p)));
        },
      ),
    );
  });
});
