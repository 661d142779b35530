/**
 * The canonical table by the Newton recursion N Z(N) = sum_L s^(L-1) Z_L Z(N-L), exactly, on an
 * integer grid: multi-modular arithmetic over word primes with number-theoretic transforms
 * (newton-residues.ts), Garner reconstruction prime by prime, and a stopping rule that is
 * rigorous either way it fires:
 *  - a priori: the primes' product exceeds twice the majorant bound (coefficient-bound.ts);
 *  - a posteriori: with Y_N the balanced candidates, the integer residual
 *    R_N = sum_L s^(L-1) c_{N,L} w_L Y_(N-L) - N Y_N vanishes modulo every prime used, and a
 *    bound on |R_N| computed from the candidates' sizes is below the product, so R_N = 0 and by
 *    induction on N every candidate is exact.
 * Y_N = d_N Z(N) with d_N = 1 when the weights are certified integral (integrality.ts) and
 * d_N = N! D^N otherwise (then c_{N,L} = N!/(N-L)! D^(L-1)); the result is reduced.
 */
import { gcdBig } from './gcd.js';
import { compressInput, expandResult, findCompression } from './grid-compression.js';
import { newtonCoefficientLog2Bounds, logAbs } from './coefficient-bound.js';
import { newtonIsIntegral } from './integrality.js';
import { invMod, transformPrimes, type TransformPrime } from './modular.js';
import { newtonTableBig } from './newton-big.js';
import { residueRun, valuationBounds } from './newton-residues.js';
import { bigResidue } from './residues.js';
import type { NewtonTableInput, NewtonTableResult } from './types.js';

/** Word primes stay below 2^24: see ACCUMULATE in newton-residues.ts. */
const PRIME_LIMIT = 2 ** 24;
const MIN_TRANSFORM_BITS = 15;
const MAX_TRANSFORM_BITS = 19;

function transformSize(length: number): number {
  let t = 1;
  while (t < 2 * length - 1) t *= 2;
  return t;
}

/**
 * Z(0..nMax) exactly from integer weight numerators on a common grid from exponent 0 with common
 * denominator `den`: Z(N) at t^i is num[N][i] / den[N]. Takes the multi-modular route when the
 * sizes allow it and the BigInt route otherwise.
 */
export function newtonTable(input: NewtonTableInput): NewtonTableResult {
  if (input.den <= 0n) throw new RangeError('den must be positive');
  const shape = findCompression(input);
  if (shape) {
    // the compressed weights are cut at different lengths, so certify integrality on the originals
    const integral = isIntegral(input);
    const r = newtonTableOnGrid(compressInput(input, shape.g, shape.c), integral);
    return expandResult(r, shape.g, shape.c, input.length);
  }
  return newtonTableOnGrid(input);
}

function isIntegral(input: NewtonTableInput): boolean {
  return input.den === 1n && newtonIsIntegral(input.weights, input.nMax, input.sign, input.length);
}

function newtonTableOnGrid(input: NewtonTableInput, integral?: boolean): NewtonTableResult {
  const { nMax, length } = input;
  const fits = length >= 8 && nMax >= 2 && nMax < 2 ** 20;
  if (!fits || Math.log2(transformSize(length)) > MAX_TRANSFORM_BITS) return newtonTableBig(input);
  return newtonTableModular(input, integral);
}

/** Per N, how many leading coefficients are wanted (input.validLengths, capped by length). */
function validLengths(input: NewtonTableInput): number[] {
  const out = [input.length];
  for (let N = 1; N <= input.nMax; N++) {
    out.push(Math.min(input.length, input.validLengths?.[N] ?? input.length));
  }
  return out;
}

function log2Factorial(n: number): number {
  let s = 0;
  for (let i = 2; i <= n; i++) s += Math.log2(i);
  return s;
}

/** log2(2^a + 2^b) without overflow. */
function log2Add(a: number, b: number): number {
  if (a === -Infinity) return b;
  if (b === -Infinity) return a;
  const m = Math.max(a, b);
  return m + Math.log2(2 ** (a - m) + 2 ** (b - m));
}

/**
 * The multi-modular route (newtonTable picks it when it applies). `integral` may pass a
 * certificate computed elsewhere (true only when Z(N) is known to be integral).
 */
