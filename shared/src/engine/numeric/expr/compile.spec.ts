import { describe, expect, it } from 'vitest';
import { formatDecimal, parseDecimal } from '../decimal.js';
import { bitsFor, fromFraction, fromInt, Real } from '../real.js';
import {
  expectDigits,
  expectSame,
  hasMpmath,
  mpmath,
  py,
} from '../special/mpmath-reference.test.js';
import { compileNumeric, evaluateNumeric, freeSymbols } from './compile.js';

const PREC = bitsFor(50);
const field = 'weights.expression';

/** Value of a closed expression (or one of q) at PREC bits. */
function value(text: string, names: string[] = [], values: Real[] = []): Real {
  return evaluateNumeric(text, { names, values, prec: PREC, field });
}

describe('numeric expressions: published constants', () => {
  // 50 digits each; pi: DLMF 3.12.1, e: DLMF 4.2.21 / A&S 4.1.16, sqrt 2 and log 2: A&S ch. 1
  // (all four also printed by mpmath 1.3 at 60 digits, independent)
  it.each([
    ['pi', '3.1415926535897932384626433832795028841971693993751'],
    ['e', '2.7182818284590452353602874713526624977572470937000'],
    ['exp(1)', '2.7182818284590452353602874713526624977572470937000'],
    ['sqrt(2)', '1.4142135623730950488016887242096980785696718753769'],
    ['2^(1/2)', '1.4142135623730950488016887242096980785696718753769'],
    ['log(2)', '6.9314718055994530941723212145817656807550013436026e-1'],
    ['1/(8*pi)', '3.9788735772973833942220940843128590508614911435114e-2'],
  ])('%s = %s', (text, want) => {
    expect(formatDecimal(value(text), 50)).toBe(want);
  });
});

describe('numeric expressions: arithmetic', () => {
  it.each([
    // exact rationals, worked by hand
    ['2^10', '1024'],
    ['(-2)^3', '-8'],
    ['2^-2', '2.5e-1'],
    ['4^(1/2)', '2'],
    ['8^(1/3)', '2'],
    ['0^3', '0'],
    ['-(3 - 5) * 1.5', '3'],
    ['+7 / 4', '1.75'],
    ['abs(-2.5)', '2.5'],
    ['exp(log(3))', '3'],
    // A&S 24.1.1 (binomial coefficients), 6.1.6 (factorial)
    ['binom(7, 3)', '35'],
    ['binom(1/2, 2)', '-1.25e-1'],
    ['binom(4, -1)', '0'],
    ['factorial(10)', '3628800'],
    ['5!', '120'],
  ])('%s = %s', (text, want) => {
    const got = value(text);
    expectDigits(got, want, 45, 1);
  });

  it('reads literals exactly from their decimal text (0.1 is 1/10, 80 digits survive)', () => {
    expect(value('0.1')).toEqual(fromFraction(1n, 10n, PREC));
    const long =
      '0.12345678901234567890123456789012345678901234567890123456789012345678901234567891';
    const got = evaluateNumeric(long, { names: [], values: [], prec: 300, field });
    expect(formatDecimal(got, 80)).toBe(long.slice(1).replace(/^\.(.)/, '$1.') + 'e-1');
  });

  it('binds names positionally and leaves bound values out of the constants', () => {
    const f = compileNumeric('x - 2*y', { names: ['x', 'y'], prec: PREC, field });
    expect(f([fromInt(5), fromInt(1)])).toEqual(fromInt(3));
    expect(f([fromInt(1), fromInt(5)])).toEqual(fromInt(-9));
  });

  it('rounds the result to the caller precision', () => {
    const got = evaluateNumeric('1/3', { names: [], values: [], prec: 20, field });
    expect(got).toEqual(fromFraction(1n, 3n, 20));
  });

  it('freeSymbols lists the names to bind, without sum indices and constants', () => {
    expect(freeSymbols('sum(x^k * y, k, 0, N) + pi + e')).toEqual(['x', 'y', 'N']);
    expect(freeSymbols('1/(2*pi) / sqrt(2*cosh(x/2))')).toEqual(['x']);
  });
});

const LINE_KERNEL = '1/(2*pi) / sqrt(2*cosh(x/2)) / (2*cosh((x-y)/2)) / sqrt(2*cosh(y/2))';

describe('the line kernel', () => {
  const rho = compileNumeric(LINE_KERNEL, { names: ['x', 'y'], prec: PREC, field });

  it('rho(0, 0) = 1/(8 pi) (worked by hand; 1/(8 pi) from DLMF 3.12.1)', () => {
    expectDigits(
      rho([fromInt(0), fromInt(0)]),
      '0.039788735772973833942220940843128590508614911435114',
      48,
    );
  });

  it('is symmetric: rho(x, y) = rho(y, x)', () => {
    const a = fromFraction(7n, 3n, PREC);
    const b = fromFraction(-5n, 4n, PREC);
    expectSame(rho([a, b]), rho([b, a]), 48);
  });

  it.skipIf(!hasMpmath)(
    'agrees with mpmath at several points to 45 digits (mpmath 1.3, independent)',
    () => {
      const points: [Real, Real][] = [
        [fromFraction(1n, 2n, PREC), fromFraction(-5n, 4n, PREC)],
        [fromInt(3), fromFraction(5n, 2n, PREC)],
        [fromInt(-7), fromInt(4)],
        [fromFraction(1n, 10n, PREC), fromFraction(1n, 3n, PREC)],
      ];
      const rhoPy = (x: string, y: string): string =>
        `1/(2*pi) / sqrt(2*cosh(${x}/2)) / (2*cosh((${x}-${y})/2)) / sqrt(2*cosh(${y}/2))`;
      const want = mpmath(
        points.map(([x, y]) => rhoPy(py(x), py(y))),
        50,
      );
      points.forEach((p, i) => expectDigits(rho(p), want[i]!, 45));
    },
  );
});

describe.skipIf(!hasMpmath)('elementary functions against mpmath 1.3 (independent)', () => {
  const cases: [string, string][] = [
    ['sinh(3/7)', 'sinh(mpf(3)/7)'],
    ['cosh(-2.5)', 'cosh(mpf(-2.5))'],
    ['tanh(0.001)', 'tanh(mpf("0.001"))'],
    ['exp(-40) * 10^17', 'exp(-40) * 10**17'],
    ['log(10^30 + 1)', 'log(mpf(10)**30 + 1)'],
    ['3^0.25 - 7^(-1.5)', 'mpf(3)**0.25 - mpf(7)**(-1.5)'],
  ];
  it('each case to 45 digits', () => {
    const want = mpmath(
      cases.map((c) => c[1]),
      50,
    );
    cases.forEach(([text], i) => expectDigits(value(text), want[i]!, 45));
  });
});

describe('speed', () => {
  it('compiles the line kernel once and evaluates it 10^4 times at 128 bits', () => {
    const rho = compileNumeric(LINE_KERNEL, { names: ['x', 'y'], prec: 128, field });
    const xs = Array.from({ length: 100 }, (_, i) => parseDecimal(String((i - 50) * 0.37), 160));
    const t0 = performance.now();
    let last: Real = fromInt(0);
    for (const x of xs) for (const y of xs) last = rho([x, y]);
    const ms = performance.now() - t0;
    console.log(`line kernel: 10^4 evaluations at 128 bits in ${ms.toFixed(0)} ms`);
    expect(last.m > 0n).toBe(true);
    expect(ms).toBeLessThan(5000); // generous: the machine is shared; the target is well under 1 s
  });
});
