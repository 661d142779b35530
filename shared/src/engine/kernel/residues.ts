/**
 * Moving integers between BigInt and residues modulo word primes: reduction of BigInt
 * coefficients, and Chinese remaindering back by Garner's mixed-radix method (common practice;
 * see D. E. Knuth, TAOCP vol. 2, 4.3.2).
 */
import { invMod, mulMod } from './modular.js';

const SAFE = BigInt(Number.MAX_SAFE_INTEGER);

/** x mod p as a number in [0, p), for any BigInt x. */
export function bigResidue(x: bigint, p: number, pBig: bigint = BigInt(p)): number {
  if (x <= SAFE && x >= -SAFE) {
    const f = Number(x);
    return f - p * Math.floor(f / p);
  }
  const r = Number(x % pBig);
  return r < 0 ? r + p : r;
}

/** Residues of a coefficient array modulo p, written into an Int32Array of length `size`. */
export function residueArray(
  values: readonly bigint[],
  p: number,
  size: number,
  scale = 1,
): Int32Array {
  const out = new Int32Array(size);
  const pBig = BigInt(p);
  const lim = Math.min(values.length, size);
  for (let i = 0; i < lim; i++) {
    const v = values[i]!;
    if (v === 0n) continue;
    const r = bigResidue(v, p, pBig);
    out[i] = scale === 1 ? r : mulMod(r, scale, p);
  }
  return out;
}

/** Precomputed constants for reconstructing integers from residues modulo `primes`. */
export interface CrtBasis {
  readonly primes: readonly number[];
  /** inv[i][j] = primes[j]^-1 mod primes[i], j < i */
  readonly inv: readonly (readonly number[])[];
  /** pair radices primes[2t] * primes[2t+1] as BigInt (last one single when odd) */
  readonly pairRadix: readonly bigint[];
  /** product of all primes */
  readonly modulus: bigint;
  readonly half: bigint;
}

/** Builds the Garner constants for distinct primes below 2^26. */
export function crtBasis(primes: readonly number[]): CrtBasis {
  const inv = primes.map((pi, i) => primes.slice(0, i).map((pj) => invMod(pj, pi)));
  const pairRadix: bigint[] = [];
  for (let t = 0; t < primes.length; t += 2) {
    pairRadix.push(BigInt(primes[t]!) * BigInt(primes[t + 1] ?? 1));
  }
  const modulus = primes.reduce((m, p) => m * BigInt(p), 1n);
  return { primes, inv, pairRadix, modulus, half: modulus / 2n };
}

/**
 * Mixed-radix digits of the integer in [0, modulus) with the given residues (Garner).
 * `digits` receives them; returns nothing.
 */
export function mixedRadixDigits(
  basis: CrtBasis,
  residues: ArrayLike<number>,
  digits: Float64Array,
): void {
  const { primes, inv } = basis;
  for (let i = 0; i < primes.length; i++) {
    const p = primes[i]!;
    const invRow = inv[i]!;
    let t = residues[i]!;
    for (let j = 0; j < i; j++) {
      // digits[j] < primes[j], which may exceed p
      let d = t - (digits[j]! % p);
      if (d < 0) d += p;
      t = mulMod(d, invRow[j]!, p);
    }
    digits[i] = t;
  }
}

/** The balanced integer (|x| <= modulus/2) with the given mixed-radix digits. */
export function fromMixedRadix(basis: CrtBasis, digits: Float64Array): bigint {
  const { primes, pairRadix } = basis;
  const k = primes.length;
  let top = k - 1;
  while (top >= 0 && digits[top] === 0) top--;
  if (top < 0) return 0n;
  if (top <= 1 && k > 2) {
    // small non-negative value: fits a double exactly (p0 * p1 < 2^52)
    return BigInt(digits[0]! + primes[0]! * (top === 1 ? digits[1]! : 0));
  }
  let x = 0n;
  const pairs = pairRadix.length;
  for (let t = pairs - 1; t >= 0; t--) {
    const lo = digits[2 * t]!;
    const hi = 2 * t + 1 < k ? digits[2 * t + 1]! : 0;
    const u = lo + primes[2 * t]! * hi;
    x = t === pairs - 1 ? BigInt(u) : x * pairRadix[t]! + BigInt(u);
  }
  return x > basis.half ? x - basis.modulus : x;
}

/** The value with those digits, balanced as in fromMixedRadix, reduced modulo another prime q. */
export function mixedRadixResidue(
  basis: CrtBasis,
  digits: Float64Array,
  q: number,
  modulusModQ: number,
): number {
  const { primes } = basis;
  let y = 0;
  for (let i = primes.length - 1; i >= 0; i--)
    y = (mulMod(y, primes[i]! % q, q) + (digits[i]! % q)) % q;
  // balanced representation: subtract the modulus when the value is above half of it
  if (isAboveHalf(basis, digits)) {
    y -= modulusModQ;
    if (y < 0) y += q;
  }
  return y;
}

function isAboveHalf(basis: CrtBasis, digits: Float64Array): boolean {
  // compare digit strings of x and (modulus - 1) / 2 from the top; modulus is odd
  const { primes } = basis;
  const k = primes.length;
  // (M-1)/2 in mixed radix has digits (p_i - 1)/2 for every i (all primes odd)
  for (let i = k - 1; i >= 0; i--) {
    const h = (primes[i]! - 1) / 2;
    if (digits[i]! > h) return true;
    if (digits[i]! < h) return false;
  }
  return false;
}
