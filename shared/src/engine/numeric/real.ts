/**
 * Real: a binary floating-point number m * 2^e with a BigInt mantissa. Values are immutable and
 * exact; every operation that can round takes `prec`, the number of mantissa bits to keep, and
 * rounds to nearest (relative error <= 2^-prec). Callers choose prec from the decimal digits they
 * need plus guard bits (see `bitsFor`).
 */
export class Real {
  constructor(
    readonly m: bigint,
    readonly e: number,
  ) {}
}

export const ZERO = new Real(0n, 0);
export const ONE = new Real(1n, 0);

/** Bits of precision for `digits` significant decimal digits plus `guard` extra bits. */
export function bitsFor(digits: number, guard = 16): number {
  return Math.ceil(digits * 3.321928094887362) + guard;
}

/** Number of bits of |n| (0 for 0). */
export function bitLength(n: bigint): number {
  if (n < 0n) n = -n;
  if (n === 0n) return 0;
  if (n < 0x20000000000000n) {
    const x = Number(n);
    return x < 4294967296 ? 32 - Math.clz32(x) : 64 - Math.clz32(Math.floor(x / 4294967296));
  }
  const s = n.toString(16);
  return (s.length - 1) * 4 + (32 - Math.clz32(parseInt(s[0]!, 16)));
}

/** x rounded to prec bits (nearest, ties away from zero). */
export function round(x: Real, prec: number): Real {
  const bl = bitLength(x.m);
  if (bl <= prec) return x;
  const k = bl - prec;
  const neg = x.m < 0n;
  let a = neg ? -x.m : x.m;
  a = (a + (1n << BigInt(k - 1))) >> BigInt(k);
  return new Real(neg ? -a : a, x.e + k);
}

/** The exact value of an integer. */
export function fromInt(n: number | bigint): Real {
  return new Real(BigInt(n), 0);
}

/** The exact value of a float64. */
export function fromNumber(x: number): Real {
  if (!Number.isFinite(x)) throw new RangeError('not a finite number');
  if (x === 0) return ZERO;
  let e = 0;
  while (!Number.isInteger(x)) {
    x *= 2;
    e--;
  }
  return new Real(BigInt(x), e);
}

/** The nearest float64. */
export function toNumber(x: Real): number {
  if (x.m === 0n) return 0;
  const bl = bitLength(x.m);
  if (bl > 60) {
    const r = round(x, 60);
    return Number(r.m) * 2 ** r.e;
  }
  if (x.e < -1000) return Number(x.m) * 2 ** (x.e + 500) * 2 ** -500;
  return Number(x.m) * 2 ** x.e;
}

/** Binary exponent of the leading bit: |x| in [2^(mag-1), 2^mag). -Infinity for 0. */
export function magnitude(x: Real): number {
  return x.m === 0n ? -Infinity : x.e + bitLength(x.m);
}

export function isZero(x: Real): boolean {
  return x.m === 0n;
}
export function sign(x: Real): -1 | 0 | 1 {
  return x.m < 0n ? -1 : x.m > 0n ? 1 : 0;
}
export function neg(x: Real): Real {
  return new Real(-x.m, x.e);
}
export function abs(x: Real): Real {
  return x.m < 0n ? new Real(-x.m, x.e) : x;
}
/** x * 2^k, exact. */
export function ldexp(x: Real, k: number): Real {
  return new Real(x.m, x.e + k);
}

/** a + b rounded to prec bits. */
export function add(a: Real, b: Real, prec: number): Real {
  if (a.m === 0n) return round(b, prec);
  if (b.m === 0n) return round(a, prec);
  // an addend far below the other's last bit only rounds
  const ma = magnitude(a);
  const mb = magnitude(b);
  if (ma - mb > prec + 2) return round(nudge(a, b, prec), prec);
  if (mb - ma > prec + 2) return round(nudge(b, a, prec), prec);
  if (a.e >= b.e) return round(new Real((a.m << BigInt(a.e - b.e)) + b.m, b.e), prec);
  return round(new Real(a.m + (b.m << BigInt(b.e - a.e)), a.e), prec);
}

/** big + tiny where tiny is below big's rounding unit: keep a sticky bit in tiny's direction. */
function nudge(big: Real, tiny: Real, prec: number): Real {
  const shift = prec + 4 - bitLength(big.m);
  const m = (shift > 0 ? big.m << BigInt(shift) : big.m) * 2n + (tiny.m < 0n ? -1n : 1n);
  return new Real(m, big.e - Math.max(shift, 0) - 1);
}

