import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { compute } from '../compute.js';
import { EngineError } from '../errors.js';
import type { ComputeResult } from '../result.js';
import { toValueJson } from '../series/format.js';
import { mul } from '../series/arith.js';
import { gas, ser } from '../test-helpers.js';
import { evenChargePart, fermionSectorSum, range } from './brute-force.js';

/** Coefficients of Z(N) on the grid 1/den below size/den, from the result JSON. */
function row(r: ComputeResult, N: number, den: number, size: number): bigint[] {
  const out = new Array<bigint>(size).fill(0n);
  const v = r.canonical[N]!.value as { order: string | null; terms: [string, string][] };
  expect(v.order === null || new Fraction(v.order).compare(new Fraction(size, den)) >= 0).toBe(
    true,
  );
  for (const [e, c] of v.terms) {
    const k = new Fraction(e).mul(den);
    if (k.compare(size) >= 0) continue;
    const cf = new Fraction(c);
    expect(cf.d).toBe(1n);
    out[Number(k.n) * Number(k.s)] = cf.s * cf.n;
  }
  return out;
}

/** The error a spec is refused with. */
function refusal(spec: Record<string, unknown>): EngineError {
  try {
    compute(spec);
  } catch (e) {
    if (e instanceof EngineError) return e;
    throw e;
  }
  throw new Error('the spec was accepted');
}

