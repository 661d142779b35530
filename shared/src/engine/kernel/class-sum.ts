/**
 * The exact class sum Z(n) = sum over cycle types of eps * prod_L Z_L^(m_L) / z for rational
 * weights Z_L = a_L / b_L, streamed: one walk over the cycle types, never holding the rows.
 *
 * Along the walk three integers are carried: A = prod a_L^(m_L), Q = C / prod b_L^(m_L) with
 * C = prod_L b_L^(floor(n/L)), and the class size n!/z. Every leaf adds eps * A * size * Q to a
 * running numerator over the common denominator C * n!, so the total is one reduction at the end.
 */
import { gcdBig } from './gcd.js';
import { foldCycleTypes, type CycleTypeVisit } from './cycle-types.js';

/** A rational number as numerator and positive denominator (need not be reduced). */
export interface RationalParts {
  readonly num: bigint;
  readonly den: bigint;
}

/** One row of a class table, as the walk passes it. */
export interface ClassRow {
  readonly visit: CycleTypeVisit;
  /** eps * prod Z_L^(m_L) / z, reduced */
  readonly contribution: RationalParts;
}

export interface ClassSumInput {
  /** Z_1..Z_n */
  readonly weights: readonly RationalParts[];
  readonly n: number;
  /** -1 fermions (class sign (-1)^(n - cycles)), +1 bosons */
  readonly sign: 1 | -1;
  /** called with every row when given (rows are reduced only then) */
  readonly onRow?: (row: ClassRow) => void;
}

/** Reduced form of num/den with den > 0. */
export function reduceRational(num: bigint, den: bigint): RationalParts {
  if (den < 0n) {
    num = -num;
    den = -den;
  }
  if (num === 0n) return { num: 0n, den: 1n };
  const g = gcdBig(num, den);
  return g === 1n ? { num, den } : { num: num / g, den: den / g };
}

interface WalkState {
  readonly a: bigint;
  readonly q: bigint;
  /** prod b_L^(m_L), only tracked when rows are wanted */
  readonly b: bigint;
}

/** The class sum Z(n) (reduced) for rational weights, streaming the rows to onRow if given. */
export function classSumRational(input: ClassSumInput): RationalParts {
  const { n, sign, onRow } = input;
  const w = input.weights.slice(0, n).map((x) => reduceRational(x.num, x.den));
  if (w.length < n) throw new RangeError(`classSumRational needs ${n} weights, got ${w.length}`);
  let common = 1n;
  for (let L = 1; L <= n; L++) common *= w[L - 1]!.den ** BigInt(Math.floor(n / L));
  let factorial = 1n;
  for (let i = 2; i <= n; i++) factorial *= BigInt(i);
  let total = 0n;
  const track = onRow !== undefined;
  foldCycleTypes<WalkState>(
    n,
    { a: 1n, q: common, b: 1n },
    (s, L) => {
      const x = w[L - 1]!;
      return { a: s.a * x.num, q: s.q / x.den, b: track ? s.b * x.den : 1n };
    },
    (s, visit) => {
      const eps = sign === -1 ? visit.sign : 1;
      const term = s.a * visit.size * s.q;
      total += eps === 1 ? term : -term;
      if (onRow) {
        // contribution = eps * A / (B * z) with z = n!/size
        const z = factorial / visit.size;
        onRow({ visit, contribution: reduceRational(eps === 1 ? s.a : -s.a, s.b * z) });
      }
    },
  );
  return reduceRational(total, common * factorial);
}
