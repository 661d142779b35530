import { gcdInt } from '../../integers.js';
import { cosh, exp, sinh } from '../elementary.js';
import {
  add,
  div,
  fromFraction,
  fromInt,
  fromNumber,
  ldexp,
  mul,
  neg,
  ONE,
  Real,
  sub,
  toNumber,
  ZERO,
} from '../real.js';

/**
 * A quadrature rule for the Nystrom discretisation: nodes, positive weights, and for a rule
 * symmetric under the reflection x -> 2c - x the index of each node's mirror (`mirror[i] === i`
 * for a node on the axis). `keys` name the nodes so that nested resolutions share kernel values.
 */
export interface Rule {
  nodes: Real[];
  weights: Real[];
  mirror: number[] | null;
  keys: string[];
  /** The rule in words, for the result ("trapezoid after x = 10 sinh t, h = 0.02, 201 points"). */
  text: string;
}

/** A family of rules with a resolution parameter m that refinement doubles. */
export interface RuleFamily {
  at(m: number): Rule;
  /** The number of nodes of the rule at m (without building it). */
  points(m: number): number;
  /** True when the rule at m contains the nodes of the rule at m / 2 (trapezoid-type). */
  nested: boolean;
}

/** Ratio window / scale of the sinh map on the line, chosen by measurement on the line kernel. */
export const SINH_RATIO = 8;

const short = (x: Real): string => {
  const v = toNumber(x);
  return Number.isInteger(v) ? String(v) : v.toPrecision(4);
};

/**
 * The line (-inf, inf) cut at |x| <= X: trapezoid in t after x = a sinh t with a = X / 8, nodes
 * t = T k / m (k = -m..m, T = asinh 8). The map spreads the nodes where the integrand is small;
 * analytic integrands that decay exponentially converge exponentially in m.
 */
export function lineFamily(X: Real, prec: number): RuleFamily {
  const a = div(X, fromInt(SINH_RATIO), prec);
  const T = asinh(SINH_RATIO, prec);
  return {
    nested: true,
    points: (m) => 2 * m + 1,
    at(m: number): Rule {
      const half = sinhNodes(a, T, m, prec);
      const nodes: Real[] = [];
      const weights: Real[] = [];
      const keys: string[] = [];
      const mirror: number[] = [];
      for (let k = -m; k <= m; k++) {
        const j = Math.abs(k);
        nodes.push(k < 0 ? neg(half.x[j]!) : half.x[j]!);
        weights.push(half.w[j]!);
        keys.push(fractionKey(k, m));
        mirror.push(m - k);
      }
      const h = toNumber(T) / m;
      return {
        nodes,
        weights,
        keys,
        mirror,
        text: `trapezoid after x = ${short(a)} sinh t, h = ${h.toPrecision(3)}, |x| <= ${short(X)}, ${2 * m + 1} points`,
      };
    },
  };
}

/**
 * The half-line from `a` towards `dir` (+1: [a, inf), -1: (-inf, a]) cut at distance X:
 * trapezoid in t after x = a + dir s exp(t - exp(-t)) with s = X / 8 (double-exponential
 * approach to the end a, exponential growth towards infinity).
 */
export function halfLineFamily(
  a: Real,
  dir: 1 | -1,
  X: Real,
  tol: number,
  prec: number,
): RuleFamily {
  const s = div(X, fromInt(SINH_RATIO), prec);
  // t range: from where the node is within tol of the end (exp(-e^|t|) < tol) to x = a + X
  const tLo = -Math.log(Math.log(1 / tol) + 2);
  let tHi = Math.log(SINH_RATIO);
  for (let i = 0; i < 60; i++) tHi = Math.log(SINH_RATIO) + Math.exp(-tHi);
  const span = fromNumber(Math.ceil((tHi - tLo) * 8) / 8);
  const lo = fromNumber(Math.floor(tLo * 8) / 8);
  return {
    nested: true,
    points: (m) => m + 1,
    at(m: number): Rule {
      const nodes: Real[] = [];
      const weights: Real[] = [];
      const keys: string[] = [];
      const h = div(span, fromInt(m), prec);
      for (let k = 0; k <= m; k++) {
        const t = add(lo, mul(span, fromFraction(BigInt(k), BigInt(m), prec), prec), prec);
        const emt = exp(neg(t), prec);
        const u = exp(sub(t, emt, prec), prec);
        const x = mul(s, u, prec);
        nodes.push(add(a, dir > 0 ? x : neg(x), prec));
        weights.push(mul(mul(x, add(ONE, emt, prec), prec), h, prec));
        keys.push(fractionKey(k, m));
      }
      return {
        nodes,
        weights,
        keys,
        mirror: null,
        text: `trapezoid after x = ${short(a)} ${dir > 0 ? '+' : '-'} ${short(s)} exp(t - exp(-t)), h = ${(toNumber(span) / m).toPrecision(3)}, ${m + 1} points`,
      };
    },
  };
}

/** The circle [a, b): the periodic trapezoid with 2m nodes centred on the midpoint. */
export function circleFamily(a: Real, b: Real, prec: number): RuleFamily {
  const c = ldexp(add(a, b, prec), -1);
  const P = sub(b, a, prec);
  return {
    nested: true,
    points: (m) => 2 * m,
    at(m: number): Rule {
      const n = 2 * m;
      const w = div(P, fromInt(n), prec);
      const nodes: Real[] = [];
      const weights: Real[] = [];
      const keys: string[] = [];
      const mirror: number[] = [];
      for (let k = -m; k < m; k++) {
        nodes.push(add(c, mul(P, fromFraction(BigInt(k), BigInt(n), prec), prec), prec));
        weights.push(w);
        keys.push(fractionKey(k, n));
        mirror.push(k === -m ? 0 : m - k);
      }
      return { nodes, weights, keys, mirror, text: `periodic trapezoid, ${n} points` };
    },
  };
}

