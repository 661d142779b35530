import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { compute } from '../compute.js';
import { frac } from '../rational.js';
import { compareSeries } from '../series/compare.js';
import { Series } from '../series/series.js';
import type { AnyValueJson } from '../result.js';
import { coeffs, gas, ser, seriesOf } from '../test-helpers.js';
import { ClassRow, classSum } from './classes.js';
import { newtonRecursion } from './recursion.js';

const one = Series.constant(frac(1));
const constWeights = (x: Fraction, n: number): Series[] =>
  Array.from({ length: n }, () => Series.constant(x));

describe('class table', () => {
  // OEIS A000041 / A&S Table 24.5: p(N) for N = 1..20
  const partitions = [
    1, 2, 3, 5, 7, 11, 15, 22, 30, 42, 56, 77, 101, 135, 176, 231, 297, 385, 490, 627,
  ];
  it.each(partitions.map((p, i) => [i + 1, p]))('S_%i has p(N) = %i cycle types', (N, p) => {
    let rows = 0;
    classSum(N, constWeights(frac(1), N), false, null, () => rows++);
    expect(rows).toBe(p);
  });

  it('S_40 has 37,338 cycle types, streamed one by one (OEIS A000041)', () => {
    let rows = 0;
    classSum(40, constWeights(frac(1), 40), true, null, () => rows++);
    expect(rows).toBe(37338);
  });

  it('S_4 class sizes: 1^4:1, 1^2 2:6, 2^2:3, 1 3:8, 4:6 (A&S Table 24.2)', () => {
    const rows: ClassRow[] = [];
    classSum(4, constWeights(frac(1), 4), true, null, (r) => rows.push(r));
    const sizes = Object.fromEntries(
      rows.map((r) => [r.cycleType.map(([L, m]) => `${L}^${m}`).join(' '), r.size]),
    );
    expect(sizes).toEqual({ '1^4': '1', '1^2 2^1': '6', '2^2': '3', '1^1 3^1': '8', '4^1': '6' });
    // fermion sign (-1)^(N - cycles): a transposition class is odd
    expect(rows.find((r) => r.cycleType.length === 2 && r.cycleType[1]![0] === 2)!.sign).toBe(-1);
  });

  it.each([1, 2, 3, 4, 5, 6, 7, 8])('class sizes of S_%i sum to N! (common practice)', (N) => {
    let total = 0n;
    classSum(N, constWeights(frac(1), N), false, null, (r) => (total += BigInt(r.size)));
    let f = 1n;
    for (let i = 2; i <= N; i++) f *= BigInt(i);
    expect(total).toBe(f);
  });
});

describe('Z_L = x for every L (A&S 24.1.3, Stirling numbers of the first kind)', () => {
  const binom = (x: Fraction, N: number): Fraction => {
    let r = frac(1);
    for (let i = 0; i < N; i++) r = r.mul(x.sub(i)).div(i + 1);
    return r;
  };
  it('x = 7, fermions: 1, 7, 21, 35, 35, 21, 7, 1, 0 (binomial row, OEIS A007318)', () => {
    const Z = newtonRecursion(constWeights(frac(7), 8), 8, true, null);
    expect(Z.map((z) => z.toFraction().valueOf())).toEqual([1, 7, 21, 35, 35, 21, 7, 1, 0]);
  });
  it.each([
    [frac(7), true],
    [frac(7), false],
    [frac(-3, 2), true],
    [frac(1, 3), false],
  ])(
    'x = %s, fermion %s: class sum and recursion give C(x,N) or x(x+1)...(x+N-1)/N!',
    (x, fermion) => {
      const n = 7;
      const w = constWeights(x, n);
      const Z = newtonRecursion(w, n, fermion, null);
      for (let N = 0; N <= n; N++) {
        // bosons: x(x+1)...(x+N-1)/N! = C(x+N-1, N)
        const expected = fermion ? binom(x, N) : binom(x.add(N - 1), N);
        expect(Z[N]!.toFraction().equals(expected)).toBe(true);
        if (N > 0) expect(classSum(N, w, fermion, null).toFraction().equals(expected)).toBe(true);
      }
    },
  );
});

