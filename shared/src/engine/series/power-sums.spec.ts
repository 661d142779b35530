import Fraction from 'fraction.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { frac } from '../rational.js';
import { ser } from '../test-helpers.js';
import { mul, scale } from './arith.js';
import { toValueJson } from './format.js';
import { powerSums } from './power-sums.js';
import { cutAt, type Series } from './series.js';
import { sumSeries } from './sum.js';

/** Every value raised to its own powers, one product at a time (the plain definition). */
function plainPowerSums(
  values: [Series, number][],
  nMax: number,
  cap: Fraction,
  truncated: boolean,
): Series[] {
  const terms: Series[][] = Array.from({ length: nMax }, () => []);
  for (const [c, m] of values) {
    let pw = c;
    for (let L = 1; L <= nMax; L++) {
      const pv = pw.valExponent();
      if (pv === null || pv.compare(cap) >= 0) break;
      terms[L - 1]!.push(m === 1 ? pw : scale(pw, frac(m)));
      pw = mul(pw, c, cap);
    }
  }
  return terms.map((t) => (truncated ? cutAt(sumSeries(t), cap) : sumSeries(t)));
}

/** c_n = y^v / (1 + y^v)^2 with y = q^(1/2), v = 2n - 1: the ring spectrum's lattice values. */
const ringValue = (v: number, order: number): Series =>
  ser(`q^(${v}/2) / (1 + q^(${v}/2))^2`, order);

describe('powerSums', () => {
  it('gives the ring spectrum power sums Z_1..Z_3 below q^12', () => {
    // expected: python3, exact integer polynomials, Z_L = 2 sum_(n<=12) c_n^L with
    // c_n = sum_k (-1)^(k-1) k y^(k(2n-1)) truncated at y^24, products term by term
    const expected = [
      [
        0, 2, -4, 8, -8, 12, -16, 16, -16, 26, -24, 24, -32, 28, -32, 48, -32, 36, -52, 40, -48, 64,
        -48, 48,
      ],
      [
        0, 0, 2, -8, 20, -40, 72, -112, 168, -248, 332, -440, 592, -728, 912, -1168, 1360, -1632,
        2010, -2280, 2680, -3200, 3544, -4048,
      ],
      [
        0, 0, 0, 2, -12, 42, -112, 252, -504, 926, -1584, 2574, -4016, 6006, -8736, 12420, -17136,
        23256, -31120, 40698, -52680, 67552, -85008, 106260,
      ],
    ];
    const values: [Series, number][] = [];
    for (let n = 1; n <= 12; n++) values.push([ringValue(2 * n - 1, 12), 2]);
    const Z = powerSums(values, 3, new Fraction(12), true);
    Z.forEach((z, L) => {
      for (let k = 0; k < 24; k++) {
        expect(z.coeffAt(k * Number(new Fraction(1, 2).div(z.step).valueOf()))?.valueOf()).toBe(
          expected[L]![k],
        );
      }
      expect(z.orderExponent()?.equals(12)).toBe(true);
    });
  });

  it('equals the plain powers on mixed families, shifts, multiplicities and lone values', () => {
    const value = fc.record({
      kind: fc.constantFrom('ring', 'ring', 'near', 'shifted', 'poly', 'mono'),
      v: fc.integer({ min: 1, max: 9 }),
      a: fc.integer({ min: -3, max: 3 }),
      m: fc.integer({ min: 1, max: 3 }),
    });
    const make = (x: { kind: string; v: number; a: number }, order: number): Series => {
      if (x.kind === 'ring') return ringValue(x.v, order);
      // agrees with the ring value in its first three coarse coefficients only
      if (x.kind === 'near')
        return ser(`q^(${x.v}/2) / (1 + q^(${x.v}/2))^2 + q^(${4 * x.v}/2)`, order);
      if (x.kind === 'shifted') return ser(`q^(${x.v}/3) * (1 - q^${x.v})^(-1)`, order);
      if (x.kind === 'mono') return ser(`${x.a === 0 ? 1 : x.a} * q^(${x.v}/2) + O(q^${order})`);
      return ser(`q^${x.v} * (${x.a} + q^(${x.v}/2) - 2 q^${2 * x.v})`, order);
    };
    fc.assert(
      fc.property(
        fc.array(value, { minLength: 1, maxLength: 8 }),
        fc.integer({ min: 1, max: 6 }),
        fc.integer({ min: 4, max: 14 }),
        fc.boolean(),
        (xs, nMax, order, truncated) => {
          const values: [Series, number][] = xs.map((x) => [make(x, order), x.m]);
          const cap = new Fraction(order);
          const fast = powerSums(values, nMax, cap, truncated);
          const plain = plainPowerSums(values, nMax, cap, truncated);
          expect(fast.map(toValueJson)).toEqual(plain.map(toValueJson));
        },
      ),
      { numRuns: 150 },
    );
  });
});
