/**
 * Complete elliptic integrals of the first and second kind with modulus k (DLMF 19.2.8), by the
 * arithmetic-geometric mean (DLMF 19.8.1, 19.8.6), and the nome q(k) = exp(-pi K'(k)/K(k))
 * (DLMF 19.2.9, 22.2.1); its inverse k(q) = theta_2(0,q)^2 / theta_3(0,q)^2 (DLMF 22.2.2).
 */
import { EngineError } from '../../errors.js';
import { exp, pi } from '../elementary.js';
import {
  add,
  cmp,
  div,
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
  ZERO,
} from '../real.js';
import { theta } from './theta.js';
import { exactSub } from './trig.js';

/** Check 0 <= k < 1, naming the function in the message. */
function checkModulus(k: Real, name: string): void {
  if (sign(k) < 0 || cmp(k, ONE) >= 0) {
    throw new EngineError(`${name}: the modulus must satisfy 0 <= k < 1`);
  }
}

/** k' = sqrt((1 - k)(1 + k)), the factors exact so that k near 1 keeps its relative accuracy. */
export function complementaryModulus(k: Real, prec: number): Real {
  return sqrt(mul(exactSub(ONE, k), exactSub(ONE, neg(k)), prec + 4), prec);
}

interface Agm {
  /** M(a0, b0) */
  mean: Real;
  /** sum_{n>=0} 2^(n-1) c_n^2 with c_0^2 = a0^2 - b0^2 (DLMF 19.8.6) */
  cSum: Real;
}

/**
 * AGM of 1 and b at W bits, with the sum of 2^(n-1) c_n^2 (c_0 = c0, c_{n+1} = c_n^2 / (4 a_{n+1}),
 * a form free of the cancellation in (a_n - b_n)/2). Stops when c_n^2 2^n falls below 2^-W.
 */
function agm(b: Real, c0: Real, W: number): Agm {
  let a = ONE;
  let g = b;
  let c = c0;
  let cSum = ldexp(mul(c, c, W), -1);
  for (let n = 1; n < 200; n++) {
    const a1 = ldexp(add(a, g, W), -1);
    const g1 = sqrt(mul(a, g, W), W);
    c = div(mul(c, c, W), ldexp(a1, 2), W);
    a = a1;
    g = g1;
    const t = ldexp(mul(c, c, W), n - 1);
    cSum = add(cSum, t, W);
    if (t.m === 0n || magnitude(t) < -W - 2) break;
  }
  return { mean: ldexp(add(a, g, W), -1), cSum };
}

/** Guard bits for the AGM results at working precision prec. */
function guard(prec: number): number {
  return 12 + Math.ceil(Math.log2(prec + 1));
}

/**
 * K(k) = pi / (2 M(1, k')) for 0 <= k < 1 (DLMF 19.8.5), rounded to prec bits. K(0) = pi/2; K
 * grows like log(4/k') as k -> 1. EngineError outside [0, 1).
 */
export function ellipticK(k: Real, prec: number): Real {
  checkModulus(k, 'K');
  const W = prec + guard(prec);
  const kp = complementaryModulus(k, W);
  const { mean } = agm(kp, k, W);
  return div(pi(W), ldexp(mean, 1), prec);
}

/**
 * E(k) = K(k) (1 - sum_{n>=0} 2^(n-1) c_n^2) for 0 <= k < 1 (DLMF 19.8.6), rounded to prec bits.
 * The bracket tends to 0 like 1/K as k -> 1; the guard bits cover that cancellation.
 */
export function ellipticE(k: Real, prec: number): Real {
  checkModulus(k, 'E');
  const W = prec + 2 * guard(prec);
  const kp = complementaryModulus(k, W);
  const { mean, cSum } = agm(kp, k, W);
  const K = div(pi(W), ldexp(mean, 1), W);
  return round(mul(K, sub(ONE, cSum, W), W), prec);
}

/**
 * The nome q = exp(-pi K'(k)/K(k)) of modulus 0 <= k < 1 (DLMF 19.2.9, 22.2.1), i.e.
 * exp(-pi M(1, k') / M(1, k)); q(0) = 0. Relative accuracy even when q is tiny (k small): the
 * exponent is carried with as many extra bits as its size needs.
 */
export function nomeOfModulus(k: Real, prec: number): Real {
  checkModulus(k, 'nome');
  if (k.m === 0n) return ZERO;
  // the exponent is about 2 log(4/k); its size in bits
  const expoBits = Math.ceil(Math.log2(2 + 1.4 * Math.max(0, 2 - magnitude(k)))) + 1;
  const W = prec + guard(prec) + expoBits;
  const kp = complementaryModulus(k, W);
  const m1 = agm(kp, k, W).mean; // M(1, k')
  const m2 = agm(k, kp, W).mean; // M(1, k)
  const ratio = div(mul(pi(W), m1, W), m2, W);
  return exp(neg(ratio), prec);
}

/**
 * The modulus k = theta_2(0,q)^2 / theta_3(0,q)^2 of nome 0 <= q < 1 (DLMF 22.2.2), the inverse
 * of nomeOfModulus. EngineError outside [0, 1).
 */
export function modulusOfNome(q: Real, prec: number): Real {
  if (sign(q) < 0 || cmp(q, ONE) >= 0) {
    throw new EngineError('modulus: the nome must satisfy 0 <= q < 1');
  }
  if (q.m === 0n) return ZERO;
  const W = prec + 8;
  const t2 = theta(2, ZERO, q, W);
  const t3 = theta(3, ZERO, q, W);
  const r = div(t2, t3, W);
  return round(mul(r, r, W), prec);
}
