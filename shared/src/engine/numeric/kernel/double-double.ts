import { add, fromNumber, Real, toNumber, ZERO } from '../real.js';

/**
 * Double-double arithmetic (a value is hi + lo with |lo| <= ulp(hi) / 2, about 106 bits) for the
 * matrix stage of the kernel discretisation when the requested digits fit (common practice:
 * Dekker's products and Knuth's two-sum, error-free in float64). A DD matrix is two Float64Arrays.
 * The helpers return through the module's registers `H`, `L` so that inner loops allocate nothing.
 */
export let H = 0;
export let L = 0;

/** Unit roundoff of one double-double operation (2^-104, a safe round figure). */
export const DD_UNIT = 2 ** -104;

const SPLIT = 134217729; // 2^27 + 1

/** (ah + al) * (bh + bl) into H, L. */
export function ddMul(ah: number, al: number, bh: number, bl: number): void {
  const p = ah * bh;
  let t = SPLIT * ah;
  const a1 = t - (t - ah);
  const a2 = ah - a1;
  t = SPLIT * bh;
  const b1 = t - (t - bh);
  const b2 = bh - b1;
  const e = a1 * b1 - p + a1 * b2 + a2 * b1 + a2 * b2;
  const lo = e + (ah * bl + al * bh);
  H = p + lo;
  L = lo - (H - p);
}

/** (ah + al) + (bh + bl) into H, L. */
export function ddAdd(ah: number, al: number, bh: number, bl: number): void {
  const s = ah + bh;
  const v = s - ah;
  const e = ah - (s - v) + (bh - v) + al + bl;
  H = s + e;
  L = e - (H - s);
}

/** (ah + al) / (bh + bl) into H, L (one correction step). */
export function ddDiv(ah: number, al: number, bh: number, bl: number): void {
  const q1 = ah / bh;
  ddMul(q1, 0, bh, bl);
  ddAdd(ah, al, -H, -L);
  const q2 = H / bh;
  const s = q1 + q2;
  H = s;
  L = q2 - (s - q1);
}

/** sqrt(ah + al) into H, L (one Newton step from the float64 root). */
export function ddSqrt(ah: number, al: number): void {
  if (ah <= 0) {
    H = 0;
    L = 0;
    return;
  }
  const s = Math.sqrt(ah);
  ddMul(s, 0, s, 0);
  ddAdd(ah, al, -H, -L);
  const c = H / (2 * s);
  H = s + c;
  L = c - (H - s);
}

/** A Real as the nearest double-double (into H, L). */
export function ddFromReal(x: Real): void {
  const hi = toNumber(x);
  const rest = add(x, fromNumber(-hi), 200);
  H = hi;
  L = toNumber(rest);
}

/** A double-double as an exact Real. */
export function ddToReal(hi: number, lo: number): Real {
  if (hi === 0 && lo === 0) return ZERO;
  return add(fromNumber(hi), fromNumber(lo), 200);
}
