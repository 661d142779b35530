/**
 * Truncated products of integer coefficient arrays: schoolbook for small inputs, sparse x dense
 * when one side has few non-zero coefficients, Kronecker substitution into one BigInt
 * multiplication for large dense inputs (signed coefficients packed as a difference of two
 * non-negative packings, unpacked with borrows).
 */

/** Below this many coefficient pairs the schoolbook product wins (measured, see bench notes). */
const SCHOOLBOOK_PAIRS = 2500;
/** One side counts as sparse when it has at most this share of non-zero coefficients. */
const SPARSE_SHARE = 0.05;

function bitLengthAbs(x: bigint): number {
  if (x < 0n) x = -x;
  if (x < 0x20000000000000n) return x === 0n ? 0 : Math.floor(Math.log2(Number(x))) + 1;
  return x.toString(16).length * 4;
}

function maxBits(a: readonly bigint[], n: number): number {
  let m = 0n;
  let lo = 0n;
  const lim = Math.min(a.length, n);
  for (let i = 0; i < lim; i++) {
    const c = a[i]!;
    if (c > m) m = c;
    else if (c < lo) lo = c;
  }
  return Math.max(bitLengthAbs(m), bitLengthAbs(lo));
}

function nonZeroCount(a: readonly bigint[], n: number): number {
  let k = 0;
  const lim = Math.min(a.length, n);
  for (let i = 0; i < lim; i++) if (a[i] !== 0n) k++;
  return k;
}

/**
 * Schoolbook product, first n coefficients; zero coefficients of either side are skipped, so it is
 * also the sparse x dense product.
 */
export function mulSchoolbook(a: readonly bigint[], b: readonly bigint[], n: number): bigint[] {
  if (a.length > b.length) [a, b] = [b, a];
  if (a.length === 0) return [];
  const len = Math.max(0, Math.min(n, a.length + b.length - 1));
  const out = new Array<bigint>(len).fill(0n);
  for (let i = 0; i < a.length && i < len; i++) {
    const ai = a[i]!;
    if (ai === 0n) continue;
    const lim = Math.min(b.length, len - i);
    for (let j = 0; j < lim; j++) {
      const bj = b[j]!;
      if (bj !== 0n) out[i + j]! += ai * bj;
    }
  }
  return out;
}

/** out[off + i] += a * b[i] for i < count (a = +-1 without a multiplication). */
export function addScaled(
  out: bigint[],
  off: number,
  a: bigint,
  b: readonly bigint[],
  count: number,
): void {
  if (a === 1n) for (let i = 0; i < count; i++) out[off + i]! += b[i]!;
  else if (a === -1n) for (let i = 0; i < count; i++) out[off + i]! -= b[i]!;
  else for (let i = 0; i < count; i++) out[off + i]! += a * b[i]!;
}

function pack(a: readonly bigint[], len: number, hexDigits: number): bigint {
  // the value sum a_i 2^(4 * hexDigits * i) as positive packing minus negative packing
  const pos: string[] = [];
  const neg: string[] = [];
  const zero = '0'.repeat(hexDigits);
  let anyNeg = false;
  for (let i = len - 1; i >= 0; i--) {
    const c = a[i] ?? 0n;
    if (c === 0n) {
      pos.push(zero);
      neg.push(zero);
    } else if (c > 0n) {
      pos.push(c.toString(16).padStart(hexDigits, '0'));
      neg.push(zero);
    } else {
      anyNeg = true;
      pos.push(zero);
      neg.push((-c).toString(16).padStart(hexDigits, '0'));
    }
  }
  const p = BigInt('0x' + (pos.join('') || '0'));
  return anyNeg ? p - BigInt('0x' + neg.join('')) : p;
}