export function newtonTableModular(
  input: NewtonTableInput,
  integral = isIntegral(input),
): NewtonTableResult {
  const { weights, den, nMax, length } = input;
  const log2Den = den === 1n ? 0 : logAbs(den) / Math.LN2;
  const scaleLog2 = (N: number): number => (integral ? 0 : log2Factorial(N) + N * log2Den);
  const majorant = newtonCoefficientLog2Bounds(weights, den, nMax, length);
  let aprioriBits = 2;
  for (let N = 1; N <= nMax; N++) {
    if (majorant[N] !== -Infinity)
      aprioriBits = Math.max(aprioriBits, majorant[N]! + scaleLog2(N) + 2);
  }
  // log2 of the l1 norms of the weight numerators, for the residual bound
  const normLog2 = weights.slice(0, nMax).map((w) => {
    let s = -Infinity;
    for (let i = 0; i < Math.min(w.length, length); i++)
      if (w[i] !== 0n) s = log2Add(s, logAbs(w[i]!) / Math.LN2);
    return s;
  });
  const maxNormLog2 = Math.max(...normLog2);
  const size = transformSize(length);
  const k = Math.max(MIN_TRANSFORM_BITS, Math.log2(size));
  const valuation = valuationBounds(input);
  const upto = validLengths(input);
  const estimate = Math.ceil(aprioriBits / 23.9) + 1;
  const primes: TransformPrime[] = [];
  const digits: (Int32Array | null)[][] = []; // digits[i][N]
  const inv: number[][] = [];
  let log2Modulus = 0;
  let pool = transformPrimes(estimate + 4, k, PRIME_LIMIT);
  let done = 0;
  const tick = (): void => input.onProgress?.(++done, (estimate + 1) * nMax);
  let factorial = 1n;
  const scaleBig: bigint[] = [1n];
  for (let N = 1; N <= nMax; N++) {
    factorial *= BigInt(N);
    scaleBig.push(integral ? 1n : factorial * den ** BigInt(N));
  }
  for (;;) {
    if (pool.length <= primes.length) pool = transformPrimes(primes.length + 8, k, PRIME_LIMIT);
    const prime = pool[primes.length]!;
    const p = prime.p;
    if (den % BigInt(p) === 0n || p <= nMax) {
      pool.splice(primes.length, 1);
      continue;
    }
    const scales = scaleBig.map((s) => bigResidue(s, p));
    const res = residueRun(input, prime, size, valuation, (N) => scales[N]!, tick);
    const i = primes.length;
    const invRow = primes.map((q) => invMod(q.p, p));
    for (let N = 1; N <= nMax; N++) {
      const row = res[N];
      if (!row) continue;
      for (let t = 0; t < i; t++) {
        const dt = digits[t]![N]!;
        const c = invRow[t]!;
        const cq = c / p;
        for (let j = valuation[N]!; j < upto[N]!; j++) {
          // digits are below 2^24, exact in the float quotient
          const e0 = dt[j]!;
          let d = row[j]! - (e0 - p * Math.floor(e0 / p));
          d += (d >> 31) & p;
          let r = (d * c - p * Math.floor(d * cq)) | 0;
          r += (r >> 31) & p;
          r -= p;
          r += (r >> 31) & p;
          row[j] = r;
        }
      }
    }
    primes.push(prime);
    digits.push(res);
    inv.push(invRow);
    log2Modulus += Math.log2(p);
    if (log2Modulus >= aprioriBits) break;
    const hopeless = log2Modulus < maxNormLog2 + 2;
    if (
      i >= 1 &&
      !hopeless &&
      residualCertified(
        primes,
        digits,
        valuation,
        upto,
        normLog2,
        scaleLog2,
        nMax,
        length,
        integral,
        log2Den,
        log2Modulus,
      )
    )
      break;
  }
  return assemble(primes, digits, valuation, upto, scaleBig, nMax, length, integral);
}

/** s such that |Y| <= p_0 ... p_(s-1) from the mixed-radix digits of one coefficient. */
function significantDigits(
  primes: readonly TransformPrime[],
  digits: (Int32Array | null)[][],
  N: number,
  j: number,
): number {
  const K = primes.length;
  const top = digits[K - 1]![N]![j]!;
  const neg = top === primes[K - 1]!.p - 1;
  if (top !== 0 && !neg) return K;
  let s = K - 1;
  while (s > 0 && digits[s - 1]![N]![j]! === (neg ? primes[s - 1]!.p - 1 : 0)) s--;
  return s;
}

