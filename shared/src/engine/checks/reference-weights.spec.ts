import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { ser } from '../test-helpers.js';
import { impliedReferenceWeights } from './reference-weights.js';

const ORDER = '12';
const ring = { variable: 'q', cap: new Fraction(ORDER), nMax: 4 };
/** (q;q)_N as a product expression (DLMF 17.2.1). */
const poch = (N: number) =>
  Array.from({ length: N }, (_, k) => `(1 - q^${k + 1})`).join('*') || '1';
/** The trap's cycle weights Z_L = q^(L/2)/(1-q^L), L = 1..4. */
const trapWeights = [1, 2, 3, 4].map((L) => ser(`q^(${L}/2)/(1 - q^${L})`, ORDER));
/**
 * Canonical rows of the trap. Fermions: Z(N) = q^(N^2/2)/(q;q)_N, from Euler's identity
 * prod_k (1 + z q^(k+1/2)) = sum_N z^N q^(N^2/2)/(q;q)_N; bosons: Z(N) = q^(N/2)/(q;q)_N, from
 * prod_k 1/(1 - z q^(k+1/2)) = sum_N z^N q^(N/2)/(q;q)_N (DLMF 17.5, Euler's two identities).
 */
const trapRow = (N: number, fermion: boolean) => ({
  N,
  value: `q^(${fermion ? N * N : N}/2)/(${poch(N)})`,
  field: `line ${N + 1}`,
});

describe('impliedReferenceWeights', () => {
  it('recovers the trap weights from its fermion table, to the order of the rows', () => {
    const rows = [0, 1, 2, 3, 4].map((N) => trapRow(N, true));
    const out = impliedReferenceWeights(trapWeights, '1', rows, ring, true);
    expect(out.map((w) => [w.L, w.agrees, w.agreesBelow])).toEqual([
      [1, true, ORDER],
      [2, true, ORDER],
      [3, true, ORDER],
      [4, true, ORDER],
    ]);
    // Z_2 = q/(1-q^2) = q + q^3 + q^5 + ... + O(q^12): the implied value itself, shown beside.
    expect(out[1]!.implied).toEqual({
      order: ORDER,
      terms: [1, 3, 5, 7, 9, 11].map((e) => [String(e), '1']),
    });
  });

  it('divides the normalization out first, and reads a boson table with s = +1', () => {
    // The table as normalization(N) * Z(N) with normalization q^(-N/2): rows 1/(q;q)_N.
    const rows = [1, 2, 3].map((N) => ({ N, value: `1/(${poch(N)})`, field: `line ${N}` }));
    const out = impliedReferenceWeights(trapWeights, 'q^(-N/2)', rows, ring, false);
    expect(out.map((w) => w.agrees)).toEqual([true, true, true]);
    // The same rows read as fermions imply other weights: the sign s matters.
    const asFermions = impliedReferenceWeights(trapWeights, 'q^(-N/2)', rows, ring, true);
    expect(asFermions[1]!.agrees).toBe(false);
  });

  it('leaves Z_L not determined from the first missing row on', () => {
    const rows = [1, 2, 4].map((N) => trapRow(N, true));
    const out = impliedReferenceWeights(trapWeights, '1', rows, ring, true);
    expect(out.map((w) => w.agrees)).toEqual([true, true, null, null]);
    expect(out[2]).toMatchObject({ L: 3, determined: false, agreesBelow: null });
    expect(out[2]!.implied).toBeUndefined();
  });

  it('marks the weight a wrong row implies as differing, at the exponent it first differs', () => {
    // Z(2) = q^2/((1-q)(1-q^2)) = q^2 + q^3 + 2q^4 + ...; the row says 3q^4.
    const rows = [trapRow(1, true), { N: 2, value: `q^2 + q^3 + 3*q^4 + O(q^5)`, field: 'line 2' }];
    const out = impliedReferenceWeights(trapWeights, '1', rows, ring, true);
    expect(out[0]!.agrees).toBe(true);
    // 2 Z(2) = Z_1^2 - Z_2 (s = -1): one more q^4 in Z(2) is two fewer in Z_2.
    expect(out[1]).toMatchObject({
      agrees: false,
      firstMismatch: { exponent: '4', computed: '0', supplied: '-2' },
    });
    // The row is known to O(q^5), so the implied Z_2 is too: the order is honest.
    expect(out[1]!.implied!.order).toBe('5');
  });
});
