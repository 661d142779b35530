import fc from 'fast-check';
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { newtonIsIntegral } from './integrality.js';
import { newtonTableBig } from './big.js';
import { newtonTable, newtonTableModular } from './table.js';
import { EngineCancelled } from '../../errors.js';
import type { NewtonTableInput, NewtonTableResult } from './types.js';

/**
 * Reference: the recursion N Z(N) = sum_L s^(L-1) Z_L Z(N-L) with fraction.js (a general-purpose
 * exact rational library, used only as a reference) on truncated series.
 */
function referenceTable(input: NewtonTableInput): Fraction[][] {
  const { weights, den, nMax, sign, length } = input;
  const w = weights.map((row) => Array.from({ length }, (_, i) => new Fraction(row[i] ?? 0n, den)));
  const z: Fraction[][] = [Array.from({ length }, (_, i) => new Fraction(i === 0 ? 1 : 0))];
  for (let N = 1; N <= nMax; N++) {
    const acc = Array.from({ length }, () => new Fraction(0));
    for (let L = 1; L <= N; L++) {
      const s = sign === -1 && L % 2 === 0 ? -1 : 1;
      for (let i = 0; i < length; i++) {
        if (w[L - 1]![i]!.equals(0)) continue;
        for (let j = 0; i + j < length; j++)
          acc[i + j] = acc[i + j]!.add(w[L - 1]![i]!.mul(z[N - L]![j]!).mul(s));
      }
    }
    z.push(acc.map((x) => x.div(N)));
  }
  return z;
}

function asFractions(r: NewtonTableResult): Fraction[][] {
  return r.num.map((row, N) => row.map((c) => new Fraction(c, r.den[N]!)));
}

function expectSame(r: NewtonTableResult, ref: Fraction[][]): void {
  const got = asFractions(r);
  for (let N = 0; N < ref.length; N++) {
    expect(got[N]!.map((x) => x.toFraction())).toEqual(ref[N]!.map((x) => x.toFraction()));
  }
}

const tables = fc.record({
  nMax: fc.integer({ min: 2, max: 7 }),
  length: fc.integer({ min: 8, max: 14 }),
  sign: fc.constantFrom<1 | -1>(1, -1),
  den: fc.oneof(fc.constant(1n), fc.bigInt({ min: 2n, max: 30n })),
  seed: fc.array(fc.array(fc.bigInt({ min: -9n, max: 9n }), { minLength: 14, maxLength: 14 }), {
    minLength: 7,
    maxLength: 7,
  }),
});

describe('newtonTable (multi-modular) against the plain rational recursion', () => {
  it('agrees on random integer and rational weights, both statistics', () => {
    fc.assert(
      fc.property(tables, ({ nMax, length, sign, den, seed }) => {
        const input = { weights: seed.map((r) => r.slice(0, length)), den, nMax, sign, length };
        const ref = referenceTable(input);
        expectSame(newtonTableModular(input), ref);
        expectSame(newtonTableBig(input), ref);
      }),
      { numRuns: 40 },
    );
  });

  it('agrees on huge coefficients (beyond 2^200)', () => {
    const big = 2n ** 200n + 12345n;
    const weights = [
      [0n, big, -big, 3n, 0n, 0n, 0n, 0n],
      [1n, 0n, big * big, 0n, -7n, 0n, 0n, 0n],
      [0n, 0n, 0n, -big, 0n, 0n, 0n, 1n],
    ];
    const input = { weights, den: 3n, nMax: 3, sign: -1 as const, length: 8 };
    expectSame(newtonTableModular(input), referenceTable(input));
  });

  it('Z_L = x for every L: fermions give C(x, N), bosons x(x+1)...(x+N-1)/N! (A&S 24.1.3, Table 24.3)', () => {
    // x = 7, fermions: 1, 7, 21, 35, 35, 21, 7, 1, 0 (SOURCES.md, OEIS A132393 via Stirling numbers)
    const length = 8;
    const weights = Array.from({ length: 8 }, () => [7n, 0n, 0n, 0n, 0n, 0n, 0n, 0n]);
    const f = newtonTable({ weights, den: 1n, nMax: 8, sign: -1, length });
    expect(f.num.map((r, N) => new Fraction(r[0]!, f.den[N]!).toFraction())).toEqual([
      '1',
      '7',
      '21',
      '35',
      '35',
      '21',
      '7',
      '1',
      '0',
    ]);
    // bosons with x = 7: C(x + N - 1, N) = 1, 7, 28, 84, 210, 462, 924, 1716, 3003 (binomials, A&S 24.1.1)
    const b = newtonTable({ weights, den: 1n, nMax: 8, sign: 1, length });
    expect(b.num.map((r, N) => new Fraction(r[0]!, b.den[N]!).toFraction())).toEqual([
      '1',
      '7',
      '28',
      '84',
      '210',
      '462',
      '924',
      '1716',
      '3003',
    ]);
  });
});

/** 1/(q;q)_N coefficients below `length`, by multiplying the geometric series 1/(1-q^k) (DLMF 17.2). */
function inversePochhammer(N: number, length: number): bigint[] {
  const c = new Array<bigint>(length).fill(0n);
  c[0] = 1n;
  for (let k = 1; k <= N; k++) for (let i = k; i < length; i++) c[i]! += c[i - k]!;
  return c;
}

