import Fraction from 'fraction.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { factorial } from '../../integers.js';
import { exponentNotation, forEachCycleType } from './cycle-types.js';
import { shortCycleTable } from './short-cycles.js';

/** sum over the cycle types of S_r with lengths <= G of eps prod Z_l^m / (l^m m!), term by term. */
function bySum(w: Fraction[], r: number, G: number, fermion: boolean): Fraction {
  let s = new Fraction(0);
  forEachCycleType(r, (v) => {
    const type = exponentNotation(v);
    if (type.some(([l]) => l > G)) return;
    let t = new Fraction(fermion ? v.sign : 1);
    for (const [l, m] of type) t = t.mul(w[l - 1]!.div(l).pow(m)).div(new Fraction(factorial(m)));
    s = s.add(t);
  });
  return s;
}

describe('shortCycleTable', () => {
  it('equals the sum over the cycle types with short cycles, for random rational weights', () => {
    const rational = fc.tuple(fc.integer({ min: -7, max: 7 }), fc.integer({ min: 1, max: 9 }));
    fc.assert(
      fc.property(
        fc.array(rational, { minLength: 10, maxLength: 10 }),
        fc.integer({ min: 1, max: 6 }),
        fc.boolean(),
        (ws, G, fermion) => {
          const w = ws.map(([a, b]) => new Fraction(a, b));
          const parts = w.map((f) => ({ num: f.s * f.n, den: f.d }));
          const t = shortCycleTable(parts, 10, G, fermion ? -1 : 1);
          for (let r = 0; r <= 10; r++) {
            const value = new Fraction(t.U[r]!, t.beta[r]! * factorial(r));
            expect(value.equals(bySum(w, r, G, fermion))).toBe(true);
          }
        },
      ),
      { numRuns: 40 },
    );
  });

  it('gives the exponential formula with every Z_L = 1 (common practice)', () => {
    // bosons: sum over classes of 1/z = 1; fermions: [x^r] exp(sum (-1)^(L-1) x^L / L) =
    // [x^r] (1 + x), so 1, 1, then 0
    const ones = Array.from({ length: 12 }, () => ({ num: 1n, den: 1n }));
    const bosons = shortCycleTable(ones, 12, 12, 1);
    const fermions = shortCycleTable(ones, 12, 12, -1);
    for (let r = 0; r <= 12; r++) {
      expect(bosons.U[r]).toBe(factorial(r));
      expect(fermions.U[r]).toBe(r <= 1 ? 1n : 0n);
    }
  });
});
