import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { frac } from '../rational.js';
import { Series } from '../series/series.js';
import { productLog2Bounds } from './product-bound.js';

/**
 * Z(N) numerators on the grid below `len` by plain polynomial arithmetic: the coefficients of
 * kappa^N in prod (1 + kappa c) or prod 1/(1 - kappa c) = prod sum_k kappa^k c^k (common practice,
 * independent of the engine's product form). All points share the denominator `den`.
 */
function bruteForce(points: bigint[][], nMax: number, fermion: boolean, len: number): bigint[][] {
  const mul = (a: bigint[], b: bigint[]): bigint[] => {
    const out = new Array<bigint>(len).fill(0n);
    a.forEach((x, i) => b.forEach((y, j) => i + j < len && (out[i + j]! += x * y)));
    return out;
  };
  const one = [1n, ...new Array<bigint>(len - 1).fill(0n)];
  let rows: bigint[][] = [one, ...Array.from({ length: nMax }, () => new Array(len).fill(0n))];
  for (const c of points) {
    const cs = [one];
    for (let k = 1; k <= nMax; k++) cs.push(mul(cs[k - 1]!, c));
    const next = rows.map((r) => r.slice());
    for (let N = 1; N <= nMax; N++) {
      for (let k = 1; k <= (fermion ? 1 : N); k++) {
        const t = mul(rows[N - k]!, cs[k]!);
        for (let i = 0; i < len; i++) next[N]![i]! += t[i]!;
      }
    }
    rows = next;
  }
  return rows;
}

const log2Max = (row: readonly bigint[], denPow: bigint): number => {
  let m = 0n;
  for (const x of row) m = x < 0n ? (-x > m ? -x : m) : x > m ? x : m;
  return m === 0n ? -Infinity : Math.log2(Number(m)) - Math.log2(Number(denPow));
};

describe('productLog2Bounds', () => {
  it('bounds every coefficient of Z(N) of random spectra, both statistics', () => {
    const point = fc.array(fc.bigInt({ min: -6n, max: 6n }), { minLength: 1, maxLength: 6 });
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 5 }), point), { minLength: 1, maxLength: 6 }),
        fc.boolean(),
        fc.constantFrom(1n, 3n),
        fc.integer({ min: 1, max: 4 }),
        (raw, fermion, den, nMax) => {
          const len = 12;
          const step = frac(1, 2);
          const arrays = raw.map(([start, num]) => {
            const a = new Array<bigint>(len).fill(0n);
            num.forEach((x, i) => start + i < len && (a[start + i] = x));
            return a;
          });
          const series = raw.map(([start, num]) => Series.of(step, start, num.slice(), den, len));
          const bounds = productLog2Bounds(series, nMax, fermion, frac(len, 2));
          expect(bounds).not.toBeNull();
          const exact = bruteForce(arrays, nMax, fermion, len);
          for (let N = 1; N <= nMax; N++) {
            expect(log2Max(exact[N]!, den ** BigInt(N))).toBeLessThanOrEqual(bounds![N]!);
          }
        },
      ),
      { numRuns: 120 },
    );
  });

  it('is within a few bits of the largest coefficient for the ring spectrum q^|p|/(1+q^|p|)^2', () => {
    // p = +-1/2, +-3/2, ... below the order 20 on the grid q^(1/2): c_p = sum_k (-1)^(k-1) k q^(k|p|)
    const len = 40;
    const arrays: bigint[][] = [];
    const series: Series[] = [];
    for (let a = 1; a < len; a += 2) {
      const c = new Array<bigint>(len).fill(0n);
      for (let k = 1; k * a < len; k++) c[k * a] = (k % 2 === 1 ? 1n : -1n) * BigInt(k);
      for (let copy = 0; copy < 2; copy++) {
        arrays.push(c);
        series.push(Series.of(frac(1, 2), 0, c.slice(), 1n, len));
      }
    }
    const nMax = 6;
    const exact = bruteForce(arrays, nMax, true, len);
    const bounds = productLog2Bounds(series, nMax, true, frac(20))!;
    for (let N = 1; N <= nMax; N++) {
      const actual = log2Max(exact[N]!, 1n);
      expect(actual).toBeLessThanOrEqual(bounds[N]!);
      expect(bounds[N]! - actual).toBeLessThan(12);
    }
  });

  it('does not apply without an order, with negative exponents or a c_p known below the order', () => {
    const c = Series.of(frac(1), 1, [1n, 2n], 1n, 10);
    expect(productLog2Bounds([c], 2, true, null)).toBeNull();
    expect(productLog2Bounds([Series.of(frac(1), -1, [1n], 1n, 10)], 2, true, frac(5))).toBeNull();
    expect(productLog2Bounds([Series.of(frac(1), 1, [1n], 1n, 3)], 2, true, frac(5))).toBeNull();
    expect(productLog2Bounds([c], 2, true, frac(5))).not.toBeNull();
  });
});
