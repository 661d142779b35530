import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compute } from '../compute.js';
import type { ClassRowJson } from '../result.js';
import { seriesOf } from '../test-helpers.js';
import { classRowJsonText } from './class-text.js';

const gas = (values: string[], fermion: boolean, classTable: number): unknown => ({
  format: 'traceloom.gas/1',
  statistics: fermion ? 'fermion' : 'boson',
  variable: 'q',
  step: '1',
  order: null,
  nMax: values.length,
  classTable,
  weights: { kind: 'values', values },
});

// The direct row writer must give the same rows as the plain path (row objects, then text).
describe('class rows written straight from integers', () => {
  it('parse to the rows of the plain path, in the same order (random rational weights)', () => {
    const weight = fc
      .tuple(fc.integer({ min: -9, max: 9 }), fc.integer({ min: 1, max: 12 }))
      .map(([n, d]) => `${n}/${d}`);
    fc.assert(
      fc.property(
        fc.array(weight, { minLength: 1, maxLength: 7 }),
        fc.boolean(),
        (values, fermion) => {
          const spec = gas(values, fermion, values.length);
          const plain: ClassRowJson[] = [];
          const lean: string[] = [];
          compute(spec, { onClass: (r) => plain.push(r), collectClasses: false });
          const r = compute(spec, { onClassText: (t) => lean.push(t), collectClasses: false });
          expect(r.classes).toEqual([]);
          expect(lean).toEqual(plain.map(classRowJsonText));
          expect(lean.map((t) => JSON.parse(t) as unknown)).toEqual(plain);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('fall back to the row objects for series weights', () => {
    const spec = gas(['q + 1/2', '2 - q^2', 'q^3/3'], true, 3);
    const plain: ClassRowJson[] = [];
    const lean: string[] = [];
    compute(spec, { onClass: (r) => plain.push(r), collectClasses: false });
    compute(spec, { onClassText: (t) => lean.push(t), collectClasses: false });
    // p(1) + p(2) + p(3) = 1 + 2 + 3 rows (OEIS A000041)
    expect(lean).toHaveLength(6);
    expect(lean.map((t) => JSON.parse(t) as unknown)).toEqual(plain);
  });

  it('write zero contributions with no terms and integers without a denominator', () => {
    const rows: ClassRowJson[] = [];
    compute(gas(['0', '3'], false, 2), {
      onClassText: (t) => rows.push(JSON.parse(t) as ClassRowJson),
    });
    // S_2: 1^2 has Z_1^2 / 2 = 0, the 2-cycle has Z_2 / 2 = 3/2
    expect(rows.map((r) => seriesOf(r.contribution).terms)).toEqual([[], [], [['0', '3/2']]]);
    const ints: ClassRowJson[] = [];
    compute(gas(['2'], false, 1), { onClassText: (t) => ints.push(JSON.parse(t) as ClassRowJson) });
    expect(ints[0]!.contribution).toEqual({ order: null, terms: [['0', '2']] });
  });
});
