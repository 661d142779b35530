/**
 * A certificate that the Newton recursion yields integer series, so multi-modular runs can skip the
 * N! * D^N denominator.
 *
 * With a_L = s^(L-1) Z_L the grand function is exp(sum_L a_L kappa^L / L). Over the ring
 * R = Z[t]/(t^n) (torsion-free, with Frobenius lifts t -> t^l) Dwork's lemma says this lies in
 * 1 + kappa R[[kappa]] exactly when a_L = phi_l(a_{L/l}) mod l^(v_l(L)) for every prime l | L,
 * phi_l(t) = t^l (from memory: M. Hazewinkel, Witt vectors. Part 1 (2009), the Dwork lemma;
 * the integer case is the classical necklace congruence, OEIS A000031 for a check).
 */
import { primePowers } from '../../integers.js';

/**
 * True when integer weights Z_1..Z_nMax (coefficient i = exponent i on the grid, below `length`)
 * give integer Z(N) for every N <= nMax by the recursion with sign s.
 */
export function newtonIsIntegral(
  weights: readonly (readonly bigint[])[],
  nMax: number,
  sign: 1 | -1,
  length: number,
): boolean {
  const coeff = (L: number, i: number): bigint => {
    const w = weights[L - 1]!;
    const c = i < w.length ? w[i]! : 0n;
    return sign === -1 && L % 2 === 0 ? -c : c;
  };
  for (let L = 2; L <= nMax; L++) {
    for (const [l, power] of primePowers(L)) {
      const m = BigInt(power);
      const base = L / l;
      for (let i = 0; i < length; i++) {
        const frob = i % l === 0 ? coeff(base, i / l) : 0n;
        if ((coeff(L, i) - frob) % m !== 0n) return false;
      }
    }
  }
  return true;
}
