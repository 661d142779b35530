// Canonical tables for the large-N specs (not exported from the package).
import Fraction from 'fraction.js';
import { newtonRecursion } from '../canonical/recursion.js';
import { inverse, mul, shift } from '../series/arith.js';
import { Series } from '../series/series.js';
import { type GasSpec, parseGasSpec } from '../spec/schema.js';
import { gas } from '../test-helpers.js';
import { cycleWeights } from '../weights.js';
import { frac } from '../rational.js';

/** The canonical table of a gas spec by the Newton recursion, with the parsed spec. */
export function table(over: Record<string, unknown>): { Z: Series[]; spec: GasSpec } {
  const spec = parseGasSpec(gas(over));
  const cap = spec.order == null ? null : new Fraction(spec.order);
  const w = cycleWeights(spec, { variable: spec.variable, cap, nMax: spec.nMax, tick: () => {} });
  const Z = newtonRecursion(w.weights, spec.nMax, spec.statistics === 'fermion', cap, () => {});
  return { Z, spec };
}

/** (q;q)_N as an exact polynomial. */
export function qpochPoly(N: number): Series {
  let p = Series.constant(frac(1));
  for (let j = 1; j <= N; j++) {
    p = mul(p, Series.of(frac(1), 0, [1n, ...new Array<bigint>(j - 1).fill(0n), -1n], 1n, null));
  }
  return p;
}

/**
 * Harmonic-trap fermion rows Z(N) = q^(N^2/2) / (q;q)_N (Andrews, Theory of Partitions, Cor. 2.2)
 * with `terms` coefficients known in every normalized row: built directly, not by the recursion.
 */
export function trapRows(nMax: number, terms: number): Series[] {
  const Z: Series[] = [Series.constant(frac(1))];
  for (let N = 1; N <= nMax; N++) {
    Z.push(shift(inverse(qpochPoly(N), frac(terms)), frac(N * N, 2)));
  }
  return Z;
}
