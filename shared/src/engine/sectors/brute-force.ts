// Brute-force sector sums for the spec files, independent of the engine's series, routes and
// sector walk: plain integer coefficient arrays, fixed windows chosen by the caller.

/** A one-body state: its exponent of q (in units of 1/den) and its coefficient; null = absent. */
export type State = { e: number; c: bigint } | null;

/** Coefficient arrays of e_N(states) for N = 0..nMax below q^(size/den) (fermions, by DP). */
function elementary(states: State[], nMax: number, size: number): bigint[][] {
  const E: bigint[][] = [];
  for (let N = 0; N <= nMax; N++) E.push(new Array<bigint>(size).fill(0n));
  E[0]![0] = 1n;
  for (const s of states) {
    if (s === null || s.e >= size) continue;
    if (s.e < 0) throw new Error('brute force: negative exponents are not handled');
    for (let N = nMax; N >= 1; N--) {
      const dst = E[N]!;
      const src = E[N - 1]!;
      for (let k = size - 1 - s.e; k >= 0; k--) if (src[k] !== 0n) dst[k + s.e]! += s.c * src[k]!;
    }
  }
  return E;
}

/**
 * sum over n in `sectors` of weight(n) * e_N({c_p(n) : p in `lattice`}), N = 1..nMax, as
 * coefficient arrays of q^(k/den), k < size. The caller picks windows outside which every state
 * lies at or beyond q^(size/den), so the sum is exact below that order.
 */
export function fermionSectorSum(opts: {
  nMax: number;
  size: number;
  sectors: number[][];
  lattice: number[];
  state: (p: number, n: number[]) => State;
  weight: (n: number[]) => bigint;
}): bigint[][] {
  const total: bigint[][] = [];
  for (let N = 0; N <= opts.nMax; N++) total.push(new Array<bigint>(opts.size).fill(0n));
  for (const n of opts.sectors) {
    const w = opts.weight(n);
    if (w === 0n) continue;
    const E = elementary(
      opts.lattice.map((p) => opts.state(p, n)),
      opts.nMax,
      opts.size,
    );
    for (let N = 1; N <= opts.nMax; N++)
      for (let k = 0; k < opts.size; k++) total[N]![k]! += w * E[N]![k]!;
  }
  return total;
}

/**
 * The constant term in u modulo u^2 = 1 (the even part in u) of the fermion gas with Laurent-in-u
 * states u^(charge p) q^(e_p): coefficient arrays for N = 1..nMax, by a DP that keeps the parity
 * of the charge, never splitting into sectors.
 */
export function evenChargePart(opts: {
  nMax: number;
  size: number;
  lattice: number[];
  state: (p: number) => { e: number; charge: number } | null;
}): bigint[][] {
  // D[parity][N][k]
  const D = [0, 1].map(() => {
    const t: bigint[][] = [];
    for (let N = 0; N <= opts.nMax; N++) t.push(new Array<bigint>(opts.size).fill(0n));
    return t;
  });
  D[0]![0]![0] = 1n;
  for (const p of opts.lattice) {
    const s = opts.state(p);
    if (s === null || s.e >= opts.size) continue;
    const flip = ((s.charge % 2) + 2) % 2;
    for (let N = opts.nMax; N >= 1; N--)
      for (const par of [0, 1]) {
        const src = D[par]![N - 1]!;
        const dst = D[(par + flip) % 2]![N]!;
        for (let k = opts.size - 1 - s.e; k >= 0; k--) if (src[k] !== 0n) dst[k + s.e]! += src[k]!;
      }
  }
  return D[0]!;
}

/** The integers lo..hi. */
export function range(lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let v = lo; v <= hi; v++) out.push(v);
  return out;
}
