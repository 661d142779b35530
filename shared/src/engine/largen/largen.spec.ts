import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { shift } from '../series/arith.js';
import { toValueJson } from '../series/format.js';
import { Series, truncate } from '../series/series.js';
import { parseGasSpec } from '../spec/schema.js';
import { gas, ser } from '../test-helpers.js';
import { largeNAnalysis } from './index.js';
import { table, trapRows } from './test-tables.js';
import type { LargeNClassJson } from './types.js';

/** Coefficients of the limit as a map exponent -> coefficient. */
const limitTerms = (c: LargeNClassJson): Map<string, string> => new Map(c.limit!.terms);

/** Expected limit: the value of an independent expression, compared where the limit is known. */
function expectLimit(c: LargeNClassJson, expr: string): void {
  const order = new Fraction(c.limit!.order!);
  const want = truncate(ser(expr, order.add(1).toFraction()), order);
  expect(c.limit).toEqual(toValueJson(want));
}

describe('large N: harmonic trap, Z_L = q^(L/2)/(1-q^L)', () => {
  // Fermions: Z(N) = q^(N^2/2)/(q;q)_N, so q^(-N^2/2) Z(N) = 1/(q;q)_N -> 1/(q;q)_inf, agreeing
  // below q^(N+1); Z(N)/Z(inf) - 1 = (q^(N+1);q)_inf - 1 = -q^(N+1) - q^(N+2) - ...
  // (Andrews, Theory of Partitions, Cor. 2.2; /work/shared/SOURCES.md).
  // Bosons: Z(N) = q^(N/2)/(q;q)_N (the same source), the same limit.
  const cases = [
    { statistics: 'fermion', norm: 'q^(-N^2/2)', lead: 'N^2/2', from: 4 },
    { statistics: 'boson', norm: 'q^(-N/2)', lead: 'N/2', from: 3 },
  ];
  it.each(cases)('$statistics: normalization, limit, walls, exponents', (t) => {
    const { Z, spec } = table({
      statistics: t.statistics,
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
      order: t.statistics === 'fermion' ? '80' : '40',
      nMax: 10,
    });
    const r = largeNAnalysis(Z, spec)!;
    expect(r.classes).toHaveLength(1);
    const c = r.classes[0]!;
    expect(c.parity).toBe('all');
    expect(c.normalization).toBe(t.norm);
    expect(c.normalizationDetail.leadingExponent?.expression).toBe(t.lead);
    expect(c.normalizationDetail.leadingExponent?.verifiedOn[0]).toBe(t.from);
    // rows 9 and 10 agree below q^10: the limit is determined to O(q^10)
    expect(c.limit!.order).toBe('10');
    expectLimit(c, '1/qpoch(q, q, inf)');
    // OEIS A000041: p(0..9)
    expect([...limitTerms(c).values()]).toEqual([
      '1',
      '1',
      '2',
      '3',
      '5',
      '7',
      '11',
      '15',
      '22',
      '30',
    ]);
    expect(c.product!.exponents.map((e) => e.a)).toEqual(new Array(9).fill('1'));
    expect(c.product!.pattern).toBe('a_n = 1');
    expect(c.stabilizationFit).toBe('N + 1');
    expect(c.stabilization[0]).toEqual({ N: 1, agreesBelow: '2' });
    expect(c.stabilization[9]).toEqual({ N: 10, agreesBelow: null, atLeast: '10' });
    const [m1, m2] = c.corrections;
    expect(m1).toMatchObject({ m: 1, status: 'found', exponent: 'N + 1', coefficient: '-1' });
    expect(m1!.verifiedOn.length).toBeGreaterThan(0);
    expect(m2).toMatchObject({ m: 2, status: 'found', exponent: 'N + 2', coefficient: '-1' });
    expect(c.correctionTerms[2]!.value.terms[0]).toEqual(['4', '-1']); // N = 3: -q^4
  });

  it('a long table: N <= 40, 1000 terms per normalized row, analysed in under 1 s', () => {
    const Z = trapRows(40, 1000);
    const spec = parseGasSpec(
      gas({ weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' }, nMax: 40 }),
    );
    const t0 = performance.now();
    const r = largeNAnalysis(Z, spec)!;
    const ms = performance.now() - t0;
    const c = r.classes[0]!;
    expect(c.stabilizationFit).toBe('N + 1');
    expect(c.limit!.order).toBe('40'); // rows 39 and 40 agree below q^40
    expect(c.corrections[0]).toMatchObject({ exponent: 'N + 1', coefficient: '-1' });
    console.info(`large-N analysis, N <= 40 x 1000 terms: ${ms.toFixed(0)} ms`);
    expect(ms).toBeLessThan(1000);
  });
});

describe('large N: even and odd N apart (fermions on levels q^|p|)', () => {
  // Levels |p|, p in Z: odd N = 2M+1 fills -M..M, ground energy (N^2-1)/4, one state; even N
  // has ground energy N^2/4 twice (the last particle at +N/2 or -N/2). The limits are the
  // charge sums over the two Fermi points: odd theta3(q)/(q;q)_inf^2, even
  // theta2(q)/(2 q^(1/4) (q;q)_inf^2) (Jacobi triple product, DLMF 20.5.3; from memory, checked
  // against the expression engine's theta functions here).
  // Offset 1/2 (p in Z + 1/2) swaps the roles: even N is the non-degenerate class.
  const cases = [
    {
      offset: '0',
      even: { norm: 'q^(-N^2/4)/2', limit: 'theta2(0, q)/(2*q^(1/4)*qpoch(q, q, inf)^2)' },
      odd: { norm: 'q^(-N^2/4 + 1/4)', limit: 'theta3(0, q)/qpoch(q, q, inf)^2' },
    },
    {
      offset: '1/2',
      even: { norm: 'q^(-N^2/4)', limit: 'theta3(0, q)/qpoch(q, q, inf)^2' },
      odd: { norm: 'q^(-N^2/4 - 1/4)/2', limit: 'theta2(0, q)/(2*q^(1/4)*qpoch(q, q, inf)^2)' },
    },
  ];
  it.each(cases)('offset $offset', (t) => {
    const { Z, spec } = table({
      weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: t.offset },
      order: '80',
      nMax: 12,
    });
    const r = largeNAnalysis(Z, spec)!;
    expect(r.classes.map((c) => c.parity)).toEqual(['even', 'odd']);
    const [even, odd] = r.classes as [LargeNClassJson, LargeNClassJson];
    expect(even.normalization).toBe(t.even.norm);
    expect(odd.normalization).toBe(t.odd.norm);
    expectLimit(even, t.even.limit);
    expectLimit(odd, t.odd.limit);
    expect(r.notes.join(' ')).toMatch(/one quadratic does not fit/);
  });
});

describe('large N: honest answers when there is nothing to find', () => {
  it('irregular walls: no stabilization law, no correction pattern', () => {
    // Z(N) = q^(N^2) (1/(1-q) + N^3 q^(s_N)), s_N irregular: Y(N) differ from the limit 1/(1-q)
    // at s_N, a sequence no line fits.
    const s = [0, 3, 9, 4, 11, 5, 14, 6, 17, 7, 20];
    const geo = ser('1/(1-q)', 40);
    const Z = [Series.constant(new Fraction(1))];
    for (let N = 1; N <= 10; N++) {
      const y = ser(`1/(1-q) + ${N ** 3}*q^${s[N]}`, 40);
      Z.push(shift(y, new Fraction(N * N)));
    }
    void geo;
    const spec = parseGasSpec(gas({ weights: { kind: 'formula', expression: 'q^L' }, nMax: 10 }));
    const c = largeNAnalysis(Z, spec)!.classes[0]!;
    expect(c.normalization).toBe('q^(-N^2)');
    expect(c.stabilizationFit).toBeNull();
    expect(c.stabilizationNote).toMatch(/no linear law/);
    expect(c.corrections[0]).toMatchObject({ status: 'none', exponent: null, coefficient: null });
    expect(c.corrections[0]!.note).toMatch(/no pattern of degree <= 3 on these rows/);
  });

  it('no limit: no two rows agree beyond the constant term', () => {
    const Z = [Series.constant(new Fraction(1))];
    for (let N = 1; N <= 6; N++) Z.push(ser(`1 + ${N}*q + O(q^10)`));
    const spec = parseGasSpec(gas({ weights: { kind: 'formula', expression: 'q^L' }, nMax: 6 }));
    const c = largeNAnalysis(Z, spec)!.classes[0]!;
    expect(c.limit).toEqual({ order: '1', terms: [['0', '1']] });
    expect(c.product?.exponents).toEqual([]);
  });

  it('fewer than 4 rows: no analysis', () => {
    const { Z, spec } = table({ weights: { kind: 'formula', expression: 'q^L' }, nMax: 3 });
    expect(largeNAnalysis(Z, spec)).toBeUndefined();
  });
});
