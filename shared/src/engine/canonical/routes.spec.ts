import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { frac } from '../rational.js';
import { compareSeries } from '../series/compare.js';
import { Series } from '../series/series.js';
import { ser } from '../test-helpers.js';
import { newtonRecursion, recursionBySeries } from './recursion.js';

// Common practice: the kernel's exact table and plain series arithmetic must give the same Z(N).
describe('the two implementations of the Newton recursion agree', () => {
  const weight = fc.record({
    c: fc.integer({ min: -4, max: 4 }),
    d: fc.integer({ min: 1, max: 5 }),
    e: fc.integer({ min: 0, max: 3 }),
    half: fc.boolean(),
    o: fc.option(fc.integer({ min: 4, max: 14 }), { nil: null }),
  });
  it('on random rational, series and truncated weights', () => {
    fc.assert(
      fc.property(
        fc.array(weight, { minLength: 5, maxLength: 5 }),
        fc.boolean(),
        fc.integer({ min: 3, max: 12 }),
        (ws, fermion, order) => {
          const weights: Series[] = ws.map((w, i) =>
            ser(
              `${w.c}/${w.d} * q^(${w.e}${w.half ? '+1/2' : ''}) + q^${i + 1}${w.o === null ? '' : ` + O(q^${w.o})`}`,
            ),
          );
          const cap = frac(order);
          const a = newtonRecursion(weights, 5, fermion, cap);
          const b = recursionBySeries(weights, 5, fermion, cap);
          for (let N = 0; N <= 5; N++) {
            const v = compareSeries(b[N]!, a[N]!);
            expect(v.agrees, `N=${N}: ${JSON.stringify(v.firstMismatch)}`).toBe(true);
            // neither claims more than the other can know
            expect(
              a[N]!.order === null ? Infinity : a[N]!.order! * a[N]!.step.valueOf(),
            ).toBeLessThanOrEqual(
              b[N]!.order === null ? Infinity : b[N]!.order! * b[N]!.step.valueOf(),
            );
          }
        },
      ),
      { numRuns: 40 },
    );
  });
});
