import { describe, expect, it } from 'vitest';
import { EngineError } from '../../errors.js';
import { bitsFor, Real } from '../real.js';
import { expectDigits, expectSame, hasMpmath, mpmath } from '../special/mpmath-reference.test.js';
import { evaluateNumeric } from './compile.js';
import { hasSpecial, SpecialFunctions } from './specials.js';

const PREC = bitsFor(50);
const field = 'weights.expression';
const value = (text: string): Real =>
  evaluateNumeric(text, { names: [], values: [], prec: PREC, field });

/** Expression-language name -> the special-function export it calls. */
const NAMES: [string, keyof SpecialFunctions][] = [
  ['sin', 'sin'],
  ['cos', 'cos'],
  ['tan', 'tan'],
  ['atan', 'atan'],
  ['gamma', 'gamma'],
  ['zeta', 'zeta'],
  ['ai', 'airyAi'],
  ['ellk', 'ellipticK'],
  ['elle', 'ellipticE'],
  ['nome', 'nomeOfModulus'],
  ['modulus', 'modulusOfNome'],
  ['theta1', 'theta'],
];

const ready = (name: string): boolean => hasSpecial(NAMES.find((n) => n[0] === name)![1]);

describe('special functions not yet provided', () => {
  const missing = NAMES.filter(([, fn]) => !hasSpecial(fn));
  it.skipIf(missing.length === 0)('answer a clear compile-time error', () => {
    for (const [name] of missing) {
      const args = name.startsWith('theta') ? '(0, 0.1)' : '(0.5)';
      expect(() => value(`${name}${args}`)).toThrow(
        new EngineError(`function ${name} is not available yet in numeric mode`, field),
      );
    }
  });
});

