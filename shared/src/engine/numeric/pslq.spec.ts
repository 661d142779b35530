import { describe, expect, it } from 'vitest';
import { exp, ln2, log, pi } from './elementary.js';
import { integerRelation, normaliseRelation, relationSearch } from './pslq.js';
import { add, bitsFor, div, fromInt, mul, neg, ONE, Real, sqrt, sub, ZERO } from './real.js';

const P = 400;
const PREC = bitsFor(40, 0); // inputs known to 40 digits
const p = pi(P);
const ip = div(ONE, p, P);
const powers = (x: Real, k: number): Real[] => {
  const out = [ONE];
  for (let i = 1; i <= k; i++) out.push(mul(out[i - 1]!, x, P));
  return out;
};
const s23 = add(sqrt(fromInt(2), P), sqrt(fromInt(3), P), P);
const phi = div(add(ONE, sqrt(fromInt(5), P), P), fromInt(2), P);
const z3 = div(sub(p, fromInt(3), P), mul(fromInt(64), p, P), P);

describe('integerRelation (PSLQ)', () => {
  const cases: { name: string; x: Real[]; expected: bigint[] }[] = [
    // Hatsuda-Moriyama-Okuyama 2012 (SOURCES.md): Z(3) = (pi - 3)/(64 pi), so 64 Z - 1 + 3/pi = 0
    {
      name: 'Z(3) of the line kernel',
      x: [z3, ...powers(ip, 3)],
      expected: [64n, -1n, 3n, 0n, 0n],
    },
    // minimal polynomial of sqrt 2 + sqrt 3 is x^4 - 10 x^2 + 1 (common practice)
    { name: 'sqrt2 + sqrt3, degree 4', x: powers(s23, 4), expected: [1n, 0n, -10n, 0n, 1n] },
    // golden ratio: phi^2 = phi + 1
    { name: 'golden ratio', x: powers(phi, 2), expected: [1n, 1n, -1n] },
    // log 6 = log 2 + log 3
    {
      name: 'logarithms',
      x: [ln2(P), log(fromInt(3), P), log(fromInt(6), P)],
      expected: [1n, 1n, -1n],
    },
    // a relation of height 10^5 between two numbers: 99991 * x = 12345 (x rational)
    {
      name: 'a rational with a large denominator',
      x: [div(fromInt(12345), fromInt(99991), P), ONE],
      expected: [99991n, -12345n],
    },
  ];
  it.each(cases)('$name', ({ x, expected }) => {
    expect(integerRelation(x, PREC, 1e6)).toEqual(expected);
  });

  it('normalises the sign: first non-zero coefficient positive', () => {
    expect(integerRelation([neg(z3), ...powers(ip, 3)], PREC, 1e6)).toEqual([64n, 1n, -3n, 0n, 0n]);
    expect(normaliseRelation([0n, -4n, 6n])).toEqual([0n, 2n, -3n]);
  });

  it('an input that is zero within its precision is the unit relation', () => {
    expect(integerRelation([p, ZERO, ONE], PREC, 10)).toEqual([0n, 1n, 0n]);
  });

  it('proves the absence of small relations by the norm bound', () => {
    // 1, pi, e: no integer relation is known; at 40 digits none of height <= 10^4 exists
    const r = relationSearch([ONE, p, exp(ONE, P)], PREC, 1e4);
    expect(r.relation).toBeNull();
    expect(r.outcome).toBe('bound');
    expect(r.normBound).toBeGreaterThan(1e4 * Math.sqrt(3));
  });

  it('stops at the iteration cap', () => {
    const r = relationSearch(powers(s23, 4), PREC, 1e6, { maxIterations: 2 });
    expect(r).toMatchObject({ relation: null, outcome: 'iterations', iterations: 2 });
  });

  it('reports a detected relation beyond maxHeight as such, not as found', () => {
    const r = relationSearch([div(fromInt(12345), fromInt(99991), P), ONE], PREC, 1000);
    expect(r.relation).toBeNull();
    expect(['height', 'bound']).toContain(r.outcome);
  });

  it('property: random small combinations of 1, 1/pi, 1/pi^2, 1/pi^3 are found', () => {
    let seed = 12345;
    const rand = (k: number): number => {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      return (seed % (2 * k + 1)) - k;
    };
    const basis = powers(ip, 3);
    for (let trial = 0; trial < 25; trial++) {
      const c0 = BigInt(1 + Math.abs(rand(40)));
      const c = basis.map(() => BigInt(rand(40)));
      if (c.every((v) => v === 0n)) continue;
      let sum = ZERO;
      basis.forEach((b, i) => (sum = add(sum, mul(fromInt(c[i]!), b, P), P)));
      const value = div(sum, fromInt(c0), P);
      const expected = normaliseRelation([c0, ...c.map((v) => -v)]);
      expect(integerRelation([value, ...basis], PREC, 1e4)).toEqual(expected);
    }
  });
});
