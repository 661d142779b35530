import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { spectrumProduct, productBySeries } from '../canonical/product.js';
import { frac } from '../rational.js';
import { ser } from '../test-helpers.js';
import { add } from './arith.js';
import { compareSeries } from './compare.js';
import { toValueJson } from './format.js';
import { Series } from './series.js';
import { sumSeries } from './sum.js';

const term = fc.record({
  c: fc.integer({ min: -5, max: 5 }),
  d: fc.integer({ min: 1, max: 4 }),
  e: fc.integer({ min: 0, max: 6 }),
  step: fc.constantFrom('1', '1/2', '3', '2/3'),
  o: fc.option(fc.integer({ min: 1, max: 12 }), { nil: null }),
});
const seriesOf = (t: { c: number; d: number; e: number; step: string; o: number | null }) =>
  ser(
    `${t.c}/${t.d} * q^(${t.e}*${t.step}) - q^(${t.e + 2}*${t.step})${t.o === null ? '' : ` + O(q^${t.o})`}`,
  );

// The one-pass sum must be the fold of `add`, down to the grid and the order.
describe('sumSeries', () => {
  it('equals folding add over the terms (value, order and grid)', () => {
    fc.assert(
      fc.property(fc.array(term, { maxLength: 6 }), (ts) => {
        const list = ts.map(seriesOf);
        const folded = list.reduce((a, b) => add(a, b), Series.constant(frac(0)));
        const fast = sumSeries(list);
        expect(toValueJson(fast)).toEqual(toValueJson(folded));
        expect(fast.step.equals(folded.step)).toBe(true);
        expect(fast.order).toBe(folded.order);
      }),
      { numRuns: 300 },
    );
  });
});

// Taking the factors of the product form in order of falling valuation changes no number.
describe('product form on arrays', () => {
  it('matches the product in series arithmetic, in any order of the points', () => {
    const point = fc.record({
      k: fc.integer({ min: 1, max: 5 }),
      c: fc.integer({ min: -3, max: 3 }),
    });
    fc.assert(
      fc.property(
        fc.array(point, { minLength: 1, maxLength: 7 }),
        fc.boolean(),
        fc.integer({ min: 4, max: 16 }),
        (ps, fermion, order) => {
          const cap = frac(order, 2);
          const points = ps.map((p) =>
            ser(`q^(${p.k}/2) / (1 + ${p.c} * q^(${p.k}/2))^2`, cap.toFraction()),
          );
          const a = spectrumProduct(points, 4, fermion, cap, false);
          const b = spectrumProduct([...points].reverse(), 4, fermion, cap, false);
          const s = productBySeries(points, 4, fermion, cap);
          for (let j = 0; j <= 4; j++) {
            expect(toValueJson(a[j]!)).toEqual(toValueJson(b[j]!));
            expect(compareSeries(a[j]!, s[j]!).agrees).toBe(true);
          }
        },
      ),
      { numRuns: 100 },
    );
  });
});
