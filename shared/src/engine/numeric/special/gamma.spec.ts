import { describe, expect, it } from 'vitest';
import { EngineError } from '../../errors.js';
import { parseDecimal } from '../decimal.js';
import { pi } from '../elementary.js';
import { bitsFor, div, fromFraction, fromInt, mul, Real, sqrt } from '../real.js';
import { gammaOneThird } from './airy.js';
import { bernoulli2n } from './bernoulli.js';
import { gamma, lgamma } from './gamma.js';
import {
  expectDigits,
  expectSame,
  hasMpmath,
  mpmath,
  NO_MPMATH,
  py,
} from './mpmath-reference.test.js';
import { exactSub, sinPi } from './trig.js';

const P = bitsFor(40);
const r = (t: string): Real => parseDecimal(t, P);
const third = fromFraction(1n, 3n, P + 20);

describe('gamma: published values', () => {
  it('Gamma(1/2) = sqrt(pi) (DLMF 5.4.6), Gamma(-1/2) = -2 sqrt(pi) (DLMF 5.5.1)', () => {
    const rootPi = sqrt(pi(P), P);
    expectSame(gamma(new Real(1n, -1), P), rootPi, 40);
    expectSame(gamma(new Real(-1n, -1), P), mul(fromInt(-2), rootPi, P), 40);
  });

  it('Gamma(1/3) (DLMF 5.4: digits as quoted in the brief, from memory; mpmath below)', () => {
    const want = '2.678938534707747633655692940974677644128689377957301100950428';
    expectDigits(gamma(third, P), want, 40);
    // an independent route: the AGM form through K(sin(pi/12))
    expectDigits(gammaOneThird(P), want, 40);
  });

  it('Gamma(1/4) (from memory; mpmath below) and K(1/sqrt 2) = Gamma(1/4)^2 / (4 sqrt pi)', () => {
    const g = gamma(new Real(1n, -2), P);
    expectDigits(g, '3.625609908221908311930685155867672002995167682880065467433', 40);
  });

  it('integers are factorials; poles are errors naming the point', () => {
    expect(gamma(fromInt(5), P)).toEqual(fromInt(24));
    expectSame(gamma(fromInt(31), P), fromInt(265252859812191058636308480000000n), 40);
    expect(() => gamma(fromInt(-2), P)).toThrow('gamma: pole at x = -2');
    expect(() => gamma(fromInt(0), P)).toThrow(EngineError);
    expect(() => lgamma(fromInt(-7), P)).toThrow('lgamma: pole at x = -7');
  });

  it('reflection Gamma(x) Gamma(1 - x) = pi / sin(pi x) (DLMF 5.5.3), also next to a pole', () => {
    for (const x of [r('0.3'), r('-3.7'), new Real((-5n << 80n) + 1n, -80)]) {
      const lhs = mul(gamma(x, P), gamma(exactSub(fromInt(1), x), P), P);
      expectSame(lhs, div(pi(P), sinPi(x, P), P), 39);
    }
  });

  it('Bernoulli numbers B_2..B_12 (DLMF 24.2.1 table)', () => {
    const want = ['1/6', '-1/30', '1/42', '-1/30', '5/66', '-691/2730'];
    expect([1, 2, 3, 4, 5, 6].map((n) => bernoulli2n(n).join('/'))).toEqual(want);
  });
});

describe.skipIf(!hasMpmath)('gamma: cross-check against mpmath at 40 digits', () => {
  it('matches on a table of arguments', () => {
    const xs = [
      '0.001',
      '0.77',
      '1.5',
      '3.14159',
      '17.25',
      '60.5',
      '250.125',
      '-0.5',
      '-4.2',
      '-9.99',
    ];
    const vals = xs.map(r);
    vals.push(third);
    const want = mpmath(
      vals.flatMap((x) => [`gamma(${py(x)})`, `log(abs(gamma(${py(x)})))`]),
      45,
    );
    vals.forEach((x, i) => {
      expectDigits(gamma(x, P), want[2 * i]!, 40);
      expectDigits(lgamma(x, P), want[2 * i + 1]!, 39, 1);
    });
  });

  it('the quoted constants', () => {
    const [g13, g14] = mpmath(['gamma(mpf(1)/3)', 'gamma(mpf(1)/4)'], 45);
    expectDigits(gamma(third, P), g13!, 40);
    expectDigits(gamma(new Real(1n, -2), P), g14!, 40);
  });
});
if (!hasMpmath) describe('gamma: mpmath', () => it.skip(NO_MPMATH, () => undefined));
