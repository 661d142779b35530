import { add, fromNumber, Real, toNumber, ZERO } from '../real.js';

/**
 * Double-double arithmetic (a value is hi + lo with |lo| <= ulp(hi) / 2, about 106 bits) for the
 * matrix stage of the kernel discretisation when the requested digits fit (common practice:
 * Dekker's products and Knuth's two-sum, error-free in float64). A DD matrix is two Float64Arrays.
 * The helpers return through the register `R` (R[0] = hi, R[1] = lo) so that inner loops allocate
 * nothing (a Float64Array element, unlike a module variable, holds a double without boxing it).
 */
export const R = new Float64Array(2);

/** Unit roundoff of one double-double operation (2^-104, a safe round figure). */
export const DD_UNIT = 2 ** -104;

const SPLIT = 134217729; // 2^27 + 1

/** (ah + al) * (bh + bl) into R. */
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
  R[0] = p + lo;
  R[1] = lo - (R[0] - p);
}

/** (ah + al) + (bh + bl) into R. */
export function ddAdd(ah: number, al: number, bh: number, bl: number): void {
  const s = ah + bh;
  const v = s - ah;
  const e = ah - (s - v) + (bh - v) + al + bl;
  R[0] = s + e;
  R[1] = e - (R[0] - s);
}

/** (ah + al) / (bh + bl) into R (one correction step). */
export function ddDiv(ah: number, al: number, bh: number, bl: number): void {
  const q1 = ah / bh;
  ddMul(q1, 0, bh, bl);
  ddAdd(ah, al, -R[0], -R[1]);
  const q2 = R[0] / bh;
  const s = q1 + q2;
  R[0] = s;
  R[1] = q2 - (s - q1);
}

/** sqrt(ah + al) into R (one Newton step from the float64 root). */
export function ddSqrt(ah: number, al: number): void {
  if (ah <= 0) {
    R[0] = 0;
    R[1] = 0;
    return;
  }
  const s = Math.sqrt(ah);
  ddMul(s, 0, s, 0);
  ddAdd(ah, al, -R[0], -R[1]);
  const c = R[0] / (2 * s);
  R[0] = s + c;
  R[1] = c - (R[0] - s);
}

/** A Real as the nearest double-double (into R). */
export function ddFromReal(x: Real): void {
  const hi = toNumber(x);
  const rest = add(x, fromNumber(-hi), 200);
  R[0] = hi;
  R[1] = toNumber(rest);
}

/** A double-double as an exact Real. */
export function ddToReal(hi: number, lo: number): Real {
  if (hi === 0 && lo === 0) return ZERO;
  return add(fromNumber(hi), fromNumber(lo), 200);
}

// ln 2 as a double-double (common practice: hi = Math.LN2, lo the next 53 bits)
const LN2_HI = 0.6931471805599453;
const LN2_LO = 2.3190468138462996e-17;
// 1/j as double-doubles for the Taylor coefficients
const INV_HI: number[] = [0];
const INV_LO: number[] = [0];
for (let j = 1; j <= 30; j++) {
  ddDiv(1, 0, j, 0);
  INV_HI.push(R[0]);
  INV_LO.push(R[1]);
}

/**
 * exp(xh + xl) into R: x = k ln 2 + r, exp(r / 2^10) - 1 by a degree-10 Taylor polynomial,
 * squared back ten times as s -> 2 s + s^2 (common practice). Overflow gives NaN in R[0].
 */
export function ddExp(xh: number, xl: number): void {
  if (xh > 709) {
    R[0] = NaN;
    R[1] = 0;
    return;
  }
  if (xh < -745) {
    R[0] = 0;
    R[1] = 0;
    return;
  }
  const k = Math.round(xh / LN2_HI);
  ddMul(LN2_HI, LN2_LO, k, 0);
  ddAdd(xh, xl, -R[0], -R[1]);
  const rh = R[0] / 1024;
  const rl = R[1] / 1024;
  let ph = 1;
  let pl = 0;
  for (let j = 10; j >= 2; j--) {
    ddMul(rh, rl, INV_HI[j]!, INV_LO[j]!);
    ddMul(R[0], R[1], ph, pl);
    ddAdd(1, 0, R[0], R[1]);
    ph = R[0];
    pl = R[1];
  }
  ddMul(rh, rl, ph, pl);
  let sh = R[0];
  let sl = R[1];
  for (let i = 0; i < 10; i++) {
    ddMul(sh, sl, sh, sl);
    ddAdd(2 * sh, 2 * sl, R[0], R[1]);
    sh = R[0];
    sl = R[1];
  }
  ddAdd(1, 0, sh, sl);
  const f = 2 ** k;
  R[0] *= f;
  R[1] *= f;
}

/** log(xh + xl) for x > 0 into R: y0 = log(hi), then y0 + t - t^2/2 with t = x e^-y0 - 1. */
export function ddLog(xh: number, xl: number): void {
  const y0 = Math.log(xh);
  ddExp(-y0, 0);
  ddMul(xh, xl, R[0], R[1]);
  ddAdd(R[0], R[1], -1, 0);
  const th = R[0];
  const tl = R[1];
  ddMul(th, tl, th, tl);
  ddAdd(th, tl, -0.5 * R[0], -0.5 * R[1]);
  ddAdd(y0, 0, R[0], R[1]);
}

/** sinh(xh + xl) into R: its Taylor series for |x| < 1/2, (e^x - e^-x) / 2 beyond. */
export function ddSinh(xh: number, xl: number): void {
  if (Math.abs(xh) >= 0.5) {
    ddExp(xh, xl);
    const eh = R[0];
    const el = R[1];
    ddDiv(1, 0, eh, el);
    ddAdd(eh, el, -R[0], -R[1]);
    R[0] *= 0.5;
    R[1] *= 0.5;
    return;
  }
  ddMul(xh, xl, xh, xl);
  const x2h = R[0];
  const x2l = R[1];
  let ph = 1;
  let pl = 0;
  for (let j = 26; j >= 2; j -= 2) {
    // p = 1 + x^2 / (j (j + 1)) p
    ddMul(x2h, x2l, INV_HI[j]!, INV_LO[j]!);
    ddMul(R[0], R[1], INV_HI[j + 1]!, INV_LO[j + 1]!);
    ddMul(R[0], R[1], ph, pl);
    ddAdd(1, 0, R[0], R[1]);
    ph = R[0];
    pl = R[1];
  }
  ddMul(xh, xl, ph, pl);
}
