import { describe, expect, it } from 'vitest';
import {
  add,
  div,
  fromFixed,
  fromNumber,
  mul,
  Real,
  sqrt,
  sub,
  toFixed,
  toNumber,
  ZERO,
} from '../real.js';
import { DD_UNIT, ddAdd, ddDiv, ddMul, ddSqrt, ddToReal, R } from './double-double.js';
import {
  determinantCoefficients,
  type FixedMatrix,
  tridiagonalize,
  tridiagonalPowerTraces,
} from './matrix.js';
import {
  determinantCoefficientsDD,
  fixedToDD,
  tridiagonalizeDD,
  tridiagonalPowerTracesDD,
} from './matrix-dd.js';

const P = 300;

/** A reproducible symmetric matrix with entries in (-1/2, 1/2) scaled by 1/n. */
function randomSymmetric(n: number, seed: number): Real[] {
  let s = seed;
  const next = (): number => {
    s = (s * 1103515245 + 12345) % 2147483648;
    return s / 2147483648 - 0.5;
  };
  const a = new Array<Real>(n * n);
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++) a[i * n + j] = a[j * n + i] = fromNumber(next() / n);
  return a;
}

/** Tr A^L by dense products in Real at 300 bits: the brute force the banded traces replace. */
function denseTraces(a: Real[], n: number, nMax: number): Real[] {
  let pow = a;
  const out: Real[] = [];
  for (let power = 1; power <= nMax; power++) {
    let t: Real = ZERO;
    for (let i = 0; i < n; i++) t = add(t, pow[i * n + i]!, P);
    out.push(t);
    const next = new Array<Real>(n * n);
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        let s: Real = ZERO;
        for (let k = 0; k < n; k++) s = add(s, mul(pow[i * n + k]!, a[k * n + j]!, P), P);
        next[i * n + j] = s;
      }
    pow = next;
  }
  return out;
}

/** e_k of the eigenvalues = sums of principal k x k minors, by the Faddeev-LeVerrier relation
 * k e_k = sum_(i=1..k) (-1)^(i-1) e_(k-i) p_i from the power sums p_i (independent of T). */
function fromPowerSums(p: Real[], nMax: number): Real[] {
  const e: Real[] = [fromNumber(1)];
  for (let k = 1; k <= nMax; k++) {
    let s: Real = ZERO;
    for (let i = 1; i <= k; i++) {
      const t = mul(e[k - i]!, p[i - 1]!, P);
      s = i % 2 === 1 ? add(s, t, P) : sub(s, t, P);
    }
    e.push(div(s, fromNumber(k), P));
  }
  return e;
}

const rel = (a: Real, b: Real): number =>
  Math.abs(toNumber(sub(a, b, P))) / Math.max(Math.abs(toNumber(b)), 1e-300);

describe('double-double operations against 300-bit Reals', () => {
  it('products, sums, quotients and roots are within a few units of 2^-104', () => {
    const xs = [Math.PI, Math.E / 3, -1 / 7, 1e-9 * Math.SQRT2, 12345.678];
    for (const a of xs)
      for (const b of xs) {
        const A = ddToReal(a, a * 1e-17);
        const B = ddToReal(b, b * -3e-17);
        ddMul(a, a * 1e-17, b, b * -3e-17);
        expect(rel(ddToReal(R[0], R[1]), mul(A, B, P))).toBeLessThan(4 * DD_UNIT);
        ddAdd(a, a * 1e-17, b, b * -3e-17);
        const s = add(A, B, P);
        if (toNumber(s) !== 0) expect(rel(ddToReal(R[0], R[1]), s)).toBeLessThan(4 * DD_UNIT);
        ddDiv(a, a * 1e-17, b, b * -3e-17);
        expect(rel(ddToReal(R[0], R[1]), div(A, B, P))).toBeLessThan(8 * DD_UNIT);
      }
    for (const a of xs.filter((x) => x > 0)) {
      ddSqrt(a, 0);
      expect(rel(ddToReal(R[0], R[1]), sqrt(fromNumber(a), P))).toBeLessThan(8 * DD_UNIT);
    }
  });
});

describe('tridiagonal reduction: traces and determinant coefficients', () => {
  const n = 12;
  const nMax = 7;
  const F = 120;
  const a = randomSymmetric(n, 7);
  const M: FixedMatrix = { n, a: a.map((x) => toFixed(x, F)) };
  const exact = a.map((_, i) => fromFixed(M.a[i]!, F));
  const traces = denseTraces(exact, n, nMax);
  const coeff = fromPowerSums(traces, nMax);

  it('fixed point: banded traces of T equal Tr A^L of the dense matrix', () => {
    const { d, e } = tridiagonalize(M, F);
    const t = tridiagonalPowerTraces(d, e, nMax, F);
    t.forEach((v, i) => {
      expect(Math.abs(toNumber(sub(fromFixed(v, F), traces[i]!, P)))).toBeLessThan(1e-30);
    });
    const c = determinantCoefficients(d, e, nMax, F);
    c.forEach((v, k) => {
      expect(Math.abs(toNumber(sub(fromFixed(v, F), coeff[k]!, P)))).toBeLessThan(1e-30);
    });
  });

  it('double-double: the same values within its unit roundoff', () => {
    const { d, e } = tridiagonalizeDD(n, fixedToDD(M, F));
    const t = tridiagonalPowerTracesDD(d, e, nMax);
    for (let i = 0; i < nMax; i++)
      expect(Math.abs(toNumber(sub(ddToReal(t.hi[i]!, t.lo[i]!), traces[i]!, P)))).toBeLessThan(
        4 * n * n * DD_UNIT,
      );
    const c = determinantCoefficientsDD(d, e, nMax);
    for (let k = 0; k <= nMax; k++)
      expect(Math.abs(toNumber(sub(ddToReal(c.hi[k]!, c.lo[k]!), coeff[k]!, P)))).toBeLessThan(
        4 * n * n * DD_UNIT,
      );
  });
});
