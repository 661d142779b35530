/**
 * Jacobi theta functions theta_j(z, q), j = 1..4, for real z and nome 0 <= q < 1, by their
 * q-series (DLMF 20.2.1-20.2.4) summed in BigInt fixed point.
 */
import { EngineError } from '../../errors.js';
import {
  bitLength,
  cmp,
  fromFixed,
  ldexp,
  mul,
  ONE,
  Real,
  round,
  sign,
  sqrt,
  toFixed,
  ZERO,
} from '../real.js';
import { thetaNearOne } from './theta-transform.js';
import { cos, sin } from './trig.js';

const HALF = new Real(1n, -1);

export type ThetaIndex = 1 | 2 | 3 | 4;

/**
 * One pass of the series at w fixed-point bits. Returns S in units of 2^-w, where
 *   theta_1 = 2 q^(1/4) S,  S = sum_{n>=0} (-1)^n q^(n(n+1)) sin((2n+1) z)
 *   theta_2 = 2 q^(1/4) S,  S = sum_{n>=0}        q^(n(n+1)) cos((2n+1) z)
 *   theta_3 = S,            S = 1 + 2 sum_{n>=1}        q^(n^2) cos(2 n z)
 *   theta_4 = S,            S = 1 + 2 sum_{n>=1} (-1)^n q^(n^2) cos(2 n z)
 * and the number of terms. Stopping rule: after term n, stop once the weights have become
 * decreasing by a ratio of at most 1/2 (so the tail is at most twice the next term) and
 * twice the next term is below 2^-(prec+8) times the running sum |S| (and times `hint`, the
 * size of S found by an earlier pass, when that pass cancelled), or underflows.
 */
function series(
  which: ThetaIndex,
  z: Real,
  q: Real,
  prec: number,
  w: number,
  hint: bigint | null,
): [bigint, number] {
  const W = BigInt(w);
  const one = 1n << W;
  const qf = toFixed(q, w);
  const q2 = (qf * qf) >> W;
  const c2 = toFixed(cos(ldexp(z, 1), w), w);
  const s2 = toFixed(sin(ldexp(z, 1), w), w);
  const half = one >> 1n;
  const odd = which <= 2;
  const alternating = which === 1 || which === 4;
  // (C, S) = cos, sin of the current multiple of z; weight and ratio of the current term
  let C: bigint;
  let Sn: bigint;
  let weight: bigint;
  let ratio: bigint;
  let sum: bigint;
  let n: number;
  if (odd) {
    C = toFixed(cos(z, w), w);
    Sn = toFixed(sin(z, w), w);
    weight = one;
    ratio = q2; // q^(2n+2) at n = 0
    sum = 0n;
    n = 0;
  } else {
    C = c2;
    Sn = s2;
    weight = qf;
    ratio = (qf * q2) >> W; // q^(2n+1) at n = 1
    sum = one;
    n = 1;
  }
  const coef = odd ? 1n : 2n;
  for (;;) {
    const trig = which === 1 ? Sn : C;
    let term = (coef * weight * trig) >> W;
    if (alternating && n % 2 === 1) term = -term;
    sum += term;
    const next = (weight * ratio) >> W;
    const rNext = (ratio * q2) >> W;
    let absSum = sum < 0n ? -sum : sum;
    if (hint !== null && hint < absSum) absSum = hint;
    if (next === 0n || (rNext <= half && (2n * coef * next) << BigInt(prec + 8) <= absSum)) {
      return [sum, n + 1];
    }
    weight = next;
    ratio = rNext;
    const C1 = (C * c2 - Sn * s2) >> W;
    Sn = (Sn * c2 + C * s2) >> W;
    C = C1;
    n++;
  }
}

/**
 * Jacobi theta function theta_which(z, q) (DLMF 20.2.1-20.2.4) for real z and 0 <= q < 1, rounded
 * to prec bits relative to the value. For q >= 1/2 the imaginary transformation is used instead
 * (theta-transform.ts), which keeps relative accuracy as theta decays towards q = 1. Next to a zero of theta_1, theta_2 (z = k pi, pi/2 + k pi)
 * the working precision grows with the cancellation up to about 4 prec extra bits, then the
 * accuracy is absolute. Sums stop by the rule of `series` above: the tail bound (twice the next
 * term, once the term ratio is at most 1/2) below 2^-(prec+8) times the running sum.
 * EngineError outside 0 <= q < 1 or for an index other than 1..4.
 */
export function theta(which: ThetaIndex, z: Real, q: Real, prec: number): Real {
  if (which !== 1 && which !== 2 && which !== 3 && which !== 4) {
    throw new EngineError('theta: the index must be 1, 2, 3 or 4');
  }
  if (sign(q) < 0 || cmp(q, ONE) >= 0) {
    throw new EngineError('theta: the nome must satisfy 0 <= q < 1');
  }
  if (q.m === 0n) return which <= 2 ? ZERO : ONE;
  if (which === 1 && z.m === 0n) return ZERO;
  if (cmp(q, HALF) >= 0) return thetaNearOne(which, z, q, prec);
  let w = prec + 24;
  const cap = w + 4 * prec + 64;
  let hint: bigint | null = null;
  for (;;) {
    const [s, terms] = series(which, z, q, prec, w, hint);
    const need = prec + Math.ceil(Math.log2(terms + 1)) + 10;
    const have = bitLength(s);
    if (have >= need || w >= cap) {
      if (s === 0n) return ZERO;
      const S = fromFixed(s, w);
      if (which >= 3) return round(S, prec);
      const q4 = sqrt(sqrt(q, prec + 8), prec + 8);
      return round(ldexp(mul(q4, S, prec + 8), 1), prec);
    }
    const w1 = Math.min(cap, w + (need - have) + 8);
    hint = (s < 0n ? -s : s) << BigInt(w1 - w);
    w = w1;
  }
}