/** The interval [a, b]: Gauss-Legendre with m nodes (nodes by Newton on P_m at prec bits). */
export function intervalFamily(a: Real, b: Real, prec: number): RuleFamily {
  const c = ldexp(add(a, b, prec), -1);
  const r = ldexp(sub(b, a, prec), -1);
  return {
    nested: false,
    points: (m) => m,
    at(m: number): Rule {
      const gl = gaussLegendre(m, prec);
      const nodes = gl.x.map((x) => add(c, mul(r, x, prec), prec));
      const weights = gl.w.map((w) => mul(r, w, prec));
      const keys = gl.x.map((_, i) => `gl${m}:${i}`);
      const mirror = gl.x.map((_, i) => m - 1 - i);
      return { nodes, weights, keys, mirror, text: `Gauss-Legendre, ${m} points` };
    },
  };
}

/** Nodes (ascending) and weights of the m-point Gauss-Legendre rule on [-1, 1]. */
export function gaussLegendre(m: number, prec: number): { x: Real[]; w: Real[] } {
  const x: Real[] = new Array<Real>(m);
  const w: Real[] = new Array<Real>(m);
  const p = prec + 16;
  for (let i = 0; i < Math.floor((m + 1) / 2); i++) {
    // i-th largest root; float start, then Newton with doubling precision
    let z = fromNumber(Math.cos((Math.PI * (i + 0.75)) / (m + 0.5)));
    let bits = 40;
    let dp = ONE;
    for (let it = 0; it < 200; it++) {
      bits = Math.min(2 * bits, p);
      const lp = legendre(m, z, bits + 8);
      dp = lp.d;
      const dz = div(lp.p, lp.d, bits + 8);
      z = sub(z, dz, bits + 8);
      if (
        bits >= p &&
        (dz.m === 0n || toNumber(dz) === 0 || Math.log2(Math.abs(toNumber(dz))) < -p)
      )
        break;
    }
    dp = legendre(m, z, p).d;
    const z2 = mul(z, z, p);
    const wi = div(fromInt(2), mul(sub(ONE, z2, p), mul(dp, dp, p), p), p);
    x[m - 1 - i] = z;
    x[i] = neg(z);
    w[i] = wi;
    w[m - 1 - i] = wi;
  }
  if (m % 2 === 1) x[(m - 1) / 2] = ZERO;
  return { x, w };
}

/** P_m(z) and P_m'(z) by the three-term recurrence. */
function legendre(m: number, z: Real, prec: number): { p: Real; d: Real } {
  let p0: Real = ONE;
  let p1: Real = z;
  for (let k = 2; k <= m; k++) {
    const t = sub(mulIntR(mul(z, p1, prec), 2 * k - 1, prec), mulIntR(p0, k - 1, prec), prec);
    p0 = p1;
    p1 = div(t, fromInt(k), prec);
  }
  // P_m' = m (z P_m - P_{m-1}) / (z^2 - 1)
  const d = div(
    mulIntR(sub(mul(z, p1, prec), p0, prec), m, prec),
    sub(mul(z, z, prec), ONE, prec),
    prec,
  );
  return { p: m === 0 ? ONE : p1, d };
}

function mulIntR(a: Real, k: number, prec: number): Real {
  return mul(a, fromInt(k), prec);
}

/** asinh(v) for a small integer v. */
function asinh(v: number, prec: number): Real {
  // log(v + sqrt(v^2 + 1)) by Newton on sinh
  let t = fromNumber(Math.asinh(v));
  const target = fromInt(v);
  for (let bits = 50; ;) {
    bits = Math.min(2 * bits, prec + 16);
    const s = sinh(t, bits);
    t = sub(t, div(sub(s, target, bits), cosh(t, bits), bits), bits);
    if (bits >= prec + 16) break;
  }
  return t;
}

/**
 * Half of the sinh rule: x_k = a sinh(T k / m), w_k = a cosh(T k / m) T / m for k = 0..m, from
 * E_k = exp(T k / m) = E_1^k (products instead of m exponentials; 16 + log2(m) guard bits cover
 * the rounding the products accumulate).
 */
function sinhNodes(a: Real, T: Real, m: number, prec: number): { x: Real[]; w: Real[] } {
  const p = prec + 16 + Math.ceil(Math.log2(m + 1));
  const x: Real[] = [];
  const w: Real[] = [];
  const h = div(T, fromInt(m), p);
  const step = exp(h, p);
  const stepInv = div(ONE, step, p);
  let E: Real = ONE;
  let Einv: Real = ONE;
  for (let k = 0; k <= m; k++) {
    x.push(k === 0 ? ZERO : mul(a, ldexp(sub(E, Einv, p), -1), prec));
    w.push(mul(mul(a, ldexp(add(E, Einv, p), -1), p), h, prec));
    E = mul(E, step, p);
    Einv = mul(Einv, stepInv, p);
  }
  return { x, w };
}

/** A reduced fraction k/m as text, naming a node position independently of the resolution. */
function fractionKey(k: number, m: number): string {
  const g = gcdInt(k, m);
  return `${k / g}/${m / g}`;
}
