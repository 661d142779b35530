/**
 * Theta functions for a nome close to 1 through Jacobi's imaginary transformation (DLMF
 * 20.7.30-20.7.33 with tau = i t, q = e^(-pi t)). For real z it reads, with w = z / pi,
 *   theta_j(z, q) = t^(-1/2) sum_{m in Z} s_j(m) exp(-pi (m + d_j - w)^2 / t),
 * d_j = 1/2 for j = 1, 4 and 0 for j = 2, 3; s_j(m) = (-1)^m for j = 1, 2 and 1 for j = 3, 4.
 * The terms are a Gaussian in m of width ~ sqrt(t): a handful of exponentials, each with full
 * relative accuracy, however small theta is (it decays like e^(-z^2/(pi t)) as q -> 1).
 */
import { exp, log, pi } from '../elementary.js';
import {
  add,
  div,
  fromInt,
  magnitude,
  mul,
  neg,
  ONE,
  Real,
  round,
  roundToBigInt,
  sqrt,
  sub,
  ZERO,
} from '../real.js';
import type { ThetaIndex } from './theta.js';
import { exactSub } from './trig.js';

/** One pass at W bits: [sum, magnitude of the largest term]. */
function gaussianSum(which: ThetaIndex, c: Real, t: Real, prec: number, W: number): [Real, number] {
  const piOverT = div(pi(W), t, W);
  const m0 = roundToBigInt(c);
  const alternating = which <= 2;
  let sum = ZERO;
  let largest = -Infinity;
  for (const dir of [1n, -1n]) {
    for (let k = dir === 1n ? 0n : 1n; ; k++) {
      const m = m0 + dir * k;
      const d = sub(fromInt(m), c, W);
      let term = exp(neg(mul(piOverT, mul(d, d, W), W)), W);
      if (alternating && m % 2n !== 0n) term = neg(term);
      sum = add(sum, term, W);
      const mt = magnitude(term);
      largest = Math.max(largest, mt);
      // past the centre each next term is smaller by at least e^(-pi/t) < 1/2: the tail is
      // below twice this term
      if (k > 0n && mt < Math.max(magnitude(sum), largest - 4 * prec) - prec - 10) break;
    }
  }
  return [sum, largest];
}

/**
 * theta_which(z, q) for 1/2 <= q < 1 by the transformed (Gaussian) sum, rounded to prec bits;
 * the precision is raised by the bits the alternating sums (j = 1, 2) cancel next to a zero, up to
 * 4 prec extra bits.
 */
export function thetaNearOne(which: ThetaIndex, z: Real, q: Real, prec: number): Real {
  // t = -log(q)/pi ~ (1 - q)/pi: log loses `near` bits next to q = 1, and the exponents
  // pi (m - c)^2 / t, of size up to ~ 1/t, need their integer bits (about near + 2) carried too
  const near = Math.max(0, -magnitude(exactSub(ONE, q)));
  const tBits = near + 4;
  const zBits = Math.max(0, magnitude(z));
  let W = prec + 24;
  for (let tries = 0; ; tries++) {
    const Wt = W + near + tBits + 8;
    const t = div(neg(log(q, Wt)), pi(Wt), Wt);
    const Wc = W + tBits + zBits;
    const shift = which === 1 || which === 4 ? new Real(1n, -1) : ZERO;
    const c = sub(div(z, pi(Wc), Wc), shift, Wc);
    const [s, largest] = gaussianSum(which, c, t, prec, W + tBits);
    const lost = s.m === 0n ? prec : largest - magnitude(s);
    if (lost <= 8 || tries >= 4 || lost > 4 * prec) {
      if (s.m === 0n) return ZERO;
      return round(div(s, sqrt(t, W), W), prec);
    }
    W += lost + 8;
  }
}
