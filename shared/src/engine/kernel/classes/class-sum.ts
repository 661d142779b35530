/**
 * The exact class sum Z(n) = sum over cycle types of eps * prod_L Z_L^(m_L) / z for rational
 * weights Z_L = a_L / b_L, streamed: one walk over the cycle types, never holding the rows.
 *
 * Along the walk three integers are carried: A = prod a_L^(m_L), Q = C / prod b_L^(m_L) with
 * C = prod_L b_L^(floor(n/L)), and the class size n!/z; the total is a running numerator over the
 * common denominator C * n!, so it is one reduction at the end. The cycles of length <= 4 are
 * summed by a table (short-cycles.ts) where the walk has decided the longer ones.
 */
import { factorial, gcd } from '../../integers.js';
import type { CycleTypeVisit } from './cycle-types.js';
import { shortCycleTable } from './short-cycles.js';

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
   * called with every cycle type, its contribution eps * prod Z_L^(m_L) / z reduced (rows are
   * reduced only when this is given) and its exponent notation as JSON pairs ("[1,2],[3,1]");
   * the visit and the contribution are reused: copy what you keep
   */
  readonly onRow?: (visit: CycleTypeVisit, contribution: RationalParts, pairs: string) => void;
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

/** Per cycle length L and multiplicity k: the row factor (eps Z_L)^k / (L^k k!), reduced. */
interface LevelTables {
  /** reduced numerators, the class sign included for fermions */
  readonly num: readonly bigint[][];
  readonly den: readonly bigint[][];
  /** `[L,k]` and `[L,k],`: the exponent-notation pairs of a row's JSON text */
  readonly pair: readonly string[][];
  readonly pairComma: readonly string[][];
}

function levelTables(w: readonly RationalParts[], n: number, sign: 1 | -1): LevelTables {
  const num: bigint[][] = [[]];
  const den: bigint[][] = [[]];
  const pair: string[][] = [[]];
  const pairComma: string[][] = [[]];
  for (let L = 1; L <= n; L++) {
    const x = w[L - 1]!;
    const flip = sign === -1 && L % 2 === 0;
    const nums = [1n];
    const dens = [1n];
    const texts = [''];
    const commas = [''];
    let a = 1n;
    let b = 1n;
    for (let k = 1; k * L <= n; k++) {
      a *= flip ? -x.num : x.num;
      b *= x.den * BigInt(L * k);
      const r = reduceRational(a, b);
      nums.push(r.num);
      dens.push(r.den);
      texts.push(`[${L},${k}]`);
      commas.push(`[${L},${k}],`);
    }
    num.push(nums);
    den.push(dens);
    pair.push(texts);
    pairComma.push(commas);
  }
  return { num, den, pair, pairComma };
}

/** Cycle lengths summed by the short-cycle table instead of walked (for the total). */
const SHORT_CYCLES = 4;

/**
 * The class sum Z(n) (reduced) for rational weights, streaming the rows to onRow if given.
 *
 * One depth-first walk in the order of foldCycleTypes. For the total it decides the cycles longer
 * than SHORT_CYCLES, carrying a, q and the class size as described above, and multiplies by the
 * short-cycle table (short-cycles.ts) where only short cycles are left. Rows go on to the leaves:
 * a row's reduced contribution is the product of its levels' reduced factors (levelTables), with
 * one gcd only when that product's numerator is not +-1, and its cycle type in exponent notation
 * is built as text along the walk (one concatenation per level).
 */
