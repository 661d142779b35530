import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compute } from '../compute.js';
import { estimateRun, partitionCounts } from '../estimate.js';
import type { Progress } from '../result.js';
import type { ValueJson } from '../series/format.js';
import { gas } from '../test-helpers.js';

/** Lowest exponent of a result value (a number), or null when no term is known. */
const lowest = (v: unknown): number | null => {
  const t = (v as ValueJson).terms[0];
  if (!t) return null;
  const [n, d = '1'] = t[0].split('/');
  return Number(n) / Number(d);
};

// Fermions on c_p = q^|p|, p in Z: levels 0, 1, 1, 2, 2, ...; Z(N) = e_N(levels), whose lowest
// exponent is the sum of the N lowest levels, floor(N^2/4) (from memory; OEIS A002620 quarter-squares).
const ring = gas({
  order: '200',
  nMax: 40,
  weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '0', from: null, to: null },
});

describe('rows beyond the order are not determined (PRODUCT.md "Honest rows")', () => {
  const r = compute(ring);
  it('N = 29..40 at O(q^200): determined false, agrees null; the rows below are determined', () => {
    for (const row of r.canonical) {
      const known = Math.floor((row.N * row.N) / 4) < 200;
      expect(row.determined, `N=${row.N}`).toBe(known);
      expect(row.agrees, `N=${row.N}`).toBe(known ? true : null);
      if (known) expect(lowest(row.value)).toBe(Math.floor((row.N * row.N) / 4));
    }
  });
  it('says which rows and which order reaches N_max (floor(40^2/4) = 400, so O(q^401))', () => {
    expect(r.orderAdvice).toMatchObject({
      undetermined: Array.from({ length: 12 }, (_, i) => 29 + i),
      lowestExponentBound: '400',
      orderNeeded: '401',
      fit: { expression: 'N^2/4', parity: 'even', atNMax: '400' },
    });
    expect(r.orderAdvice!.message).toMatch(
      /^Z\(N\) for N = 29\.\.40 is not determined at O\(q\^200\)/,
    );
    expect(r.orderAdvice!.message).toMatch(/at least O\(q\^401\) is needed to reach N_max = 40/);
  });
  it('at the advised order every row is determined and no advice is given', () => {
    const up = compute({ ...ring, nMax: 12, order: String(Math.floor(144 / 4) + 1) });
    expect(up.canonical.every((c) => c.determined)).toBe(true);
    expect(up.orderAdvice).toBeUndefined();
  });
  // Forty levels q^0..q^39: Xi = prod_p (1 + kappa q^p) = (-kappa; q)_40 (DLMF 17.2.1), and
  // Z(N) = q^(N(N-1)/2) [40 choose N]_q (DLMF 17.2.27), lowest exponent N(N-1)/2: 210 for N = 21.
  it('a grand or reference check on a row that is not determined is not compared', () => {
    const spec = {
      ...ring,
      weights: { kind: 'spectrum', expression: 'q^p', offset: '0', from: '0', to: '39' },
      grand: { kind: 'expression', expression: 'qpoch(-kappa, q, 40)' },
      reference: {
        normalization: '1',
        rows: [
          { N: 2, value: 'q + q^2 + 2*q^3 + O(q^4)' },
          { N: 31, value: '7 + O(q^3)' },
        ],
      },
    };
    const c = compute(spec);
    const notCompared = { agrees: null, agreesBelow: null, firstMismatch: null, determined: false };
    expect(c.referenceCheck![1]).toEqual({ N: 31, ...notCompared });
    expect(c.referenceCheck![0]!.agrees).toBe(true);
    for (const v of c.grandCheck!) {
      if (v.N >= 21) expect(v).toEqual({ N: v.N, ...notCompared });
      else expect(v.agrees, `N=${v.N}`).toBe(true);
    }
    expect(c.orderAdvice!.undetermined[0]).toBe(21);
  });
});

