import { describe, expect, it } from 'vitest';
import { parseDecimal } from '../decimal.js';
import { pi } from '../elementary.js';
import { bitsFor, div, fromInt, ONE, powInt, Real, ZERO } from '../real.js';
import {
  expectDigits,
  expectSame,
  hasMpmath,
  mpmath,
  NO_MPMATH,
  py,
} from './mpmath-reference.test.js';
import { zeta } from './zeta.js';

const P = bitsFor(40);
const r = (t: string): Real => parseDecimal(t, P);

describe('zeta: published values', () => {
  it('zeta(2) = pi^2/6, zeta(4) = pi^4/90 (DLMF 25.6.1)', () => {
    expectSame(zeta(fromInt(2), P), div(powInt(pi(P), 2, P), fromInt(6), P), 40);
    expectSame(zeta(fromInt(4), P), div(powInt(pi(P), 4, P), fromInt(90), P), 40);
  });

  it('zeta(3), Apery (digits as quoted in the brief, from memory; mpmath below)', () => {
    expectDigits(
      zeta(fromInt(3), P),
      '1.2020569031595942853997381615114499907649862923404988817922715553',
      40,
    );
  });

  it('zeta(1/2) (from memory; mpmath below)', () => {
    expectDigits(zeta(new Real(1n, -1), P), '-1.4603545088095868128894991525152980125', 37);
  });

  it('zeta(0) = -1/2, zeta(-1) = -1/12, zeta(-2) = 0, zeta(-7) = 1/240 (DLMF 25.6.2-4)', () => {
    expect(zeta(ZERO, P)).toEqual(new Real(-1n, -1));
    expectSame(zeta(fromInt(-1), P), div(fromInt(-1), fromInt(12), P), 40);
    expect(zeta(fromInt(-2), P).m).toBe(0n);
    expectSame(zeta(fromInt(-7), P), div(ONE, fromInt(240), P), 40);
  });

  it('pole at s = 1', () => {
    expect(() => zeta(ONE, P)).toThrow('zeta: pole at s = 1');
  });
});

describe.skipIf(!hasMpmath)('zeta: cross-check against mpmath at 40 digits', () => {
  it('matches on a table of arguments', () => {
    const args = [
      '0.01',
      '0.5',
      '0.999',
      '1.001',
      '1.5',
      '2.5',
      '7.3',
      '31',
      '64.5',
      '-0.5',
      '-2.5',
      '-13.7',
      '-40.25',
    ];
    const xs = args.map(r);
    const want = mpmath(
      xs.map((x) => `zeta(${py(x)})`),
      45,
    );
    xs.forEach((x, i) => expectDigits(zeta(x, P), want[i]!, 40));
  });

  it('the quoted constants', () => {
    const [z3, zh] = mpmath(['zeta(3)', 'zeta(0.5)'], 45);
    expectDigits(zeta(fromInt(3), P), z3!, 40);
    expectDigits(zeta(new Real(1n, -1), P), zh!, 40);
  });
});
if (!hasMpmath) describe('zeta: mpmath', () => it.skip(NO_MPMATH, () => undefined));
