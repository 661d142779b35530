/**
 * The exact class sum Z(n) = sum over cycle types of eps * prod_L Z_L^(m_L) / z for rational
 * weights Z_L = a_L / b_L, streamed: one walk over the cycle types, never holding the rows.
 *
 * Along the walk three integers are carried: A = prod a_L^(m_L), Q = C / prod b_L^(m_L) with
 * C = prod_L b_L^(floor(n/L)), and the class size n!/z. Every leaf adds eps * A * size * Q to a
 * running numerator over the common denominator C * n!, so the total is one reduction at the end.
 */
import { factorial, gcd } from '../../integers.js';
import { foldCycleTypes, type CycleTypeVisit } from './cycle-types.js';

/** A rational number as numerator and positive denominator (need not be reduced). */
export interface RationalParts {
  readonly num: bigint;
  readonly den: bigint;
}

export interface ClassSumInput {
  /** Z_1..Z_n */
  readonly weights: readonly RationalParts[];
  readonly n: number;
  /** -1 fermions (class sign (-1)^(n - cycles)), +1 bosons */
  readonly sign: 1 | -1;
  /**
   * called with every cycle type and its contribution eps * prod Z_L^(m_L) / z, reduced (rows
   * are reduced only when this is given); the visit is reused: copy what you keep
   */
  readonly onRow?: (visit: CycleTypeVisit, contribution: RationalParts) => void;
}

/** Reduced form of num/den with den > 0. */
export function reduceRational(num: bigint, den: bigint): RationalParts {
  if (den < 0n) {
    num = -num;
    den = -den;
  }
  if (num === 0n) return { num: 0n, den: 1n };
  const g = gcd(num, den);
  return g === 1n ? { num, den } : { num: num / g, den: den / g };
}

interface WalkState {
  readonly a: bigint;
  readonly q: bigint;
  /** prod (b_L L)^(m_L) m_L!, the row's denominator: only tracked when rows are wanted */
  readonly d: bigint;
}

/** The class sum Z(n) (reduced) for rational weights, streaming the rows to onRow if given. */
export function classSumRational(input: ClassSumInput): RationalParts {
  const { n, sign, onRow } = input;
  const w = input.weights.slice(0, n).map((x) => reduceRational(x.num, x.den));
  if (w.length < n) throw new RangeError(`classSumRational needs ${n} weights, got ${w.length}`);
  let common = 1n;
  for (let L = 1; L <= n; L++) common *= w[L - 1]!.den ** BigInt(Math.floor(n / L));
  const rowFactor = w.map((x, t) => x.den * BigInt(t + 1));
  // powers for the last level (k cycles of length 1 at once)
  const w1 = w[0]!;
  const a1 = [1n];
  const b1 = [1n];
  const d1 = [1n];
  for (let k = 1; k <= n; k++) {
    a1.push(a1[k - 1]! * w1.num);
    b1.push(b1[k - 1]! * w1.den);
    d1.push(d1[k - 1]! * w1.den * BigInt(k));
  }
  let total = 0n;
  const track = onRow !== undefined;
  foldCycleTypes<WalkState>(
    n,
    { a: 1n, q: common, d: 1n },
    (s, L, k) => {
      const x = w[L - 1]!;
      const d = track ? s.d * rowFactor[L - 1]! * BigInt(k) : 1n;
      return { a: s.a * x.num, q: x.den === 1n ? s.q : s.q / x.den, d };
    },
    (s, visit) => {
      const eps = sign === -1 ? visit.sign : 1;
      const term = s.a * visit.size * s.q;
      total += eps === 1 ? term : -term;
      if (onRow) onRow(visit, reduceRational(eps === 1 ? s.a : -s.a, s.d));
    },
    (s, k) => ({
      a: s.a * a1[k]!,
      q: w1.den === 1n ? s.q : s.q / b1[k]!,
      d: track ? s.d * d1[k]! : 1n,
    }),
  );
  return reduceRational(total, common * factorial(n));
}