describe('harmonic trap: Z_L = q^(L/2)/(1-q^L)', () => {
  // in t = q^(1/2): Z_L = t^L / (1 - t^(2L)); fermions Z(N) = t^(N^2) / (t^2; t^2)_N and bosons
  // Z(N) = t^N / (t^2; t^2)_N (Euler; G. E. Andrews, The Theory of Partitions (1976), Cor. 2.2;
  // DLMF 17.5), compared with the product computed independently above
  const length = 400;
  const nMax = 16;
  const weights = Array.from({ length: nMax }, (_, i) => {
    const L = i + 1;
    const w = new Array<bigint>(length).fill(0n);
    for (let e = L; e < length; e += 2 * L) w[e] = 1n;
    return w;
  });
  const expected = (N: number, shift: number): bigint[] => {
    const inv = inversePochhammer(N, length);
    const out = new Array<bigint>(length).fill(0n);
    for (let i = 0; i * 2 + shift < length; i++) out[i * 2 + shift] = inv[i]!;
    return out;
  };

  it('fermions: q^(N^2/2)/(q;q)_N, certified integral, on the multi-modular route', () => {
    const r = newtonTable({ weights, den: 1n, nMax, sign: -1, length });
    expect(r.integral).toBe(true);
    expect(r.primes).toBeGreaterThan(0);
    for (let N = 0; N <= nMax; N++) {
      expect(r.den[N]).toBe(1n);
      expect(r.num[N]).toEqual(expected(N, N * N));
    }
  });

  it('a caller bound (here the exact sizes) needs no more primes and changes no digit', () => {
    const plain = newtonTable({ weights, den: 1n, nMax, sign: -1, length });
    const log2Bounds = [0];
    for (let N = 1; N <= nMax; N++) {
      const top = expected(N, N * N).reduce((m, x) => (x > m ? x : m), 0n);
      log2Bounds.push(top === 0n ? -Infinity : Math.log2(Number(top)));
    }
    const r = newtonTable({ weights, den: 1n, nMax, sign: -1, length, log2Bounds });
    expect(r.primes).toBeLessThanOrEqual(plain.primes);
    expect(r.primes).toBeGreaterThan(0);
    for (let N = 0; N <= nMax; N++) expect(r.num[N]).toEqual(expected(N, N * N));
  });

  it('bosons: q^(N/2)/(q;q)_N', () => {
    const r = newtonTable({ weights, den: 1n, nMax, sign: 1, length });
    for (let N = 0; N <= nMax; N++) expect(r.num[N]).toEqual(expected(N, N));
  });

  it('levels 1, 2, 3, ...: sum over N of the fermion Z(N) counts distinct partitions (OEIS A000009)', () => {
    const len = 21;
    const w = Array.from({ length: 20 }, (_, i) => {
      const L = i + 1;
      return Array.from({ length: len }, (_, e) => (e > 0 && e % L === 0 ? 1n : 0n));
    });
    const r = newtonTable({ weights: w, den: 1n, nMax: 20, sign: -1, length: len });
    const total = Array.from({ length: len }, (_, e) => r.num.reduce((s, row) => s + row[e]!, 0n));
    expect(total.map(Number)).toEqual([
      1, 1, 1, 2, 2, 3, 4, 5, 6, 8, 10, 12, 15, 18, 22, 27, 32, 38, 46, 54, 64,
    ]);
  });
});

describe('integrality certificate and run control', () => {
  it('accepts power sums of integer series and rejects Z_1 = 1, Z_2 = 0 (then Z(2) = 1/2)', () => {
    // spectrum c = {t, 2t^2, -t^3}: Z_L = sum c^L has integer Z(N) = e_N (common practice)
    const length = 12;
    const spectrum = [
      [0n, 1n],
      [0n, 0n, 2n],
      [0n, 0n, 0n, -1n],
    ];
    const power = (c: bigint[], L: number): bigint[] => {
      let out = [1n];
      for (let k = 0; k < L; k++) {
        const next = new Array<bigint>(length).fill(0n);
        out.forEach((x, i) =>
          c.forEach((y, j) => {
            if (i + j < length) next[i + j]! += x * y;
          }),
        );
        out = next;
      }
      return out;
    };
    const weights = Array.from({ length: 6 }, (_, i) =>
      spectrum.map((c) => power(c, i + 1)).reduce((s, p) => s.map((x, e) => x + p[e]!)),
    );
    expect(newtonIsIntegral(weights, 6, -1, length)).toBe(true);
    expect(newtonIsIntegral(weights, 6, 1, length)).toBe(true);
    expect(newtonIsIntegral([[1n], [0n]], 2, 1, 1)).toBe(false);
    const r = newtonTableModular({ weights: [[1n], [0n]], den: 1n, nMax: 2, sign: 1, length: 1 });
    expect([r.num[2]![0], r.den[2]]).toEqual([1n, 2n]);
  });

  it('reports progress and stops when asked', () => {
    const weights = [
      [1n, 1n, 1n, 1n, 1n, 1n, 1n, 1n],
      [2n, 0n, 0n, 0n, 0n, 0n, 0n, 0n],
    ];
    const seen: number[] = [];
    const input: NewtonTableInput = { weights, den: 1n, nMax: 2, sign: -1, length: 8 };
    newtonTableModular({ ...input, onProgress: (d) => seen.push(d) });
    expect(seen.length).toBeGreaterThan(0);
    expect(() => newtonTableModular({ ...input, shouldStop: () => true })).toThrow(EngineCancelled);
    expect(() => newtonTableBig({ ...input, shouldStop: () => true })).toThrow(EngineCancelled);
  });
});