describe('sector sums against independent methods', () => {
  it('two sectors of weight 1/2 at u = (-1)^n give the constant term in u modulo u^2 = 1', () => {
    // c_p(u) = u^p q^|p|: the half-sum over u = 1 and u = -1 keeps the states of even total p,
    // computed here by a DP on the parity of the charge (never split into sectors).
    const order = 14;
    const r = compute(
      gas({
        order: String(order),
        nMax: 5,
        classTable: 4,
        weights: { kind: 'spectrum', expression: '(-1)^(n*p) * q^abs(p)', from: null, to: null },
        sectors: { index: ['n'], from: [0], to: [1], weight: '1/2' },
      }),
    );
    const even = evenChargePart({
      nMax: 5,
      size: order,
      lattice: range(-order, order),
      state: (p) => ({ e: Math.abs(p), charge: p }),
    });
    for (let N = 1; N <= 5; N++) expect(row(r, N, 1, order)).toEqual(even[N]);
    expect(r.sectors!.count).toBe(2);
    expect(r.sectors!.truncated).toBe(false);
    expect(r.methods.product?.agrees).toBe(true);
    expect(r.methods.classSum?.agrees).toBe(true);
  });

  it('a two-node quiver: c_p(n) = q^((|p| + |p + n|)/2), weight 1, both sums unbounded', () => {
    // brute force over |n|, |p| <= 20: every state with |n| >= 16 or |p| >= 16 has valuation >= 8
    const order = 8;
    const den = 2;
    const spec = gas({
      step: '1/2',
      order: String(order),
      nMax: 4,
      weights: {
        kind: 'spectrum',
        expression: 'q^((abs(p) + abs(p + n))/2)',
        from: null,
        to: null,
      },
      sectors: { index: ['n'], from: [null], to: [null], weight: '1' },
    });
    const r = compute(spec);
    const brute = fermionSectorSum({
      nMax: 4,
      size: order * den,
      sectors: range(-20, 20).map((n) => [n]),
      lattice: range(-20, 20),
      state: (p, [n]) => ({ e: Math.abs(p) + Math.abs(p + n!), c: 1n }),
      weight: () => 1n,
    });
    for (let N = 1; N <= 4; N++) expect(row(r, N, den, order * den)).toEqual(brute[N]);
    expect(r.canonical[0]!.value).toEqual({ order: null, terms: [['0', '1']] });
    expect(r.sectors!.convention).toMatch(/Z\(0\) = 1 by convention/);
    expect(r.sectors!.truncated).toBe(true);
    // |n| <= 15 can contribute below q^8 at N = 1; the walk must have reached them all
    const used = new Set(r.sectors!.rows.map((s) => s.index[0]));
    for (const n of range(-15, 15)) expect(used.has(n)).toBe(true);
    expect(r.sectors!.rows.find((s) => s.index[0] === 3)?.valuations[0]).toBe('3/2');
    expect(r.canonical[1]!.sectors).toBe(r.sectors!.rows.filter((s) => s.contributes[0]).length);
  });

  it('checks a reference table and a grand function against the summed table', () => {
    // reference rows and grand coefficients from the brute force of the quiver above (order 6);
    // one coefficient of the N = 2 row is changed to see the mismatch reported
    const order = 6;
    const brute = fermionSectorSum({
      nMax: 3,
      size: order * 2,
      sectors: range(-20, 20).map((n) => [n]),
      lattice: range(-20, 20),
      state: (p, [n]) => ({ e: Math.abs(p) + Math.abs(p + n!), c: 1n }),
      weight: () => 1n,
    });
    const text = (N: number, bump = -1): string =>
      brute[N]!.map((c, k) => `${k === bump ? c + 1n : c}*q^(${k}/2)`).join(' + ') +
      ` + O(q^${order})`;
    const r = compute(
      gas({
        step: '1/2',
        order: String(order),
        nMax: 3,
        weights: { kind: 'spectrum', expression: 'q^((abs(p) + abs(p + n))/2)' },
        sectors: { index: ['n'], from: [null], to: [null] },
        grand: { kind: 'coefficients', values: ['1', text(1), text(2), text(3)] },
        reference: { rows: [1, 2, 3].map((N) => ({ N, value: text(N, N === 2 ? 5 : -1) })) },
      }),
    );
    expect(r.grandCheck!.map((v) => v.agrees)).toEqual([true, true, true, true]);
    expect(r.impliedWeights!.every((v) => v.agrees)).toBe(true);
    expect(r.referenceCheck!.map((v) => v.agrees)).toEqual([true, false, true]);
    expect(
      (r.referenceCheck![1] as { firstMismatch: { exponent: string } }).firstMismatch.exponent,
    ).toBe('5/2');
  });

  it('the sign weight (-1)^n: sum_n (-1)^n q^(N|n|) Z_0(N) = (1 - q^N)/(1 + q^N) Z_0(N)', () => {
    // geometric series (common practice): sum_n (-1)^n x^|n| = (1 - x)/(1 + x)
    const order = '16';
    const base = { order, nMax: 5, classTable: 3 };
    const expression = 'q^(abs(p) + abs(n))';
    const r = compute(
      gas({
        ...base,
        weights: { kind: 'spectrum', expression, from: null, to: null },
        sectors: { index: ['n'], from: [null], to: [null], weight: '(-1)^n' },
      }),
    );
    const plain = compute(
      gas({ ...base, weights: { kind: 'spectrum', expression: 'q^abs(p)', from: null, to: null } }),
    );
    for (let N = 1; N <= 5; N++) {
      const factor = ser(`(1 - q^${N})/(1 + q^${N})`, order);
      const z0 = ser(termsText(plain, N), order);
      expect(r.canonical[N]!.value).toEqual(toValueJson(mul(factor, z0, new Fraction(order))));
    }
    // the class 1^2 summed over sectors: (1/2) sum_n (-1)^n Z_1(n)^2 with Z_1(n) = q^|n| (1+q)/(1-q)
    const c = r.classes.find((x) => x.N === 2 && x.cycleType[0]![0] === 1)!;
    expect(c.contribution).toEqual(
      toValueJson(ser('(1/2) * (1 - q^2)/(1 + q^2) * ((1 + q)/(1 - q))^2', order)),
    );
    expect(r.methods.classSum?.agrees).toBe(true);
  });

  it('a telescoping 2-index sum leaves its first term', () => {
    // sum_(n>=0) sum_(s=0,1) (-1)^s Z_(n+s) = Z_0, with Z_m the gas of Z_L = q^(L m)/(1 - q^(L(m+1)))
    const base = { order: '12', nMax: 5 };
    const expression = 'q^(L*(n+s)) / (1 - q^(L*(n+s+1)))';
    const r = compute(
      gas({
        ...base,
        weights: { kind: 'formula', expression },
        sectors: { index: ['n', 's'], from: [0, 0], to: [null, 1], weight: '(-1)^s' },
      }),
    );
    const first = compute(
      gas({ ...base, weights: { kind: 'formula', expression: '1/(1 - q^L)' } }),
    );
    for (let N = 1; N <= 5; N++) expect(r.canonical[N]!.value).toEqual(first.canonical[N]!.value);
    expect(r.sectors!.index).toEqual(['n', 's']);
    expect(r.sectors!.count).toBeGreaterThan(4);
  });

  it('a sum odd under n -> -n vanishes to the order, with its sectors still listed', () => {
    const r = compute(
      gas({
        order: '10',
        nMax: 4,
        weights: { kind: 'spectrum', expression: 'q^(abs(p) + abs(n))', from: null, to: null },
        sectors: { index: ['n'], from: [null], to: [null], weight: 'n' },
      }),
    );
    for (let N = 1; N <= 4; N++) expect(r.canonical[N]!.value).toEqual({ order: '10', terms: [] });
    expect(r.sectors!.contributing).toBeGreaterThan(10);
    expect(r.sectors!.rows.find((s) => s.index[0] === 0)?.contributed).toBe(false);
  });

  it('a weight of negative valuation is met by computing its sectors one order further', () => {
    // w = q^(-2): w Z_n is wanted to O(q^8), so Z_n is computed to O(q^10) and nothing is lost;
    // checked against q^(-2) (Z_0 + Z_1) from two plain gases at order 10 (series product by hand)
    const spectrum = (n: number) => ({ kind: 'spectrum', expression: `q^(abs(p) + ${n})` });
    const r = compute(
      gas({
        order: '8',
        nMax: 3,
        weights: { kind: 'spectrum', expression: 'q^(abs(p) + n)' },
        sectors: { index: ['n'], from: [0], to: [1], weight: 'q^(-2)' },
      }),
    );
    const plain = [0, 1].map((n) => compute(gas({ order: '10', nMax: 3, weights: spectrum(n) })));
    for (let N = 1; N <= 3; N++) {
      const sum = ser(`q^(-2) * (${termsText(plain[0]!, N)} + ${termsText(plain[1]!, N)})`, '10');
      expect(r.canonical[N]!.value).toEqual(toValueJson(sum));
      expect((r.canonical[N]!.value as { order: string }).order).toBe('8');
    }
  });

  it('weights given as a list may use the index', () => {
    // Z_L = q^(L n) for n = 1, 2: sector n is one state q^n, so Z(1) = q + q^2 and Z(2) = 0
    const r = compute(
      gas({
        order: '6',
        nMax: 2,
        weights: { kind: 'values', values: ['q^n', 'q^(2*n)'] },
        sectors: { index: ['n'], from: [1], to: [2] },
      }),
    );
    expect(r.canonical[1]!.value).toEqual({
      order: '6',
      terms: [
        ['1', '1'],
        ['2', '1'],
      ],
    });
    expect(r.canonical[2]!.value).toEqual({ order: '6', terms: [] });
  });
});

