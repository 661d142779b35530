import Fraction from 'fraction.js';
import { chooseNewtonRoute, newtonTable, type NewtonTableInput } from '../kernel/index.js';
import { MAX_ORDER } from '../limits.js';
import { lcm } from '../integers.js';
import { frac } from '../rational.js';
import { add, mul, neg, scale } from '../series/arith.js';
import { gridIndex, Series, stepGcd } from '../series/series.js';

/** Weights packed for the kernel: integer numerators from exponent 0 on one grid. */
interface Packed {
  step: Fraction;
  nums: bigint[][];
  den: bigint;
  length: number;
  /** null when every Z(N) is exact (exact weights whose table fits below the cap). */
  order: number | null;
}

/** Pack the weights when they fit the kernel's shape (no negative exponents), else null. */
function pack(weights: readonly Series[], nMax: number, cap: Fraction | null): Packed | null {
  if (nMax === 0 || weights.length < nMax) return null;
  let step = weights[0]!.step;
  for (const w of weights) step = stepGcd(step, w.step);
  if (cap !== null) step = stepGcd(step, cap);
  const ws = weights.slice(0, nMax).map((w) => w.onStep(step));
  if (ws.some((w) => w.num.length > 0 && w.start < 0)) return null;
  let den = 1n;
  let known = Infinity;
  let degree = 0;
  for (const w of ws) {
    den = lcm(den, w.den);
    if (w.order !== null) known = Math.min(known, w.order);
    if (w.num.length > 0) degree = Math.max(degree, w.start + w.num.length - 1);
  }
  const capIdx = cap === null ? Infinity : gridIndex(ws[0]!, cap)[1];
  const exactLength = nMax * degree + 1;
  let length: number;
  let order: number | null;
  if (known === Infinity && exactLength <= capIdx) {
    length = exactLength;
    order = null;
  } else {
    length = Math.min(known, capIdx);
    order = length;
  }
  if (!Number.isFinite(length) || length <= 0 || length > 4 * MAX_ORDER) return null;
  const nums = ws.map((w) => {
    const f = den / w.den;
    const out = new Array<bigint>(Math.min(length, w.start + w.num.length)).fill(0n);
    for (let i = 0; i < w.num.length && w.start + i < length; i++) out[w.start + i] = w.num[i]! * f;
    return out;
  });
  return { step, nums, den, length: Math.max(length, 0), order };
}

/**
 * The canonical table Z(0..nMax) by the Newton recursion N Z(N) = sum_(L=1..N) s^(L-1) Z_L Z(N-L),
 * s = -1 fermions, +1 bosons. The route is the kernel's one decision (chooseNewtonRoute, see
 * kernel/README.md): weights on one grid without negative exponents go to the exact integer table
 * (multi-modular or BigInt); otherwise series arithmetic with every product cut at `cap`. Z(N) is
 * known as far as the least-known weight (the weights have no negative exponents). `log2Bounds`
 * (optional, proven bounds of log2 |coefficients of Z(N)| below the cap, e.g. productLog2Bounds
 * for a spectrum) lets the multi-modular run stop with fewer primes.
 */
export function newtonRecursion(
  weights: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction | null,
  tick?: (done: number, total: number) => void,
  shouldStop?: () => boolean,
  log2Bounds?: readonly number[] | null,
): Series[] {
  const packed = pack(weights, nMax, cap);
  const input: NewtonTableInput | null = packed && {
    weights: packed.nums,
    den: packed.den,
    nMax,
    sign: fermion ? -1 : 1,
    length: packed.length,
    ...(tick && { onProgress: tick }),
    ...(shouldStop && { shouldStop }),
    ...(log2Bounds && { log2Bounds }),
  };
  const route = chooseNewtonRoute(input);
  if (route.kind === 'series' || !packed || !input)
    return recursionBySeries(weights, nMax, fermion, cap, tick);
  const r = newtonTable(input, route);
  return r.num.map((num, N) =>
    N === 0
      ? Series.constant(frac(1))
      : Series.of(packed.step, 0, num.slice(), r.den[N]!, packed.order),
  );
}

/** The recursion in series arithmetic (any exponents). */
export function recursionBySeries(
  weights: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction | null,
  tick?: (done: number, total: number) => void,
): Series[] {
  const Z: Series[] = [Series.constant(frac(1))];
  for (let N = 1; N <= nMax; N++) {
    let acc = Series.constant(frac(0));
    for (let L = 1; L <= N; L++) {
      const term = mul(weights[L - 1]!, Z[N - L]!, cap);
      acc = add(acc, fermion && L % 2 === 0 ? neg(term) : term);
    }
    Z.push(scale(acc, frac(1, N)));
    tick?.(N, nMax);
  }
  return Z;
}
