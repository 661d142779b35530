/**
 * Rigorous size bounds for the coefficients of Z(N) from the Newton recursion, used to choose how
 * many word primes a multi-modular run needs.
 *
 * Majorant: with W_L = |Z_L| coefficientwise, A(0) = 1 and A(N) = (1/N) sum_L W_L A(N-L) bounds
 * |Z(N)| coefficientwise (induction on N). For any 0 < r <= 1 the truncated series A(N) evaluated
 * at r bounds every coefficient of index j < n by A(N)(r) / r^(n-1) (Cauchy-type estimate, all
 * terms non-negative), and evaluation commutes with the recursion up to dropped (non-negative)
 * tail terms, so a scalar recursion per r suffices. Everything is done in natural logarithms.
 */

const LN2 = Math.LN2;

/** Natural logarithm of |x| (an upper estimate for huge x), -Infinity for 0. */
export function logAbs(x: bigint): number {
  if (x === 0n) return -Infinity;
  const a = x < 0n ? -x : x;
  const f = Number(a);
  if (Number.isFinite(f)) return Math.log(f) * (1 + 1e-15) + 1e-300;
  const hex = a.toString(16);
  const head = parseInt(hex.slice(0, 12), 16) + 1;
  return Math.log(head) + (hex.length - 12) * 4 * LN2;
}

function logSumExp(values: readonly number[]): number {
  let m = -Infinity;
  for (const v of values) if (v > m) m = v;
  if (m === -Infinity) return -Infinity;
  let s = 0;
  for (const v of values) s += Math.exp(v - m);
  return m + Math.log(s);
}

/**
 * For N = 0..nMax, an upper bound on log2 max_j |coefficient j of Z(N)| (j < length), Z(N)
 * from the weights numerators / den by the Newton recursion (either sign).
 * -Infinity means Z(N) is zero below the length.
 */
export function newtonCoefficientLog2Bounds(
  weights: readonly (readonly bigint[])[],
  den: bigint,
  nMax: number,
  length: number,
): number[] {
  const logDen = logAbs(den);
  // sparse lists of (index, log|c|) per weight
  const idx: number[][] = [];
  const lc: number[][] = [];
  for (let L = 1; L <= nMax; L++) {
    const w = weights[L - 1] ?? [];
    const ii: number[] = [];
    const ll: number[] = [];
    const lim = Math.min(w.length, length);
    for (let i = 0; i < lim; i++) {
      const c = w[i]!;
      if (c !== 0n) {
        ii.push(i);
        ll.push(logAbs(c) - logDen);
      }
    }
    idx.push(ii);
    lc.push(ll);
  }
  // x = -log r: 0 (r = 1) and a geometric grid around the saddle points 1/length .. 1000/length
  const xs = [0];
  for (let k = -6; k <= 20; k++) xs.push(2 ** (k / 1.5) / Math.max(1, length));
  const best = new Array<number>(nMax + 1).fill(Infinity);
  best[0] = 0;
  const logA = new Float64Array(nMax + 1);
  const logW = new Float64Array(nMax);
  const terms: number[] = [];
  for (const x of xs) {
    for (let t = 0; t < nMax; t++) {
      const ii = idx[t]!;
      const ll = lc[t]!;
      let m = -Infinity;
      for (let u = 0; u < ii.length; u++) m = Math.max(m, ll[u]! - x * ii[u]!);
      let sum = 0;
      for (let u = 0; u < ii.length; u++) sum += Math.exp(ll[u]! - x * ii[u]! - m);
      logW[t] = m === -Infinity ? -Infinity : m + Math.log(sum);
    }
    logA[0] = 0;
    for (let N = 1; N <= nMax; N++) {
      terms.length = 0;
      for (let L = 1; L <= N; L++) terms.push(logW[L - 1]! + logA[N - L]!);
      logA[N] = logSumExp(terms) - Math.log(N);
      const bound = logA[N]! + x * (length - 1);
      if (bound < best[N]!) best[N] = bound;
    }
  }
  // float rounding in the sums above is far below this margin of one part in 10^6
  return best.map((b) => (b === -Infinity ? -Infinity : b / LN2 + 1e-6 * Math.abs(b / LN2) + 1e-6));
}
