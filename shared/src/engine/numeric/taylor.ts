import type { Estimate } from './estimate.js';
import { pi } from './elementary.js';
import {
  add,
  div,
  fromInt,
  fromNumber,
  ldexp,
  mul,
  powInt,
  Real,
  sub,
  toNumber,
  ZERO,
} from './real.js';
import { cos } from './special/trig.js';

/**
 * Taylor coefficients c_0..c_n of a function of one real variable known only by its values (a
 * grand function Xi(kappa) given as an expression), by Chebyshev interpolation on [-r, r]: the
 * interpolant sum_k a_k T_k(kappa / r) of degree M at the M + 1 Chebyshev points, expanded in
 * powers of kappa (common practice for analytic functions; the interpolant converges
 * geometrically in M inside the ellipse of analyticity). Two degrees M and M + 16 are computed;
 * their difference, plus the values' own errors amplified by the expansion, is the error
 * estimate (an estimate, not a bound). `prec` must carry the cancellation of the expansion:
 * callers add M + 32 bits to the digits they need.
 */
export function taylorByInterpolation(
  f: (x: Real) => Estimate,
  n: number,
  r: Real,
  prec: number,
): Estimate[] {
  const M1 = n + 24;
  const c1 = coefficients(f, n, M1, r, prec);
  const c2 = coefficients(f, n, M1 + 16, r, prec);
  return c2.map((c, N) => ({
    value: c.value,
    error: Math.abs(toNumber(sub(c.value, c1[N]!.value, prec))) + c.error,
  }));
}

function coefficients(
  f: (x: Real) => Estimate,
  n: number,
  M: number,
  r: Real,
  prec: number,
): Estimate[] {
  const K = M + 1;
  const p = pi(prec);
  const theta: Real[] = [];
  const values: Estimate[] = [];
  for (let j = 0; j < K; j++) {
    const t = div(mul(p, fromNumber(j + 0.5), prec), fromInt(K), prec);
    theta.push(t);
    values.push(f(mul(r, cos(t, prec), prec)));
  }
  // a_k = (2/K) sum_j f(x_j) T_k(x_j), a_0 halved; T_k(x_j) by the three-term recurrence
  const acc: Real[] = new Array<Real>(M + 1).fill(ZERO);
  for (let j = 0; j < K; j++) {
    const x = cos(theta[j]!, prec);
    const fj = values[j]!.value;
    let tPrev: Real = fromInt(1);
    let tCur = x;
    acc[0] = add(acc[0]!, fj, prec);
    if (M >= 1) acc[1] = add(acc[1]!, mul(fj, x, prec), prec);
    for (let k = 2; k <= M; k++) {
      const tNext = sub(ldexp(mul(x, tCur, prec), 1), tPrev, prec);
      acc[k] = add(acc[k]!, mul(fj, tNext, prec), prec);
      tPrev = tCur;
      tCur = tNext;
    }
  }
  const a = acc.map((s, k) => {
    const v = div(ldexp(s, 1), fromInt(K), prec);
    return k === 0 ? ldexp(v, -1) : v;
  });
  // monomial coefficients of T_k (t[k][j]), T_(k+1) = 2 x T_k - T_(k-1), exact integers
  let prev: bigint[] = [1n];
  let curr: bigint[] = [0n, 1n];
  const monomial: Real[] = new Array<Real>(n + 1).fill(ZERO);
  const absSum: number[] = new Array<number>(n + 1).fill(0);
  const addTerm = (k: number, t: bigint[]): void => {
    for (let N = 0; N <= n && N < t.length; N++) {
      if (t[N] === 0n) continue;
      monomial[N] = add(monomial[N]!, mul(a[k]!, new Real(t[N]!, 0), prec), prec);
      absSum[N]! += Math.abs(Number(t[N]!));
    }
  };
  addTerm(0, prev);
  if (M >= 1) addTerm(1, curr);
  for (let k = 2; k <= M; k++) {
    const next: bigint[] = new Array<bigint>(k + 1).fill(0n);
    for (let j = 0; j < curr.length; j++) next[j + 1] = 2n * curr[j]!;
    for (let j = 0; j < prev.length; j++) next[j] = next[j]! - prev[j]!;
    addTerm(k, next);
    prev = curr;
    curr = next;
  }
  // the values' errors reach a_k at most as their largest error times 2; the expansion sums them
  // with the monomial coefficients' sizes
  const valueError = Math.max(...values.map((v) => v.error));
  return monomial.map((m, N) => {
    const rN = powInt(r, N, prec);
    const scale = Math.abs(toNumber(rN));
    return {
      value: div(m, rN, prec),
      error:
        (2 * valueError * absSum[N]!) / scale + (Math.abs(toNumber(m)) * 2 ** -(prec - 8)) / scale,
    };
  });
}
