/**
 * The Airy function Ai(x) for real x (DLMF 9.2): the Maclaurin series Ai = c1 f - c2 g (DLMF
 * 9.4.1) in BigInt fixed point, carried with as many extra bits as the cancellation between the
 * growing series costs (about 2 zeta log2 e for x > 0, zeta log2 e for x < 0, zeta = (2/3)|x|^(3/2)),
 * and, once the smallest term of the asymptotic expansion (about e^(-2 zeta)) is below the target,
 * the expansions DLMF 9.7.5 (x > 0) and 9.7.9 (x < 0).
 */
import { exp, pi, powReal } from '../elementary.js';
import {
  abs,
  add,
  div,
  fromFixed,
  fromFraction,
  fromInt,
  ldexp,
  magnitude,
  mul,
  neg,
  ONE,
  Real,
  round,
  sign,
  sqrt,
  sub,
  toFixed,
  toNumber,
} from '../real.js';
import { ellipticK } from './elliptic.js';
import { cos, sin } from './trig.js';

let constants: { bits: number; c1: Real; c2: Real } | null = null;

/**
 * Gamma(1/3) = (2^(7/3) pi K(k_3) / 3^(1/4))^(1/3) with the singular modulus
 * k_3 = sin(pi/12) = (sqrt 6 - sqrt 2)/4 (an AGM, so cheap at any precision).
 */
export function gammaOneThird(prec: number): Real {
  const W = prec + 16;
  const k3 = ldexp(sub(sqrt(fromInt(6), W), sqrt(fromInt(2), W), W), -2);
  const K = ellipticK(k3, W);
  const base = div(
    mul(mul(powReal(fromInt(2), fromFraction(7n, 3n, W), W), pi(W), W), K, W),
    powReal(fromInt(3), new Real(1n, -2), W),
    W,
  );
  return powReal(base, fromFraction(1n, 3n, W), prec);
}

/** c1 = Ai(0) = 3^(-1/6) Gamma(1/3) / (2 pi), c2 = -Ai'(0) = 3^(-1/3) / Gamma(1/3) (DLMF 9.2.3-4). */
function airyConstants(prec: number): { c1: Real; c2: Real } {
  if (!constants || constants.bits < prec) {
    const bits = Math.max(prec + 32, constants ? 2 * constants.bits : 0);
    const W = bits + 8;
    const g = gammaOneThird(W);
    const three = fromInt(3);
    const c1 = div(mul(powReal(three, fromFraction(-1n, 6n, W), W), g, W), ldexp(pi(W), 1), W);
    const c2 = div(powReal(three, fromFraction(-1n, 3n, W), W), g, W);
    constants = { bits, c1, c2 };
  }
  return { c1: round(constants.c1, prec), c2: round(constants.c2, prec) };
}

/** Ai(0) to prec bits. */
export function airyAiZero(prec: number): Real {
  return airyConstants(prec).c1;
}

/** Ai'(0) = -c2 to prec bits. */
export function airyAiPrimeZero(prec: number): Real {
  return neg(airyConstants(prec).c2);
}

/** The Maclaurin series at w fixed-point bits. */
function maclaurin(x: Real, prec: number, w: number): Real {
  const W = BigInt(w);
  const { c1, c2 } = airyConstants(w);
  const x3 = toFixed(mul(mul(x, x, w + 8), x, w + 8), w);
  const ax3 = Math.abs(toNumber(x)) ** 3;
  let a = 1n << W; // x^(3k) 3^k (1/3)_k / (3k)!
  let b = toFixed(x, w); // x^(3k+1) 3^k (2/3)_k / (3k+1)!
  let f = a;
  let g = b;
  for (let k = 1; ; k++) {
    a = ((a * x3) >> W) / BigInt((3 * k - 1) * 3 * k);
    b = ((b * x3) >> W) / BigInt(3 * k * (3 * k + 1));
    f += a;
    g += b;
    if (a === 0n && b === 0n && 9 * k * k > ax3) break;
  }
  return round(sub(mul(c1, fromFixed(f, w), w), mul(c2, fromFixed(g, w), w), w), prec);
}

