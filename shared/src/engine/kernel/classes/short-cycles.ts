/**
 * The part of a class sum that comes from the short cycles, as a table: for every r <= n, the sum
 * over the cycle types of S_r with cycle lengths <= G of eps * prod_(l<=G) Z_l^(m_l) / z, scaled
 * to an integer. The class sum's walk decides the long cycles and multiplies by this table instead
 * of visiting every leaf (common practice: the sum over the last levels depends only on what is
 * left, r).
 */
import type { RationalParts } from './class-sum.js';

/** The table for cycle lengths <= G and the scale of its entries. */
export interface ShortCycleTable {
  readonly G: number;
  /** beta[r] = prod_(l<=G) b_l^(floor(r/l)) */
  readonly beta: readonly bigint[];
  /** U[r] = beta[r] r! T(r) with T(r) the sum above: an integer */
  readonly U: readonly bigint[];
}

/**
 * U_l(r) = sum_k (eps_l a_l)^k b_l^(floor(r/l) - k) r! / ((r - lk)! l^k k!)
 * beta_(l-1)(r) / beta_(l-1)(r - lk) U_(l-1)(r - lk), from U_0(r) = [r = 0]; weights reduced
 * a_l / b_l (b_l > 0), eps_l = (-1)^(l-1) for fermions (sign -1), 1 for bosons.
 */
export function shortCycleTable(
  w: readonly RationalParts[],
  n: number,
  G: number,
  sign: 1 | -1,
): ShortCycleTable {
  const fact = [1n];
  for (let k = 1; k <= n; k++) fact.push(fact[k - 1]! * BigInt(k));
  let beta: bigint[] = new Array<bigint>(n + 1).fill(1n);
  let U: bigint[] = Array.from({ length: n + 1 }, (_, r) => (r === 0 ? 1n : 0n));
  for (let l = 1; l <= G; l++) {
    const { num: a0, den: b } = w[l - 1]!;
    const a = sign === -1 && l % 2 === 0 ? -a0 : a0;
    const nextBeta = beta.map((x, r) => x * b ** BigInt(Math.floor(r / l)));
    const next: bigint[] = [];
    for (let r = 0; r <= n; r++) {
      const top = Math.floor(r / l);
      let s = 0n;
      let ak = 1n;
      let lk = 1n;
      for (let k = 0; k <= top; k++) {
        if (k > 0) {
          ak *= a;
          lk *= BigInt(l * k);
        }
        const rest = r - l * k;
        if (U[rest] === 0n) continue;
        const ways = fact[r]! / (fact[rest]! * lk);
        s += ak * b ** BigInt(top - k) * ways * (beta[r]! / beta[rest]!) * U[rest]!;
      }
      next.push(s);
    }
    beta = nextBeta;
    U = next;
  }
  return { G, beta, U };
}