// Common practice: the bound is a lower bound of every computed lowest exponent, on several gases.
describe('lowestExponentBound is never above a computed lowest exponent', () => {
  const gases = [
    [
      'trap, fermions',
      gas({
        step: '1/2',
        order: '30',
        nMax: 10,
        weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
      }),
    ],
    [
      'trap, bosons',
      gas({
        statistics: 'boson',
        step: '1/2',
        order: '12',
        nMax: 30,
        weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
      }),
    ],
    [
      'ring, half-integer',
      gas({
        step: '1/2',
        order: '20',
        nMax: 14,
        weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '1/2', from: null, to: null },
      }),
    ],
    [
      'finite, cancelling',
      gas({
        order: '9',
        nMax: 8,
        weights: { kind: 'spectrum', expression: 'q^p - q^(p+1)', offset: '0', from: '1', to: '4' },
      }),
    ],
  ] as const;
  it.each(gases)('%s', (_, spec) => {
    for (let n = 2; n <= (spec.nMax as number); n++) {
      const r = compute({ ...spec, nMax: n });
      const a = r.orderAdvice;
      const v = lowest(r.canonical[n]!.value);
      if (a?.lowestExponentBound && v !== null) {
        const [p, d = '1'] = a.lowestExponentBound.split('/');
        expect(Number(p) / Number(d), `N=${n}`).toBeLessThanOrEqual(v);
      }
    }
  });
});

describe('estimateRun: the cost of the class table and the rows the order reaches, before a run', () => {
  // OEIS A000041: p(10) = 42, p(20) = 627, p(40) = 37338; sum p(1..40) = 215307.
  it('partition counts', () => {
    const p = partitionCounts(40);
    expect([p[0], p[10], p[20], p[40]]).toEqual([1, 42, 627, 37338]);
    expect(p.slice(1).reduce((a, b) => a + b, 0)).toBe(215307);
  });
  it('a class table of 40 at O(q^100): 215,307 cycle types x 100 coefficients', () => {
    const e = estimateRun({ ...ring, order: '100', classTable: 40 });
    expect(e).toMatchObject({ cycleTypes: 215307, seriesLength: 100, classCoefficients: 21530700 });
    expect(e.classMemoryMb).toBeGreaterThan(1024);
    expect(e.summary).toMatch(/215,307 cycle types/);
  });
  it.each([
    ['ring at O(q^200)', ring],
    [
      'trap at O(q^30)',
      gas({
        step: '1/2',
        order: '30',
        nMax: 12,
        weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
      }),
    ],
    ['ring at O(q^401)', { ...ring, order: '401' }],
  ])('%s: the predicted rows are the rows the run leaves undetermined', (_, spec) => {
    const before = estimateRun(spec).orderAdvice;
    const after = compute(spec).orderAdvice;
    expect(before?.undetermined ?? []).toEqual(after?.undetermined ?? []);
    expect(before?.orderNeeded ?? null).toEqual(after?.orderNeeded ?? null);
  });
});

describe('progress is reported by work', () => {
  it('the class phase counts cycle types up to p(1) + ... + p(12) = 271 (OEIS A000070)', () => {
    const seen: Progress[] = [];
    compute(
      gas({ nMax: 12, classTable: 12, weights: { kind: 'values', values: Array(12).fill('1/2') } }),
      {
        onProgress: (p) => seen.push(p),
      },
    );
    const classes = seen.filter((p) => p.phase === 'classSum');
    expect(classes.every((p) => p.total === 271 && p.unit === 'cycle types')).toBe(true);
    const done = classes.map((p) => p.done);
    expect(done).toEqual([...done].sort((a, b) => a - b));
  });
  it('property: the recursion phase counts products, N(N+1)/2 for N_max', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30 }), (nMax) => {
        const seen: Progress[] = [];
        compute(gas({ nMax, weights: { kind: 'formula', expression: 'q^L' } }), {
          onProgress: (p) => seen.push(p),
        });
        return seen
          .filter((p) => p.phase === 'recursion')
          .every((p) => p.total === (nMax * (nMax + 1)) / 2);
      }),
      { numRuns: 10 },
    );
  });
});
