import { describe, expect, it } from 'vitest';
import { EngineError } from '../../errors.js';
import { parseDecimal } from '../decimal.js';
import { pi } from '../elementary.js';
import { add, bitsFor, ldexp, mul, neg, ONE, powInt, Real, sqrt, sub, ZERO } from '../real.js';
import { ellipticK, nomeOfModulus } from './elliptic.js';
import {
  expectDigits,
  expectSame,
  hasMpmath,
  mpmath,
  NO_MPMATH,
  py,
} from './mpmath-reference.test.js';
import { theta, type ThetaIndex } from './theta.js';

const P = bitsFor(40);
const r = (t: string): Real => parseDecimal(t, P);
const pow4 = (x: Real): Real => powInt(x, 4, P);

describe('theta functions: identities', () => {
  it('theta_3^4 = theta_2^4 + theta_4^4 at z = 0 (DLMF 20.7.3)', () => {
    for (const q of [r('0.01'), r('0.3'), r('0.7'), r('0.95')]) {
      const [t2, t3, t4] = ([2, 3, 4] as const).map((j) => theta(j, ZERO, q, P));
      expectSame(pow4(t3!), add(pow4(t2!), pow4(t4!), P), 38);
    }
  });

  it('theta_3(0, e^-pi) = pi^(1/4) / Gamma(3/4) (DLMF 20.4 / 19.20 via K(1/sqrt 2))', () => {
    // K(1/sqrt 2) = (pi/2) theta_3(0, e^-pi)^2 (DLMF 20.9.1), with q(1/sqrt 2) = e^-pi
    const k = sqrt(new Real(1n, -1), P + 20);
    const t3 = theta(3, ZERO, nomeOfModulus(k, P + 8), P);
    expectSame(mul(ldexp(pi(P), -1), mul(t3, t3, P), P), ellipticK(k, P), 39);
    // from memory: 1.0864348112133080145753161215102234570702..., confirmed by mpmath below
    expectDigits(t3, '1.0864348112133080145753161215102234570702', 39);
  });

  it('theta_1 vanishes at 0 and pi; theta_1(z + pi/2) = theta_2(z) (DLMF 20.2.11)', () => {
    const q = r('0.4');
    const z = r('0.37');
    const hp = ldexp(pi(P + 16), -1);
    expectSame(theta(1, add(z, hp, P + 16), q, P), theta(2, z, q, P), 38);
    expect(theta(1, ZERO, q, P).m).toBe(0n);
    // next to the zero z = pi: theta_1(pi + d) = -theta_1'(0) d + O(d^3), theta_1'(0) =
    // theta_2 theta_3 theta_4 at z = 0 (DLMF 20.4.6); d = pi rounded to P + 16 bits minus pi
    const piR = pi(P + 16);
    const d = sub(piR, pi(P + 200), P);
    const slope = mul(mul(theta(2, ZERO, q, P), theta(3, ZERO, q, P), P), theta(4, ZERO, q, P), P);
    expectSame(theta(1, piR, q, P), neg(mul(slope, d, P)), 38);
  });

  it('q = 0 and domain errors', () => {
    expect(theta(3, r('0.5'), ZERO, P)).toEqual(ONE);
    expect(theta(1, r('0.5'), ZERO, P).m).toBe(0n);
    expect(() => theta(3, ZERO, ONE, P)).toThrow('theta: the nome must satisfy 0 <= q < 1');
    expect(() => theta(5 as ThetaIndex, ZERO, r('0.1'), P)).toThrow(EngineError);
  });
});

describe.skipIf(!hasMpmath)('theta: cross-check against mpmath at 40 digits', () => {
  it('matches on a table of (z, q)', () => {
    const cases: [string, string][] = [
      ['0', '0.1'],
      ['0.7', '0.3'],
      ['-1.9', '0.05'],
      ['2.5', '0.6'],
      ['12.3', '0.9'],
      ['0.001', '0.5'],
      ['0', '0.97'],
      ['1e-6', '1e-8'],
    ];
    const pts = cases.map(([z, q]) => [r(z), r(q)] as const);
    const js: ThetaIndex[] = [1, 2, 3, 4];
    const exprs = pts.flatMap(([z, q]) => js.map((j) => `jtheta(${j}, ${py(z)}, ${py(q)})`));
    const want = mpmath(exprs, 45);
    let i = 0;
    for (const [z, q] of pts) {
      for (const j of js) {
        const w = want[i++]!;
        if (j === 1 && z.m === 0n) expect(theta(1, z, q, P).m).toBe(0n);
        else expectDigits(theta(j, z, q, P), w, 40);
      }
    }
  });

  it('matches next to q = 1, where theta decays like e^(-z^2/(pi t)) (mpmath at 900 digits)', () => {
    // [z, q, indices]: theta_4(0, 0.9999) ~ 2e-10713 is beyond mpmath's jtheta at this precision
    const cases: [string, string, ThetaIndex[]][] = [
      ['0.875', '0.99', [1, 2, 3, 4]],
      ['0.875', '0.999', [1, 2, 3, 4]],
      ['-2.2', '0.9995', [1, 2, 3, 4]],
      ['0', '0.9999', [2, 3]],
      ['1.5', '0.75', [1, 2, 3, 4]],
    ];
    const exprs = cases.flatMap(([z, q, js]) =>
      js.map((j) => `jtheta(${j}, ${py(r(z))}, ${py(r(q))})`),
    );
    const want = mpmath(exprs, 45, 900);
    let i = 0;
    for (const [z, q, js] of cases) {
      for (const j of js) expectDigits(theta(j, r(z), r(q), P), want[i++]!, 40);
    }
  }, 30_000);

  it('theta_4(0, q) next to q = 1 against its transformed sum evaluated by mpmath', () => {
    // DLMF 20.7.33 at z = 0: theta_4(0, q) = t^(-1/2) sum_m exp(-pi (m + 1/2)^2 / t), t = -log(q)/pi
    const q = r('0.9999');
    const [w] = mpmath(
      [`(lambda t: nsum(lambda m: exp(-pi*(m+0.5)**2/t), [-inf, inf])/sqrt(t))(-log(${py(q)})/pi)`],
      45,
      200,
    );
    expectDigits(theta(4, ZERO, q, P), w!, 40);
  });

  it('theta_3(0, e^-pi) closed form', () => {
    const [w] = mpmath(['pi**0.25/gamma(0.75)'], 45);
    const k = sqrt(new Real(1n, -1), P + 20);
    expectDigits(theta(3, ZERO, nomeOfModulus(k, P + 8), P), w!, 39);
  });
});
if (!hasMpmath) describe('theta: mpmath', () => it.skip(NO_MPMATH, () => undefined));