describe('special functions: published values and identities', () => {
  it.each([
    // [expression, value, source]
    ['sin', 'sin(pi/6)', '0.5', 'DLMF 4.14 (sin pi/6 = 1/2)'],
    ['cos', 'cos(pi/3)', '0.5', 'DLMF 4.14'],
    ['tan', 'tan(pi/4)', '1', 'DLMF 4.14'],
    [
      'atan',
      '4*atan(1)',
      '3.14159265358979323846264338327950288419716939937510',
      'DLMF 4.14, 3.12.1',
    ],
    ['gamma', 'gamma(1/2)^2', '3.14159265358979323846264338327950288419716939937510', 'DLMF 5.4.6'],
    ['gamma', 'gamma(6)', '120', 'DLMF 5.4.1'],
    ['zeta', 'zeta(2) * 6 / pi^2', '1', 'DLMF 25.6.1'],
    ['ai', 'ai(0)', '0.35502805388781723926006318600418317639797917419918', 'DLMF 9.2.3'],
    ['ellk', 'ellk(0) * 2 / pi', '1', 'DLMF 19.6.1'],
    ['elle', 'elle(0) * 2 / pi', '1', 'DLMF 19.6.1'],
    ['nome', 'nome(0)', '0', 'DLMF 22.2.1'],
  ])('%s: %s = %s (%s)', (name, text, want) => {
    if (!ready(name)) return expect(() => value(text)).toThrow(/not available yet/);
    expectDigits(value(text), want, 48, 1);
  });

  it.each([
    // the lemniscatic value K(1/sqrt 2) = Gamma(1/4)^2 / (4 sqrt pi) (from memory; mpmath agrees)
    ['ellk(1/sqrt(2))', 'gamma(1/4)^2 / (4*sqrt(pi))', ['ellk', 'gamma']],
    // Legendre's relation at k = k' = 1/sqrt 2: 2 E K - K^2 = pi/2, DLMF 19.7.1
    ['2*elle(1/sqrt(2))*ellk(1/sqrt(2)) - ellk(1/sqrt(2))^2', 'pi/2', ['ellk', 'elle']],
    // theta_3^4 = theta_2^4 + theta_4^4 at z = 0, DLMF 20.7.3
    ['theta3(0, 0.3)^4', 'theta2(0, 0.3)^4 + theta4(0, 0.3)^4', ['theta1']],
    // the modulus of the nome of k is k, DLMF 22.2.1-2
    ['modulus(nome(0.6))', '0.6', ['nome', 'modulus']],
    // sin^2 + cos^2 = 1
    ['sin(2.5)^2 + cos(2.5)^2', '1', ['sin', 'cos']],
  ] as [string, string, string[]][])('%s = %s', (left, right, needs) => {
    if (!needs.every(ready)) {
      return expect(() => [value(left), value(right)]).toThrow(/not available yet/);
    }
    expectSame(value(left), value(right), 46);
  });

  it.skipIf(!hasMpmath)(
    'every provided function agrees with mpmath 1.3 to 45 digits (independent)',
    () => {
      // our ellk/elle take the modulus k, mpmath's ellipk/ellipe the parameter m = k^2
      const cases: [string, string, string][] = [
        ['sin', 'sin(7/3)', 'sin(mpf(7)/3)'],
        ['cos', 'cos(-12.5)', 'cos(mpf(-12.5))'],
        ['tan', 'tan(1.2)', 'tan(mpf("1.2"))'],
        ['atan', 'atan(-3/4)', 'atan(mpf(-3)/4)'],
        ['gamma', 'gamma(3.3)', 'gamma(mpf("3.3"))'],
        ['gamma', 'gamma(-2.5)', 'gamma(mpf("-2.5"))'],
        ['zeta', 'zeta(3)', 'zeta(3)'],
        ['zeta', 'zeta(0.5)', 'zeta(mpf("0.5"))'],
        ['ai', 'ai(1.5)', 'airyai(mpf("1.5"))'],
        ['ai', 'ai(-4)', 'airyai(-4)'],
        ['ellk', 'ellk(0.8)', 'ellipk(mpf("0.8")**2)'],
        ['elle', 'elle(0.3)', 'ellipe(mpf("0.3")**2)'],
        ['nome', 'nome(0.9)', 'qfrom(k=mpf("0.9"))'],
        ['modulus', 'modulus(0.05)', 'kfrom(q=mpf("0.05"))'],
        ['theta1', 'theta1(0.7, 0.2)', 'jtheta(1, mpf("0.7"), mpf("0.2"))'],
        ['theta1', 'theta2(0.7, 0.2)', 'jtheta(2, mpf("0.7"), mpf("0.2"))'],
        ['theta1', 'theta3(0.7, 0.2)', 'jtheta(3, mpf("0.7"), mpf("0.2"))'],
        ['theta1', 'theta4(0.7, 0.2)', 'jtheta(4, mpf("0.7"), mpf("0.2"))'],
      ];
      const live = cases.filter(([name]) => ready(name));
      const want = mpmath(
        live.map((c) => c[2]),
        50,
      );
      live.forEach(([, text], i) => expectDigits(value(text), want[i]!, 45));
      expect(live.length).toBeGreaterThan(0);
    },
  );
});

describe('poles and domains of the special functions', () => {
  it.each([
    ['gamma', 'gamma(x - 3)', 'has a pole at x = 1: gamma at a non-positive integer'],
    ['zeta', 'zeta(x)', 'has a pole at x = 1: zeta at 1'],
    ['ellk', 'ellk(x)', 'has a pole at x = 1: ellk at modulus 1'],
    ['elle', 'elle(x + 1)', 'is not defined at x = 1: E: the modulus must satisfy'],
    ['theta1', 'theta3(0, x)', 'is not defined at x = 1: theta: the nome must satisfy'],
  ])('%s: %s', (name, text, message) => {
    if (!ready(name)) return expect(() => value(text)).toThrow(/not available yet/);
    expect(() =>
      evaluateNumeric(text, { names: ['x'], values: [value('1')], prec: PREC, field }),
    ).toThrow(message);
  });
});
