/**
 * Streaming enumeration of the cycle types of S_n (partitions of n in exponent notation) by a
 * depth-first walk, so that a product over the cycles can be built with one multiplication per
 * step and no list of classes is ever held.
 *
 * Order: cycle lengths are decided from n down to 1, each multiplicity counting up from 0, which
 * lists S_4 as 1^4, 1^2 2, 2^2, 1 3, 4 (the order of Abramowitz & Stegun Table 24.2).
 */

/** One cycle type as seen by a visitor. The arrays are reused: copy what you keep. */
export interface CycleTypeVisit {
  readonly n: number;
  /** m[L] = number of cycles of length L, L = 1..n (m[0] unused) */
  readonly m: Int32Array;
  /** number of cycles */
  readonly parts: number;
  /** class size n!/z, z = prod_L L^(m_L) m_L! */
  readonly size: bigint;
  /** (-1)^(n - parts): the fermion sign of the class */
  readonly sign: 1 | -1;
}

/**
 * Folds a state along the walk: `extend(state, L, k)` turns the state for k-1 cycles of length L
 * into the state for k cycles (one step: multiply by Z_L / (L k), say); `leaf(state, visit)` sees
 * every cycle type once. Returns the number of cycle types (p(n)).
 */
export function foldCycleTypes<S>(
  n: number,
  initial: S,
  extend: (state: S, L: number, k: number) => S,
  leaf: (state: S, visit: CycleTypeVisit) => void,
  /** optional shortcut: the state after k cycles of length 1 in one step (same as k extends) */
  ones?: (state: S, k: number) => S,
): number {
  if (!Number.isInteger(n) || n < 0)
    throw new RangeError(`n must be a non-negative integer, got ${n}`);
  const m = new Int32Array(n + 1);
  const factorials = [1n];
  for (let i = 1; i <= n; i++) factorials.push(factorials[i - 1]! * BigInt(i));
  const factorial = factorials[n]!;
  // lengthTimesK[L][k] = L k as a BigInt: the class size divides by it at the k-th cycle of length L
  const lengthTimesK: bigint[][] = [];
  for (let L = 0; L <= n; L++)
    lengthTimesK.push(
      Array.from({ length: L === 0 ? 0 : Math.floor(n / L) + 1 }, (_, k) => BigInt(L * k)),
    );
  let count = 0;
  let parts = 0;
  const visit = { n, m, parts: 0, size: 0n, sign: 1 as 1 | -1 };
  // walk(L, rest, state, size): decide m_L..m_1 for the remaining `rest`
  const walk = (L: number, rest: number, state: S, size: bigint): void => {
    // lengths above what is left have multiplicity 0: go straight to the longest possible one
    if (L > rest) L = Math.max(rest, 1);
    if (L === 1) {
      let s = state;
      if (ones) s = ones(s, rest);
      else for (let k = 1; k <= rest; k++) s = extend(s, 1, k);
      const z = rest > 1 ? size / factorials[rest]! : size;
      m[1] = rest;
      parts += rest;
      visit.parts = parts;
      visit.size = z;
      visit.sign = (n - parts) % 2 === 0 ? 1 : -1;
      count++;
      leaf(s, visit);
      parts -= rest;
      m[1] = 0;
      return;
    }
    let s = state;
    let z = size;
    const divisors = lengthTimesK[L]!;
    for (let k = 0; k * L <= rest; k++) {
      if (k > 0) {
        s = extend(s, L, k);
        z /= divisors[k]!;
        m[L] = k;
        parts++;
      }
      walk(L - 1, rest - k * L, s, z);
    }
    parts -= m[L]!;
    m[L] = 0;
  };
  if (n === 0) {
    visit.size = 1n;
    leaf(initial, visit);
    return 1;
  }
  walk(n, n, initial, factorial);
  return count;
}

/** Calls `visit` for every cycle type of S_n (see foldCycleTypes); returns their number. */
export function forEachCycleType(n: number, visit: (v: CycleTypeVisit) => void): number {
  return foldCycleTypes(
    n,
    null,
    (s) => s,
    (_s, v) => visit(v),
  );
}

/** Exponent notation [[L, m_L], ...] (ascending L, m_L > 0) of a visited cycle type. */
export function exponentNotation(v: CycleTypeVisit): [number, number][] {
  const out: [number, number][] = [];
  for (let L = 1; L <= v.n; L++) if (v.m[L]! > 0) out.push([L, v.m[L]!]);
  return out;
}
