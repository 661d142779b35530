import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { newtonTableBig } from './big.js';
import { compressInput, expandResult, findCompression } from './grid-compression.js';
import type { NewtonTableInput } from './types.js';

/** Z_L = t^L / (1 - t^(2L)) cut at t^length: exponents L, 3L, 5L, ... (the harmonic trap in t = q^(1/2)). */
const trap = (nMax: number, length: number): bigint[][] =>
  Array.from({ length: nMax }, (_, t) => {
    const L = t + 1;
    const w = new Array<bigint>(length).fill(0n);
    for (let i = L; i < length; i += 2 * L) w[i] = 1n;
    return w;
  });

describe('findCompression', () => {
  it('the trap in t = q^(1/2) has every exponent of Z_L congruent to L mod 2: g = 2, c = 1', () => {
    const input: NewtonTableInput = {
      weights: trap(6, 40),
      den: 1n,
      nMax: 6,
      sign: -1,
      length: 40,
    };
    expect(findCompression(input)).toEqual({ g: 2, c: 1 });
  });

  it('no compression when exponents 0 and 1 occur in one weight', () => {
    const input: NewtonTableInput = { weights: [[1n, 1n]], den: 1n, nMax: 1, sign: 1, length: 2 };
    expect(findCompression(input)).toBeNull();
  });

  it('Z_L = t^(3L) (monomials) compress with the largest grid and offset c = 3', () => {
    const weights = [1, 2, 3].map((L) => [...new Array<bigint>(3 * L).fill(0n), 1n]);
    const shape = findCompression({ weights, den: 1n, nMax: 3, sign: 1, length: 10 });
    expect(shape).toEqual({ g: 64, c: 3 });
  });
});

describe('compressInput and expandResult', () => {
  it('the compressed run, expanded, is the direct run (random sparse weights on a grid g, offset c)', () => {
    const input = fc
      .record({
        g: fc.integer({ min: 2, max: 4 }),
        c: fc.integer({ min: 0, max: 3 }),
        nMax: fc.integer({ min: 1, max: 5 }),
        length: fc.integer({ min: 1, max: 24 }),
        sign: fc.constantFrom(1 as const, -1 as const),
        den: fc.bigInt({ min: 1n, max: 6n }),
        seeds: fc.array(fc.array(fc.bigInt({ min: -5n, max: 5n }), { maxLength: 8 }), {
          minLength: 5,
          maxLength: 5,
        }),
      })
      .filter(({ g, c }) => c < g);
    fc.assert(
      fc.property(input, ({ g, c, nMax, length, sign, den, seeds }) => {
        // Z_L = t^(cL) U_L(t^g)
        const weights = seeds.map((u, t) => {
          const w = new Array<bigint>(length).fill(0n);
          u.forEach((x, k) => {
            const i = c * (t + 1) + g * k;
            if (i < length) w[i] = x;
          });
          return w;
        });
        const full: NewtonTableInput = { weights, den, nMax, sign, length };
        const direct = newtonTableBig(full);
        const via = expandResult(newtonTableBig(compressInput(full, g, c)), g, c, length);
        expect(via.den).toEqual(direct.den);
        expect(via.num).toEqual(direct.num);
      }),
      { numRuns: 200 },
    );
  });
});
