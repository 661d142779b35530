import Fraction from 'fraction.js';
import { classSumRational, exponentNotation, foldCycleTypes } from '../kernel/index.js';
import { exactClassRowText } from './class-text.js';
import { factorial } from '../integers.js';
import { frac, numer } from '../rational.js';
import { add, mul, scale } from '../series/arith.js';
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
 * Class sum Z(N) = sum_lambda eps_lambda prod_L Z_L^(m_L) / z_lambda for one N, streaming each
 * cycle type to `onRow` (rows are not kept). Exact rational weights take the kernel's integer
 * route; series weights carry the partial product along the walk (one multiplication per step,
 * cut at `cap`). With exact weights, `onExactText` (when given, it replaces `onRow`) receives each
 * row as its result-format JSON text, written straight from the integers.
 */
export function classSum(
  N: number,
  weights: readonly Series[],
  fermion: boolean,
  cap: Fraction | null,
  onRow?: (row: ClassRow) => void,
  tick?: () => void,
  onExactText?: (text: string) => void,
): Series {
  const w = weights.slice(0, N);
  let count = 0;
  const counted = (): void => {
    if (++count % 512 === 0) tick?.();
  };
  if (w.every((x) => x.isConstant())) {
    const parts = w.map((x) => x.toFraction()).map((f) => ({ num: numer(f), den: f.d }));
    const total = classSumRational({
      weights: parts,
      n: N,
      sign: fermion ? -1 : 1,
      ...(onRow && {
        onRow: (visit, c) => {
          onRow({
            N,
            cycleType: exponentNotation(visit),
            size: visit.size.toString(),
            sign: fermion ? visit.sign : 1,
            contribution: Series.reducedConstant(c.num, c.den),
          });
          counted();
        },
      }),
      ...(onExactText && {
        onRow: (visit, c, pairs) => {
          onExactText(exactClassRowText(visit, fermion ? visit.sign : 1, c.num, c.den, pairs));
          counted();
        },
      }),
    });
    return Series.of(frac(1), 0, [total.num], total.den, null);
  }
  const nFact = factorial(N);
  let total = Series.constant(frac(0));
  foldCycleTypes<Series>(
    N,
    Series.constant(frac(1)),
    (s, L) => mul(s, w[L - 1]!, cap),
    (s, visit) => {
      const sign: 1 | -1 = fermion ? visit.sign : 1;
      const contribution = scale(s, new Fraction(BigInt(sign) * visit.size, nFact));
      total = add(total, contribution);
      if (onRow) {
        onRow({
          N,
          cycleType: exponentNotation(visit),
          size: visit.size.toString(),
          sign,
          contribution,
        });
      }
      counted();
    },
  );
  return total;
}