export function sub(a: Real, b: Real, prec: number): Real {
  return add(a, neg(b), prec);
}

/** a * b rounded to prec bits. */
export function mul(a: Real, b: Real, prec: number): Real {
  return round(new Real(a.m * b.m, a.e + b.e), prec);
}

/** a * k for a small integer k. */
export function mulInt(a: Real, k: number | bigint, prec: number): Real {
  return round(new Real(a.m * BigInt(k), a.e), prec);
}

/** a / b rounded to prec bits (throws RangeError on division by zero). */
export function div(a: Real, b: Real, prec: number): Real {
  if (b.m === 0n) throw new RangeError('division by zero');
  if (a.m === 0n) return ZERO;
  const k = prec + 2 + bitLength(b.m) - bitLength(a.m);
  const num = k > 0 ? a.m << BigInt(k) : a.m >> BigInt(-k);
  const q = num / b.m;
  const r = num - q * b.m;
  // one sticky bit so the final rounding sees the remainder
  const m = q * 2n + (r === 0n ? 0n : r < 0n !== b.m < 0n ? -1n : 1n);
  return round(new Real(m, a.e - b.e - k - 1), prec);
}

/** a / k for a small integer k. */
export function divInt(a: Real, k: number | bigint, prec: number): Real {
  return div(a, fromInt(k), prec);
}

/** Exact rational num/den rounded to prec bits. */
export function fromFraction(num: bigint, den: bigint, prec: number): Real {
  return div(new Real(num, 0), new Real(den, 0), prec);
}

/** Integer square root floor(sqrt(n)) for n >= 0. */
export function isqrt(n: bigint): bigint {
  if (n < 0n) throw new RangeError('square root of a negative number');
  if (n < 2n) return n;
  let x = 1n << BigInt(Math.ceil(bitLength(n) / 2));
  for (;;) {
    const y = (x + n / x) >> 1n;
    if (y >= x) return x;
    x = y;
  }
}

/** sqrt(x) rounded to prec bits; RangeError for x < 0. */
export function sqrt(x: Real, prec: number): Real {
  if (x.m < 0n) throw new RangeError('square root of a negative number');
  if (x.m === 0n) return ZERO;
  let k = 2 * (prec + 2) - bitLength(x.m);
  if ((x.e - k) % 2 !== 0) k++;
  const m = k >= 0 ? x.m << BigInt(k) : x.m >> BigInt(-k);
  return round(new Real(isqrt(m), (x.e - k) / 2), prec);
}

export function cmp(a: Real, b: Real): -1 | 0 | 1 {
  const sa = sign(a);
  const sb = sign(b);
  if (sa !== sb) return sa < sb ? -1 : 1;
  if (sa === 0) return 0;
  const ma = magnitude(a);
  const mb = magnitude(b);
  if (ma !== mb) return ma < mb === sa > 0 ? -1 : 1;
  const e = Math.min(a.e, b.e);
  const x = a.m << BigInt(a.e - e);
  const y = b.m << BigInt(b.e - e);
  return x < y ? -1 : x > y ? 1 : 0;
}

/** a^n for an integer n (negative allowed for a != 0), by squaring. */
export function powInt(a: Real, n: number, prec: number): Real {
  if (n < 0) return div(ONE, powInt(a, -n, prec + 8), prec);
  let r = ONE;
  let b = a;
  const p = prec + 2 * Math.ceil(Math.log2(n + 1)) + 4;
  while (n > 0) {
    if (n & 1) r = mul(r, b, p);
    n = Math.floor(n / 2);
    if (n > 0) b = mul(b, b, p);
  }
  return round(r, prec);
}

/** x as an integer multiple of 2^-bits (fixed point), rounded to nearest. */
export function toFixed(x: Real, bits: number): bigint {
  const s = x.e + bits;
  if (s >= 0) return x.m << BigInt(s);
  const k = BigInt(-s);
  const neg = x.m < 0n;
  const a = ((neg ? -x.m : x.m) + (1n << (k - 1n))) >> k;
  return neg ? -a : a;
}

/** The value n * 2^-bits. */
export function fromFixed(n: bigint, bits: number): Real {
  return new Real(n, -bits);
}

/** Nearest integer (ties away from zero) as a BigInt. */
export function roundToBigInt(x: Real): bigint {
  return toFixed(x, 0);
}

/** floor(x) as a BigInt. */
export function floorToBigInt(x: Real): bigint {
  if (x.e >= 0) return x.m << BigInt(x.e);
  return x.m >> BigInt(-x.e); // arithmetic shift floors
}