describe('sector sums that must stop or be refused', () => {
  it('refuses a sum whose valuations stop growing, naming sectors, without hanging', () => {
    const t0 = Date.now();
    const e = refusal(
      gas({
        order: '10',
        nMax: 3,
        weights: { kind: 'spectrum', expression: 'q^abs(p)', from: null, to: null },
        sectors: { index: ['n'], from: [null], to: [null] },
      }),
    );
    expect(e.field).toBe('sectors');
    expect(e.message).toMatch(/does not converge/);
    expect(Date.now() - t0).toBeLessThan(20000);
  });

  it('refuses an unbounded range without a finite order', () => {
    const e = refusal(
      gas({
        order: null,
        nMax: 2,
        weights: { kind: 'formula', expression: 'q^(L*abs(n))' },
        sectors: { index: ['n'], from: [null], to: [null] },
      }),
    );
    expect(e.field).toBe('sectors');
  });

  it('names the sector and field of a weight that fails', () => {
    const e = refusal(
      gas({
        order: '10',
        nMax: 2,
        weights: { kind: 'formula', expression: 'q^L / (n - 2)' },
        sectors: { index: ['n'], from: [0], to: [3] },
      }),
    );
    expect(e.field).toBe('weights.expression');
    expect(e.message).toMatch(/n=2/);
  });
});

/** Z(N) of a result written back as an expression (its terms plus its order). */
function termsText(r: ComputeResult, N: number): string {
  const v = r.canonical[N]!.value as { order: string | null; terms: [string, string][] };
  const parts = v.terms.map(([e, c]) => `(${c})*q^(${e})`);
  if (v.order !== null) parts.push(`O(q^(${v.order}))`);
  return parts.join(' + ') || '0';
}