/** log2 of an upper bound of |Y| for one coefficient, read off its mixed-radix digits. */
function sizeLog2Of(
  primes: readonly TransformPrime[],
  digits: (Int32Array | null)[][],
  prefixLog2: readonly number[],
  N: number,
  j: number,
): number {
  const s = significantDigits(primes, digits, N, j);
  if (s === primes.length) return prefixLog2[s]!;
  if (s === 0) return 0;
  const top = digits[s - 1]![N]![j]!;
  const neg = digits[primes.length - 1]![N]![j]! !== 0;
  // positive: Y < (top + 1) P_(s-1); negative: |Y| <= (p_(s-1) - top) P_(s-1)
  return prefixLog2[s - 1]! + Math.log2(neg ? primes[s - 1]!.p - top : top + 1);
}

function residualCertified(
  primes: readonly TransformPrime[],
  digits: (Int32Array | null)[][],
  valuation: readonly number[],
  upto: readonly number[],
  normLog2: readonly number[],
  scaleLog2: (N: number) => number,
  nMax: number,
  length: number,
  integral: boolean,
  log2Den: number,
  log2Modulus: number,
): boolean {
  const prefix = [0];
  for (const pr of primes) prefix.push(prefix.at(-1)! + Math.log2(pr.p));
  const sizeLog2 = [0]; // log2 bound of max |Y_N|
  for (let N = 1; N <= nMax; N++) {
    let m = -Infinity;
    if (digits[0]![N]) {
      for (let j = valuation[N]!; j < upto[N]!; j++) {
        m = Math.max(m, sizeLog2Of(primes, digits, prefix, N, j));
        if (m + 1 >= log2Modulus) return false;
      }
    }
    sizeLog2.push(m);
  }
  for (let N = 1; N <= nMax; N++) {
    let r = sizeLog2[N]! + Math.log2(N);
    for (let L = 1; L <= N; L++) {
      const c = integral ? 0 : scaleLog2(N) - scaleLog2(N - L) - log2Den;
      r = log2Add(r, c + normLog2[L - 1]! + sizeLog2[N - L]!);
    }
    // margin for the float arithmetic in these logarithms
    if (r + 1 + 1e-6 * r >= log2Modulus) return false;
  }
  return true;
}

function assemble(
  primes: readonly TransformPrime[],
  digits: (Int32Array | null)[][],
  valuation: readonly number[],
  upto: readonly number[],
  scaleBig: readonly bigint[],
  nMax: number,
  length: number,
  integral: boolean,
): NewtonTableResult {
  const K = primes.length;
  const P = primes.map((pr) => BigInt(pr.p));
  const prefix = [1n];
  for (const p of P) prefix.push(prefix.at(-1)! * p);
  const halfDigit = primes.map((pr) => (pr.p - 1) / 2);
  const num: bigint[][] = [[1n, ...new Array<bigint>(length - 1).fill(0n)]];
  const dens: bigint[] = [1n];
  for (let N = 1; N <= nMax; N++) {
    const row = new Array<bigint>(length).fill(0n);
    if (digits[0]![N]) {
      for (let j = valuation[N]!; j < upto[N]!; j++) {
        let neg = false;
        for (let i = K - 1; i >= 0; i--) {
          const d = digits[i]![N]![j]!;
          if (d !== halfDigit[i]) {
            neg = d > halfDigit[i]!;
            break;
          }
        }
        const s = significantDigits(primes, digits, N, j);
        let low: bigint;
        if (s <= 2) {
          const d0 = s > 0 ? digits[0]![N]![j]! : 0;
          const d1 = s > 1 ? digits[1]![N]![j]! : 0;
          low = BigInt(d0 + primes[0]!.p * d1);
        } else {
          low = BigInt(digits[s - 1]![N]![j]!);
          for (let i = s - 2; i >= 0; i--) low = low * P[i]! + BigInt(digits[i]![N]![j]!);
        }
        row[j] = neg ? low - (s === K ? prefix[K]! : prefix[s]!) : low;
      }
    }
    let g = scaleBig[N]!;
    for (let j = 0; j < length && g !== 1n; j++) {
      const c = row[j]!;
      if (c !== 0n && c % g !== 0n) g = gcdBig(g, c);
    }
    if (g !== 1n) for (let j = 0; j < length; j++) if (row[j] !== 0n) row[j] = row[j]! / g;
    num.push(row);
    dens.push(scaleBig[N]! / g);
  }
  return { num, den: dens, primes: K, integral };
}
