import { describe, expect, it } from 'vitest';
import { bitsFor, fromInt, Real } from '../real.js';
import { expectDigits, expectSame, hasMpmath, mpmath } from '../special/mpmath-reference.test.js';
import { evaluateNumeric } from './compile.js';

const PREC = bitsFor(50);
const field = 'weights.expression';
const value = (text: string): Real =>
  evaluateNumeric(text, { names: [], values: [], prec: PREC, field });

const PI_50 = '3.14159265358979323846264338327950288419716939937510'; // DLMF 3.12.1

describe('special functions: published values and identities', () => {
  it.each([
    // [expression, value, source]
    ['sin(pi/6)', '0.5', 'DLMF 4.14'],
    ['cos(pi/3)', '0.5', 'DLMF 4.14'],
    ['tan(pi/4)', '1', 'DLMF 4.14'],
    ['4*atan(1)', PI_50, 'DLMF 4.14, 3.12.1'],
    ['gamma(1/2)^2', PI_50, 'DLMF 5.4.6'],
    ['gamma(6)', '120', 'DLMF 5.4.1'],
    ['zeta(2) * 6 / pi^2', '1', 'DLMF 25.6.1'],
    ['ai(0)', '0.35502805388781723926006318600418317639797917419918', 'DLMF 9.2.3'],
    ['ellk(0) * 2 / pi', '1', 'DLMF 19.6.1'],
    ['elle(0) * 2 / pi', '1', 'DLMF 19.6.1'],
    ['nome(0)', '0', 'DLMF 22.2.1'],
  ])('%s = %s (%s)', (text, want) => {
    expectDigits(value(text), want, 48, 1);
  });

  it.each([
    // the lemniscatic value K(1/sqrt 2) = Gamma(1/4)^2 / (4 sqrt pi) (from memory; mpmath agrees)
    ['ellk(1/sqrt(2))', 'gamma(1/4)^2 / (4*sqrt(pi))'],
    // Legendre's relation at k = k' = 1/sqrt 2: 2 E K - K^2 = pi/2, DLMF 19.7.1
    ['2*elle(1/sqrt(2))*ellk(1/sqrt(2)) - ellk(1/sqrt(2))^2', 'pi/2'],
    // theta_3^4 = theta_2^4 + theta_4^4 at z = 0, DLMF 20.7.3
    ['theta3(0, 0.3)^4', 'theta2(0, 0.3)^4 + theta4(0, 0.3)^4'],
    // the modulus of the nome of k is k, DLMF 22.2.1-2
    ['modulus(nome(0.6))', '0.6'],
    // sin^2 + cos^2 = 1, DLMF 4.21.2
    ['sin(2.5)^2 + cos(2.5)^2', '1'],
  ])('%s = %s', (left, right) => {
    expectSame(value(left), value(right), 46);
  });

  it.skipIf(!hasMpmath)('each function agrees with mpmath 1.3 to 45 digits (independent)', () => {
    // our ellk/elle take the modulus k, mpmath's ellipk/ellipe the parameter m = k^2
    const cases: [string, string][] = [
      ['sin(7/3)', 'sin(mpf(7)/3)'],
      ['cos(-12.5)', 'cos(mpf(-12.5))'],
      ['tan(1.2)', 'tan(mpf("1.2"))'],
      ['atan(-3/4)', 'atan(mpf(-3)/4)'],
      ['gamma(3.3)', 'gamma(mpf("3.3"))'],
      ['gamma(-2.5)', 'gamma(mpf("-2.5"))'],
      ['zeta(3)', 'zeta(3)'],
      ['zeta(0.5)', 'zeta(mpf("0.5"))'],
      ['ai(1.5)', 'airyai(mpf("1.5"))'],
      ['ai(-4)', 'airyai(-4)'],
      ['ellk(0.8)', 'ellipk(mpf("0.8")**2)'],
      ['elle(0.3)', 'ellipe(mpf("0.3")**2)'],
      ['nome(0.9)', 'qfrom(k=mpf("0.9"))'],
      ['modulus(0.05)', 'kfrom(q=mpf("0.05"))'],
      ['theta1(0.7, 0.2)', 'jtheta(1, mpf("0.7"), mpf("0.2"))'],
      ['theta2(0.7, 0.2)', 'jtheta(2, mpf("0.7"), mpf("0.2"))'],
      ['theta3(0.7, 0.2)', 'jtheta(3, mpf("0.7"), mpf("0.2"))'],
      ['theta4(0.7, 0.2)', 'jtheta(4, mpf("0.7"), mpf("0.2"))'],
    ];
    const want = mpmath(
      cases.map((c) => c[1]),
      50,
    );
    cases.forEach(([text], i) => expectDigits(value(text), want[i]!, 45));
  });
});

describe('poles and domains of the special functions (at x = 1)', () => {
  it.each([
    ['gamma(x - 3)', 'has a pole at x = 1: gamma at a non-positive integer'],
    ['zeta(x)', 'has a pole at x = 1: zeta at 1'],
    ['ellk(x)', 'has a pole at x = 1: ellk at modulus 1'],
    ['elle(x + 1)', 'is not defined at x = 1: E: the modulus must satisfy'],
    ['theta3(0, x)', 'is not defined at x = 1: theta: the nome must satisfy'],
  ])('%s: %s', (text, message) => {
    expect(() =>
      evaluateNumeric(text, { names: ['x'], values: [fromInt(1)], prec: PREC, field }),
    ).toThrow(message);
  });
});
