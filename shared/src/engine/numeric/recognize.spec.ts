import { describe, expect, it } from 'vitest';
import { parseDecimal } from './decimal.js';
import { exp, pi } from './elementary.js';
import { findRelation, recognize } from './recognize.js';
import {
  add,
  div,
  fromInt,
  fromNumber,
  mul,
  ONE,
  Real,
  sqrt,
  sub,
  toNumber,
  ZERO,
} from './real.js';

const P = 400;
const p = pi(P);
const ip = div(ONE, p, P);
const ip2 = mul(ip, ip, P);
const piBasis = [
  { text: '1', value: ONE },
  { text: '1/pi', value: ip },
  { text: '1/pi^2', value: ip2 },
  { text: '1/pi^3', value: mul(ip2, ip, P) },
];
const rel = (digits: number) => (v: Real) => Math.abs(toNumber(v)) * 10 ** -digits; // relative error

// line kernel, k = 1: Hatsuda-Moriyama-Okuyama 2012 (SOURCES.md, from memory)
const Z = [
  div(ONE, fromInt(4), P),
  div(ONE, mul(fromInt(16), p, P), P),
  div(sub(p, fromInt(3), P), mul(fromInt(64), p, P), P),
  div(sub(fromInt(10), mul(p, p, P), P), mul(fromInt(1024), mul(p, p, P), P), P),
];

