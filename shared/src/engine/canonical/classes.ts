import Fraction from 'fraction.js';
import { frac } from '../rational.js';
import { add, mul, powInt, scale } from '../series/arith.js';
import { Series } from '../series/series.js';

/** One row of a class table: a cycle type of S_N, its class size N!/z, sign and contribution. */
export interface ClassRow {
  N: number;
  /** Exponent notation [[L, m_L], ...], L ascending: (1)(1)(2) is [[1, 2], [2, 1]]. */
  cycleType: [number, number][];
  /** N!/z_lambda as a decimal string. */
  size: string;
  /** (-1)^(N - number of cycles) for fermions, +1 for bosons. */
  sign: 1 | -1;
  /** sign * prod_L Z_L^(m_L) / z_lambda. */
  contribution: Series;
}

/**
 * Class sum Z(N) = sum_lambda eps_lambda prod_L Z_L^(m_L) / z_lambda for one N, calling `onRow` per
 * cycle type (rows are not kept). Powers Z_L^m are cached; partial products follow the
 * enumeration so each partition costs about one multiplication.
 */
export function classSum(
  N: number,
  weights: readonly Series[],
  fermion: boolean,
  cap: Fraction | null,
  onRow?: (row: ClassRow) => void,
  tick?: () => void,
): Series {
  const nFact = (() => {
    let f = 1n;
    for (let i = 2; i <= N; i++) f *= BigInt(i);
    return f;
  })();
  const powers = new Map<number, Series>();
  const power = (L: number, m: number): Series => {
    const key = L * 1024 + m;
    let p = powers.get(key);
    if (!p) {
      p = powInt(weights[L - 1]!, m, cap);
      powers.set(key, p);
    }
    return p;
  };
  let total = Series.constant(frac(0));
  let count = 0;
  const path: [number, number][] = [];
  const walk = (rest: number, maxPart: number, z: bigint, cycles: number, prod: Series): void => {
    if (rest === 0) {
      const sign: 1 | -1 = fermion && (N - cycles) % 2 === 1 ? -1 : 1;
      const contribution = scale(prod, new Fraction(BigInt(sign), z));
      total = add(total, contribution);
      if (onRow) {
        const cycleType = path.slice().reverse() as [number, number][];
        onRow({ N, cycleType, size: (nFact / z).toString(), sign, contribution });
      }
      if (++count % 512 === 0) tick?.();
      return;
    }
    for (let L = Math.min(rest, maxPart); L >= 1; L--) {
      let zz = z;
      for (let m = 1; m * L <= rest; m++) {
        zz *= BigInt(L) * BigInt(m);
        path.push([L, m]);
        walk(rest - m * L, L - 1, zz, cycles + m, mul(prod, power(L, m), cap));
        path.pop();
      }
    }
  };
  walk(N, N, 1n, 0, Series.constant(frac(1)));
  return total;
}