function unpack(x: bigint, n: number, hexDigits: number): bigint[] {
  const out = new Array<bigint>(n).fill(0n);
  let negative = false;
  if (x < 0n) {
    negative = true;
    x = -x;
  }
  const hex = x.toString(16);
  const slot = 4n * BigInt(hexDigits);
  const full = 1n << slot;
  const half = full >> 1n;
  let borrow = 0n;
  for (let i = 0; i < n; i++) {
    const end = hex.length - i * hexDigits;
    if (end <= 0 && borrow === 0n) break;
    const start = Math.max(0, end - hexDigits);
    let d = (end > 0 ? BigInt('0x' + hex.slice(start, end)) : 0n) + borrow;
    borrow = 0n;
    if (d >= half) {
      d -= full;
      borrow = 1n;
    }
    out[i] = negative ? -d : d;
  }
  return out;
}

/** Kronecker-substitution product, first n coefficients. */
export function mulKronecker(a: readonly bigint[], b: readonly bigint[], n: number): bigint[] {
  const la = Math.min(a.length, n);
  const lb = Math.min(b.length, n);
  const len = la === 0 || lb === 0 ? 0 : Math.max(0, Math.min(n, la + lb - 1));
  if (len === 0) return [];
  const bits = maxBits(a, la) + maxBits(b, lb) + Math.ceil(Math.log2(Math.min(la, lb) + 1)) + 2;
  const hexDigits = Math.ceil(bits / 4);
  const x = pack(a, la, hexDigits) * pack(b, lb, hexDigits);
  return unpack(x, len, hexDigits);
}

/**
 * First n coefficients of the product of two integer coefficient arrays (index = exponent on a
 * common grid). Picks schoolbook, sparse x dense or Kronecker substitution by size and sparsity.
 */
export function mulTrunc(a: readonly bigint[], b: readonly bigint[], n: number): bigint[] {
  const la = Math.min(a.length, n);
  const lb = Math.min(b.length, n);
  if (la === 0 || lb === 0 || n <= 0) return [];
  if (la * lb <= SCHOOLBOOK_PAIRS) return mulSchoolbook(a.slice(0, la), b.slice(0, lb), n);
  const ka = nonZeroCount(a, la);
  const kb = nonZeroCount(b, lb);
  if (ka <= SPARSE_SHARE * la || kb <= SPARSE_SHARE * lb || ka * kb <= SCHOOLBOOK_PAIRS) {
    return mulSchoolbook(a.slice(0, la), b.slice(0, lb), n);
  }
  return mulKronecker(a, b, n);
}

/**
 * First n coefficients of A * b where A has non-zero coefficients only at multiples of `stride`:
 * `coarse[i]` is A's coefficient at index i * stride (a series in q^r times a dense one). The
 * product splits into `stride` products on the residue classes of b's indices modulo the stride
 * (b_t[m] = b[m * stride + t]), each `stride` times shorter, so A's zeros cost nothing and every
 * class still gets the fastest of mulTrunc's methods. When every class would be a schoolbook
 * product anyway, b is shifted and added once per term of A instead (no classes built).
 */
export function mulTruncStrided(
  coarse: readonly bigint[],
  stride: number,
  b: readonly bigint[],
  n: number,
): bigint[] {
  if (!Number.isInteger(stride) || stride < 1) throw new RangeError(`stride ${stride} is not >= 1`);
  if (stride === 1) return mulTrunc(coarse, b, n);
  const lb = Math.min(b.length, n);
  const lc = Math.min(coarse.length, Math.ceil(n / stride));
  if (lb <= 0 || lc <= 0) return [];
  const len = Math.min(n, (lc - 1) * stride + lb);
  const out = new Array<bigint>(len).fill(0n);
  if (lc * Math.ceil(lb / stride) <= SCHOOLBOOK_PAIRS) {
    // every class would be a schoolbook product: shift and add b once per term of A instead
    for (let k = 0; k < lc; k++) {
      const a = coarse[k]!;
      const off = k * stride;
      if (a === 0n || off >= len) continue;
      addScaled(out, off, a, b, Math.min(lb, len - off));
    }
    return out;
  }
  const part: bigint[] = [];
  for (let t = 0; t < stride && t < lb; t++) {
    part.length = 0;
    for (let k = t; k < lb; k += stride) part.push(b[k]!);
    const prod = mulTrunc(coarse, part, Math.ceil((len - t) / stride));
    for (let m = 0; m < prod.length; m++) out[t + m * stride] = prod[m]!;
  }
  return out;
}