describe('recognize', () => {
  it('the constructed Z(2), Z(3) agree with the decimals of SOURCES.md', () => {
    const close = (a: Real, text: string) =>
      Math.abs(toNumber(sub(a, parseDecimal(text, P), P)) / toNumber(a));
    expect(close(Z[1]!, '0.0198943678864869169711')).toBeLessThan(1e-20);
    expect(close(Z[2]!, '0.000704224085134812271667')).toBeLessThan(1e-20);
  });

  const published = [
    { N: 1, expression: '1/4', latex: '\\frac{1}{4}', height: 4 },
    { N: 2, expression: '1/(16*pi)', latex: '\\frac{1}{16\\pi}', height: 16 },
    {
      N: 3,
      expression: '1/64 - 3/(64*pi)',
      latex: '\\frac{1}{64} - \\frac{3}{64\\pi}',
      height: 64,
    },
    {
      N: 4,
      expression: '-1/1024 + 5/(512*pi^2)',
      latex: '-\\frac{1}{1024} + \\frac{5}{512\\pi^{2}}',
      height: 1024,
    },
  ];
  it.each(published)('finds Z($N) of the line kernel from 40 digits', (row) => {
    const v = Z[row.N - 1]!;
    const r = recognize(v, rel(40)(v), piBasis);
    expect(r).toMatchObject({ expression: row.expression, latex: row.latex, height: row.height });
    if ('none' in r) throw new Error(r.none);
    // 40 digits less (n + 1) log10 H, rounded down
    expect(r.digitsToSpare).toBe(Math.floor(40 - 5 * Math.log10(row.height)));
    expect(r.digitsToSpare).toBeGreaterThan(10);
  });

  const s2 = sqrt(fromInt(2), P);
  const s5 = sqrt(fromInt(5), P);
  const algebraic = [
    {
      name: 'sqrt 2',
      value: s2,
      basis: [
        ['1', ONE],
        ['sqrt(2)', s2],
      ],
      expression: 'sqrt(2)',
    },
    {
      name: '2 sqrt(2)/3 = sqrt(8)/3',
      value: div(sqrt(fromInt(8), P), fromInt(3), P),
      basis: [
        ['1', ONE],
        ['sqrt(2)', s2],
      ],
      expression: '2*sqrt(2)/3',
    },
    {
      name: 'golden ratio',
      value: div(add(ONE, s5, P), fromInt(2), P),
      basis: [
        ['1', ONE],
        ['sqrt(5)', s5],
      ],
      expression: '1/2 + sqrt(5)/2',
    },
    {
      name: 'a basis text that needs parentheses',
      value: mul(fromInt(3), add(ONE, s2, P), P),
      basis: [
        ['1 + sqrt(2)', add(ONE, s2, P)],
        ['pi', p],
      ],
      expression: '3*(1 + sqrt(2))',
    },
  ] as const;
  it.each(algebraic)('$name', ({ value, basis, expression }) => {
    const b = basis.map(([text, v]) => ({ text, value: v }));
    expect(recognize(value, 1e-40, b)).toMatchObject({ expression });
  });

  it('refuses every pseudorandom 30-digit value (no spurious relations)', () => {
    let seed = 20240607n;
    for (let i = 0; i < 40; i++) {
      seed = (seed * 6364136223846793005n + 1442695040888963407n) % 2n ** 64n;
      const v = div(new Real(seed % 10n ** 30n, 0), fromInt(10n ** 30n), P);
      const r = recognize(v, rel(30)(v), piBasis);
      // 30 digits less the margin 10 over 5 slots: height 10^4
      expect(r).toEqual({ none: 'no relation of height <= 10000 at this precision' });
    }
  });

  // a relation of height about 10^6: 999983 x = 123457 - 654321/pi
  const h6 = div(sub(fromInt(123457), mul(fromInt(654321), ip, P), P), fromInt(999983), P);
  const h6Basis = piBasis.slice(0, 2);
  it('does not accept a height-10^6 relation from 12 digits', () => {
    expect('none' in recognize(h6, rel(12)(h6), h6Basis)).toBe(true);
  });
  it('without the margin, 12 digits already admit a spurious relation (why the margin exists)', () => {
    const r = findRelation(h6, rel(12)(h6), h6Basis, { margin: 0 });
    // of height < 10^4 = 10^(12/3), and not the true one
    expect(r).toMatchObject({ digitsToSpare: 0 });
    if ('none' in r) throw new Error(r.none);
    expect(r.height).toBeLessThan(1e4);
    expect(r.relation).not.toEqual([999983n, -123457n, 654321n]);
  });
  it('accepts the same relation from 40 digits, with 40 - 3 log10(999983) to spare', () => {
    const r = findRelation(h6, rel(40)(h6), h6Basis);
    expect(r).toEqual({
      relation: [999983n, -123457n, 654321n],
      height: 999983,
      digitsToSpare: 22,
    });
  });

  it("a float64 value of Z(4) does not 'find' its relation", () => {
    const f = fromNumber(toNumber(Z[3]!));
    for (const error of [1e-16, 1e-16 * toNumber(f)]) {
      const r = recognize(f, error, piBasis);
      expect(r).toHaveProperty('none');
      expect((r as { none: string }).none).toMatch(
        /no relation of height <= \d+ at this precision/,
      );
    }
  });

  it('states why there is none when the digits do not even cover the margin', () => {
    expect(recognize(Z[0]!, 1e-9, piBasis)).toEqual({
      none: 'the value has 8.4 digits, fewer than the margin of 10',
    });
  });

  it('reports a basis related among itself', () => {
    const r = recognize(p, 1e-40, [
      { text: '1', value: ONE },
      { text: '1/2', value: div(ONE, fromInt(2), P) },
    ]);
    expect(r).toEqual({ none: 'the basis is itself related: 1 - 2/2 = 0' });
  });

  it('honours opts.maxHeight', () => {
    const v = Z[3]!;
    // PSLQ meets the height-1024 relation, above the cap: reported, not accepted
    expect(recognize(v, rel(40)(v), piBasis, { maxHeight: 1000 })).toEqual({
      none: 'no relation of height <= 1000 at this precision was found (the only one detected is higher)',
    });
    expect(recognize(v, rel(40)(v), piBasis, { maxHeight: 1024 })).toMatchObject({ height: 1024 });
  });

  it('property: random small integer combinations of the basis are found exactly', () => {
    let seed = 777;
    const rand = (k: number): number => {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      return (seed % (2 * k + 1)) - k;
    };
    const e = exp(ONE, P);
    const basis = [...piBasis.slice(0, 3), { text: 'exp(1)', value: e }];
    for (let trial = 0; trial < 30; trial++) {
      const c0 = 1 + Math.abs(rand(30));
      const c = basis.map(() => rand(30));
      if (c.every((v) => v === 0)) continue;
      let sum = ZERO;
      basis.forEach((b, i) => (sum = add(sum, mul(fromInt(c[i]!), b.value, P), P)));
      const v = div(sum, fromInt(c0), P);
      const r = findRelation(v, rel(45)(v), basis);
      const g = [c0, ...c].reduce((a, b) => gcdInt(a, Math.abs(b)), 0);
      const expected = [c0, ...c.map((k) => -k)].map((k) => BigInt(k / g));
      expect(r).toMatchObject({ relation: expected });
    }
  });
});

function gcdInt(a: number, b: number): number {
  while (b) [a, b] = [b, a % b];
  return a;
}
