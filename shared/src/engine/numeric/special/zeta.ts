/**
 * The Riemann zeta function for real s != 1: for s > 0 the alternating-series acceleration of
 * the eta function eta(s) = (1 - 2^(1-s)) zeta(s) with Chebyshev-derived integer weights d_k
 * (error about 3 / (3 + sqrt 8)^n after n terms); for s < 0 the functional equation
 * zeta(s) = 2^s pi^(s-1) sin(pi s / 2) Gamma(1 - s) zeta(1 - s) (DLMF 25.4.1), with the exact
 * values zeta(-2m) = 0 and zeta(1 - 2m) = -B_2m / (2m) (DLMF 25.6.3-4) at negative integers.
 */
import { EngineError } from '../../errors.js';
import { exp, ln2, pi, powReal } from '../elementary.js';
import {
  cmp,
  div,
  fromFixed,
  fromFraction,
  ldexp,
  magnitude,
  mul,
  neg,
  ONE,
  Real,
  round,
  sign,
  sub,
  toFixed,
  toNumber,
  ZERO,
} from '../real.js';
import { bernoulli2n } from './bernoulli.js';
import { asInteger, gamma } from './gamma.js';
import { exactSub, sinPi } from './trig.js';

/** log2(3 + sqrt 8): bits gained per term of the accelerated series. */
const BITS_PER_TERM = 2.5431066063272239;

/** The weights e_k = d_n - d_k, k = 0..n-1, and d_n (exact integers). */
function weights(n: number): { e: bigint[]; dn: bigint } {
  const N = BigInt(n);
  const d: bigint[] = [];
  let term = 1n; // n (n+i-1)! 4^i / ((n-i)! (2i)!) at i = 0
  let acc = 1n;
  d.push(acc);
  for (let i = 1n; i <= N; i++) {
    term = (term * 4n * (N + i - 1n) * (N - i + 1n)) / (2n * i * (2n * i - 1n));
    acc += term;
    d.push(acc);
  }
  const dn = d[n]!;
  return { e: d.slice(0, n).map((dk) => dn - dk), dn };
}

const weightCache = new Map<number, { e: bigint[]; dn: bigint }>();

/** Smallest prime factor of every m <= n (0 and 1 map to themselves). */
function smallestFactors(n: number): number[] {
  const f = Array.from({ length: n + 1 }, (_, i) => i);
  for (let p = 2; p * p <= n; p++) {
    if (f[p] !== p) continue;
    for (let m = p * p; m <= n; m += p) if (f[m] === m) f[m] = p;
  }
  return f;
}

/** 2 atanh(1/k) = log((k + 1)/(k - 1)) in fixed point (2^-w units), k >= 3. */
function logRatio(k: bigint, w: number): bigint {
  const k2 = k * k;
  let power = (2n << BigInt(w)) / k; // 2 / k^(2j+1)
  let sum = 0n;
  for (let j = 1n; power !== 0n; j += 2n) {
    sum += power / j;
    power /= k2;
  }
  return sum;
}

/**
 * m^-s for m = 1..n in fixed point (2^-w units): exact integer division for integer s > 0;
 * otherwise exp(-s log p) at the primes p, with log p = log(p - 1) + 2 atanh(1/(2p - 1)) built
 * from the logs of smaller numbers, and products for composite m.
 */
function inversePowers(s: Real, n: number, w: number): bigint[] {
  const W = BigInt(w);
  const one = 1n << W;
  const out: bigint[] = [0n, one];
  const si = asInteger(s);
  if (si !== null && si > 0n && si < 100000n) {
    for (let m = 2; m <= n; m++) out.push(one / BigInt(m) ** si);
    return out;
  }
  const spf = smallestFactors(n);
  const wl = w + 8 + Math.max(0, magnitude(s)); // log bits: s log m must stay accurate
  const logs: bigint[] = [0n, 0n];
  for (let m = 2; m <= n; m++) {
    const p = spf[m]!;
    if (p === m) {
      logs.push(m === 2 ? toFixed(ln2(wl), wl) : logs[m - 1]! + logRatio(BigInt(2 * m - 1), wl));
      out.push(toFixed(exp(neg(mul(s, fromFixed(logs[m]!, wl), wl)), w + 4), w));
    } else {
      logs.push(logs[p]! + logs[m / p]!);
      out.push((out[p]! * out[m / p]!) >> W);
    }
  }
  return out;
}

/** zeta(s) for s > 0, s != 1, by the accelerated alternating series. */
function zetaPositive(s: Real, prec: number): Real {
  const s1 = exactSub(ONE, s); // 1 - s
  // 1 - 2^(1-s) loses bits when s is close to 1
  const near = Math.max(0, -magnitude(s1));
  const W = prec + 16 + near;
  const n = Math.ceil((prec + 8 + near) / BITS_PER_TERM) + 2;
  let wt = weightCache.get(n);
  if (!wt) {
    wt = weights(n);
    weightCache.set(n, wt);
  }
  const w = W + Math.ceil(Math.log2(n + 1));
  const t = inversePowers(s, n, w);
  let sum = 0n;
  for (let k = 0; k < n; k++) {
    const term = wt.e[k]! * t[k + 1]!;
    sum += k % 2 === 0 ? term : -term;
  }
  const eta = div(fromFixed(sum, w), new Real(wt.dn, 0), W);
  const pow = exp(mul(s1, ln2(W + 8), W + 8), W + near); // 2^(1-s)
  const denom = sub(ONE, pow, W);
  return div(eta, denom, prec);
}

/**
 * Riemann zeta(s) for real s, rounded to prec bits; EngineError 'zeta: pole at s = 1' at s = 1.
 * zeta(0) = -1/2; zero exactly at the negative even integers.
 */
export function zeta(s: Real, prec: number): Real {
  if (cmp(s, ONE) === 0) throw new EngineError('zeta: pole at s = 1');
  if (s.m === 0n) return new Real(-1n, -1);
  if (sign(s) > 0) {
    // zeta(s) - 1 < 2^(2-s): beyond prec + 2 only the 1 remains
    if (toNumber(s) > prec + 4) return ONE;
    return zetaPositive(s, prec);
  }
  const si = asInteger(s);
  if (si !== null) {
    const m = -si;
    if (m % 2n === 0n) return ZERO;
    const h = Number((m + 1n) / 2n); // zeta(-m) = -B_(m+1)/(m+1), m + 1 = 2h
    const [bn, bd] = bernoulli2n(h);
    return fromFraction(-bn, bd * BigInt(2 * h), prec);
  }
  const W = prec + 12;
  const oneMinus = exactSub(ONE, s);
  const twoPi = ldexp(pi(W + 8), 1);
  const a = div(powReal(twoPi, s, W), pi(W), W); // 2^s pi^(s-1)
  const b = sinPi(ldexp(s, -1), W);
  const g = gamma(oneMinus, W);
  const z = zetaPositive(oneMinus, W);
  return round(mul(mul(a, b, W), mul(g, z, W), W), prec);
}