describe('harmonic trap Z_L = q^(L/2)/(1-q^L) (Euler; Andrews 1976 Cor. 2.2; DLMF 17.5)', () => {
  const run = (statistics: string) =>
    compute(
      gas({
        statistics,
        step: '1/2',
        order: '30',
        nMax: 8,
        classTable: 5,
        weights: { kind: 'formula', expression: 'q^(L/2) / (1 - q^L)' },
      }),
    );
  it.each([
    ['fermion', 'q^(N^2/2) / qpoch(q, q, N)'],
    ['boson', 'q^(N/2) / qpoch(q, q, N)'],
  ])('%s: Z(N) = %s for N <= 8, both routes agree', (statistics, closed) => {
    const r = run(statistics);
    expect(r.methods.classSum).toEqual({ nMax: 5, agrees: true });
    for (const row of r.canonical) {
      const expected = ser(closed, 30, { N: row.N });
      const found = ser(jsonText(row.value), null);
      const v = compareSeries(expected, found);
      expect(v.agrees, `N=${row.N} ${JSON.stringify(v.firstMismatch)}`).toBe(true);
      expect(seriesOf(row.value).order).toBe(row.N === 0 ? null : '30'); // Z(0) = 1 exactly
      // the fermion row's lowest exponent is N^2/2: at or beyond O(q^30) it is not determined
      const determined = statistics === 'boson' || (row.N * row.N) / 2 < 30;
      expect(row.determined).toBe(determined);
      expect(row.agrees).toBe(determined ? true : null);
    }
  });
});

/** The expression text of a result value (to read it back). */
function jsonText(value: AnyValueJson): string {
  const v = seriesOf(value);
  const parts = v.terms.map(([e, c]) => `(${c})*q^(${e})`);
  if (v.order !== null) parts.push(`O(q^(${v.order}))`);
  return parts.length ? parts.join(' + ') : '0';
}

describe('levels 1, 2, 3, ...: Z_L = q^L/(1-q^L)', () => {
  const total = (statistics: string, nMax: number): number[] => {
    const r = compute(
      gas({
        statistics,
        order: '21',
        nMax,
        weights: { kind: 'formula', expression: 'q^L/(1-q^L)' },
      }),
    );
    let s = Series.constant(frac(0));
    for (const row of r.canonical) s = ser(`${jsonText(row.value)} + (${textOf(s)})`, 21);
    return coeffs(s, 21);
  };
  const textOf = (s: Series): string =>
    jsonText({
      order: s.orderExponent()?.toFraction() ?? null,
      terms: s.num.map((c, i) => [
        s.step.mul(s.start + i).toFraction(),
        new Fraction(c, s.den).toFraction(),
      ]),
    });
  it('fermions: sum_N Z(N) = prod (1+q^n), distinct partitions (OEIS A000009)', () => {
    // Z(N) has valuation N(N+1)/2 > 20 for N >= 6
    expect(total('fermion', 6)).toEqual([
      1, 1, 1, 2, 2, 3, 4, 5, 6, 8, 10, 12, 15, 18, 22, 27, 32, 38, 46, 54, 64,
    ]);
  });
  it('bosons: sum_N Z(N) = prod 1/(1-q^n), partitions (OEIS A000041)', () => {
    expect(total('boson', 20)).toEqual([
      1, 1, 2, 3, 5, 7, 11, 15, 22, 30, 42, 56, 77, 101, 135, 176, 231, 297, 385, 490, 627,
    ]);
  });
});

describe('finite spectrum facts (common practice)', () => {
  it('fermions on n levels: Z(N) = 0 for N > n; Z(0) = 1', () => {
    const r = compute(
      gas({
        order: null,
        nMax: 6,
        classTable: 6,
        weights: { kind: 'spectrum', expression: 'q^p', offset: '0', from: '1', to: '4' },
      }),
    );
    expect(r.canonical[0]!.value).toEqual({ order: null, terms: [['0', '1']] });
    expect(seriesOf(r.canonical[5]!.value).terms).toEqual([]);
    expect(seriesOf(r.canonical[6]!.value).terms).toEqual([]);
    // Z(4) = q^(1+2+3+4)
    expect(r.canonical[4]!.value).toEqual({ order: null, terms: [['10', '1']] });
    expect(r.methods.product).toEqual({ nMax: 6, agrees: true, points: 4 });
    expect(r.canonical.every((c) => c.agrees && c.routes.length === 3)).toBe(true);
    expect(one.isConstant()).toBe(true);
  });
});

describe('unbounded symmetric spectrum c_p = q^|p|, p in Z + 1/2', () => {
  it('Z_L = 2 q^(L/2)/(1 - q^L) (geometric series, common practice); recursion = product form', () => {
    const r = compute(
      gas({
        step: '1/2',
        order: '15',
        nMax: 5,
        weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '1/2', from: null, to: null },
      }),
    );
    for (const { L, value } of r.weights) {
      const v = compareSeries(ser(`2*q^(${L}/2)/(1-q^${L})`, 15), ser(jsonText(value)));
      expect(v.agrees && v.agreesBelow === '15', `L=${L}`).toBe(true);
    }
    expect(r.methods.product!.agrees).toBe(true);
    // 2 x 15 lattice points lie below q^15
    expect(r.methods.product!.points).toBe(30);
  });
});