export function classSumRational(input: ClassSumInput): RationalParts {
  const { n, sign, onRow } = input;
  if (!Number.isInteger(n) || n < 0)
    throw new RangeError(`n must be a non-negative integer, got ${n}`);
  const w = input.weights.slice(0, n).map((x) => reduceRational(x.num, x.den));
  if (w.length < n) throw new RangeError(`classSumRational needs ${n} weights, got ${w.length}`);
  const nFact = factorial(n);
  if (n === 0) {
    onRow?.({ n, m: new Int32Array(1), parts: 0, size: 1n, sign: 1 }, { num: 1n, den: 1n }, '');
    return { num: 1n, den: 1n };
  }
  let common = 1n;
  for (let L = 1; L <= n; L++) common *= w[L - 1]!.den ** BigInt(Math.floor(n / L));
  const short = shortCycleTable(w, n, Math.min(n, SHORT_CYCLES), sign);
  const tables = onRow ? levelTables(w, n, sign) : null;
  const factorials = [1n];
  for (let k = 1; k <= n; k++) factorials.push(factorials[k - 1]! * BigInt(k));
  // lk[L][k] = L k: the class size divides by it at the k-th cycle of length L
  const lk: bigint[][] = [];
  for (let L = 0; L <= n; L++)
    lk.push(Array.from({ length: L === 0 ? 0 : Math.floor(n / L) + 1 }, (_, k) => BigInt(L * k)));
  /** x * f without a new BigInt when f is +-1 */
  const times = (x: bigint, f: bigint): bigint => (f === 1n ? x : f === -1n ? -x : x * f);
  const m = new Int32Array(n + 1);
  const visit = { n, m, parts: 0, size: 0n, sign: 1 as 1 | -1 };
  const row = { num: 0n, den: 1n };
  let total = 0n;
  // the long cycles decided (a, q, size as above, `parts` cycles on n - rest points): add the
  // sum over every way to fill `rest` with short cycles
  const addShort = (rest: number, parts: number, a: bigint, q: bigint, size: bigint): void => {
    const u = short.U[rest]!;
    if (u === 0n || a === 0n) return;
    const term = a * (q / short.beta[rest]!) * (size / factorials[rest]!) * u;
    total += sign === -1 && (n - rest - parts) % 2 !== 0 ? -term : term;
  };
  const leaf = (
    rest: number,
    parts: number,
    size: bigint,
    A: bigint,
    D: bigint,
    pairs: string,
  ): void => {
    const t = tables!;
    m[1] = rest;
    visit.parts = parts + rest;
    visit.size = rest > 1 ? size / factorials[rest]! : size;
    visit.sign = (n - parts - rest) % 2 === 0 ? 1 : -1;
    let num = rest > 0 ? times(A, t.num[1]![rest]!) : A;
    let den = rest > 0 ? D * t.den[1]![rest]! : D;
    if (num === 0n) den = 1n;
    else if (num !== 1n && num !== -1n) {
      const g = gcd(num, den);
      if (g !== 1n) {
        num /= g;
        den /= g;
      }
    }
    row.num = num;
    row.den = den;
    const text =
      rest === 0 ? pairs : pairs === '' ? t.pair[1]![rest]! : t.pairComma[1]![rest]! + pairs;
    onRow!(visit, row, text);
    m[1] = 0;
  };
  // walk(L, ...): decide m_L..m_1 for the remaining `rest`; q = 0 once the short-cycle table has
  // counted the total below this point (the walk goes on for the rows only)
  const walk = (
    L: number,
    rest: number,
    parts: number,
    a: bigint,
    q: bigint,
    size: bigint,
    A: bigint,
    D: bigint,
    pairs: string,
  ): void => {
    // lengths above what is left have multiplicity 0: go straight to the longest possible one
    if (L > rest) L = Math.max(rest, 1);
    if (q !== 0n && L <= short.G) {
      addShort(rest, parts, a, q, size);
      if (!tables) return;
      q = 0n;
    }
    if (L === 1) return leaf(rest, parts, size, A, D, pairs);
    const t = tables;
    const x = w[L - 1]!;
    const divisors = lk[L]!;
    walk(L - 1, rest, parts, a, q, size, A, D, pairs);
    for (let k = 1; k * L <= rest; k++) {
      if (q !== 0n) {
        a *= x.num;
        if (x.den !== 1n) q /= x.den;
      }
      size /= divisors[k]!;
      m[L] = k;
      if (t) {
        const p = pairs === '' ? t.pair[L]![k]! : t.pairComma[L]![k]! + pairs;
        walk(
          L - 1,
          rest - k * L,
          parts + k,
          a,
          q,
          size,
          times(A, t.num[L]![k]!),
          D * t.den[L]![k]!,
          p,
        );
      } else walk(L - 1, rest - k * L, parts + k, a, q, size, A, D, pairs);
    }
    m[L] = 0;
  };
  walk(n, n, 0, 1n, common, nFact, 1n, 1n, '');
  return reduceRational(total, common * nFact);
}