/**
 * The terms u_k zeta^-k of DLMF 9.7.2 at W bits, k = 0.. until one falls below 2^-(W+4);
 * null when they start to grow first (the expansion cannot reach W bits).
 */
function asymptoticTerms(zeta: Real, W: number): Real[] | null {
  const out: Real[] = [ONE];
  const zinv = div(ONE, zeta, W);
  let t = ONE;
  for (let k = 1; k < 100000; k++) {
    // u_k = u_(k-1) (6k-5)(6k-3)(6k-1) / ((2k-1) 216 k)
    const num = fromInt((6 * k - 5) * (6 * k - 3) * (6 * k - 1));
    const next = div(mul(mul(t, num, W), zinv, W), fromInt((2 * k - 1) * 216 * k), W);
    if (magnitude(next) > magnitude(t)) return null;
    out.push(next);
    t = next;
    if (magnitude(t) < -W - 4) return out;
  }
  return null;
}

/** Ai(x) by DLMF 9.7.5 (x > 0) or 9.7.9 (x < 0), or null when the expansion falls short. */
function asymptotic(x: Real, prec: number): Real | null {
  const W = prec + 16;
  const ax = abs(x);
  const axf = toNumber(ax);
  const zetaF = (2 / 3) * axf ** 1.5;
  if (2 * zetaF * Math.LOG2E < W + 24) return null;
  const wz = W + 8 + Math.max(0, magnitude(ax)) * 2;
  const zeta = mul(fromFraction(2n, 3n, wz), mul(ax, sqrt(ax, wz), wz), wz);
  const terms = asymptoticTerms(zeta, W);
  if (!terms) return null;
  const quarter = powReal(ax, new Real(-1n, -2), W); // |x|^(-1/4)
  const rootPi = sqrt(pi(W), W);
  if (sign(x) > 0) {
    let s = ONE;
    for (let k = 1; k < terms.length; k++) s = k % 2 ? sub(s, terms[k]!, W) : add(s, terms[k]!, W);
    const pre = div(mul(exp(neg(zeta), W), quarter, W), ldexp(rootPi, 1), W);
    return round(mul(pre, s, W), prec);
  }
  // even and odd parts with alternating signs
  let even = ONE;
  let odd = terms[1]!;
  for (let k = 2; k < terms.length; k++) {
    const sgn = Math.floor(k / 2) % 2 === 1 ? -1 : 1;
    const t = sgn > 0 ? terms[k]! : neg(terms[k]!);
    if (k % 2 === 0) even = add(even, t, W);
    else odd = add(odd, t, W);
  }
  const phase = sub(zeta, ldexp(pi(wz), -2), wz);
  const c = cos(phase, W);
  const s = sin(phase, W);
  return round(div(mul(quarter, add(mul(c, even, W), mul(s, odd, W), W), W), rootPi, W), prec);
}

/**
 * Airy Ai(x) for real x, rounded to prec bits (relative; absolute, on the scale |x|^(-1/4) of
 * the oscillation, next to the zeros on x < 0). Fine for |x| up to a few hundred at 30-120 digits.
 */
export function airyAi(x: Real, prec: number): Real {
  if (x.m === 0n) return airyAiZero(prec);
  const viaAsymptotic = asymptotic(x, prec);
  if (viaAsymptotic) return viaAsymptotic;
  const axf = Math.abs(toNumber(x));
  const zetaBits = (2 / 3) * axf ** 1.5 * Math.LOG2E;
  const extra = Math.ceil((sign(x) > 0 ? 2 : 1) * zetaBits + 2 * Math.log2(axf + 2)) + 24;
  return maclaurin(x, prec, prec + extra);
}
