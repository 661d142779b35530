import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { determinedDigits, formatDecimal, formatError, parseDecimal } from './decimal.js';
import { cosh, exp, ln2, log, pi, powReal, sinh, tanh } from './elementary.js';
import { shownDigits, toNumericJson } from './estimate.js';
import {
  add,
  bitsFor,
  cmp,
  div,
  fromInt,
  fromNumber,
  mul,
  powInt,
  Real,
  sqrt,
  sub,
  toNumber,
} from './real.js';

const P = bitsFor(60);
const num = (t: string): Real => parseDecimal(t, P + 64);
const at50 = (x: Real): string => formatDecimal(x, 50);

describe('Real arithmetic', () => {
  it.each([
    // [a, b, a+b, a*b, a/b] — exact decimal arithmetic (common practice)
    ['1.5', '2.25', '3.75', '3.375', '0.6666666666666666666666666666666666666666666666666667'],
    ['-7', '3', '-4', '-21', '-2.3333333333333333333333333333333333333333333333333'],
    ['1e-30', '1', '1.000000000000000000000000000001', '1e-30', '1e-30'],
  ])('%s and %s', (a, b, s, p, q) => {
    expect(formatDecimal(add(num(a), num(b), P), 50)).toBe(formatDecimal(num(s), 50));
    expect(formatDecimal(mul(num(a), num(b), P), 50)).toBe(formatDecimal(num(p), 50));
    expect(formatDecimal(div(num(a), num(b), P), 50)).toBe(formatDecimal(num(q), 50));
  });

  it('rounds to the requested bits and keeps a sticky bit for tiny addends', () => {
    const one = fromInt(1);
    const tiny = new Real(1n, -200);
    expect(cmp(add(one, tiny, 100), one)).toBe(0);
    expect(cmp(add(one, tiny, 250), one)).toBe(1);
    expect(toNumber(sub(add(one, tiny, 250), one, 250))).toBe(2 ** -200);
  });

  it('sqrt, integer powers and float64 round trips', () => {
    // sqrt 2 = 1.41421356237309504880168872420969807856967187537694... (A&S Table 1.1 / OEIS A002193)
    expect(at50(sqrt(fromInt(2), P))).toBe('1.4142135623730950488016887242096980785696718753769');
    expect(formatDecimal(powInt(fromInt(3), 40, P), 20)).toBe('1.2157665459056928801e19');
    expect(formatDecimal(powInt(fromInt(2), -3, P), 5)).toBe('1.2500e-1');
    for (const x of [0.1, -3.75, 1e-300, 123456789.123]) expect(toNumber(fromNumber(x))).toBe(x);
    expect(() => div(fromInt(1), fromInt(0), P)).toThrow(RangeError);
  });
});

describe('elementary functions at 50 digits', () => {
  // Published constants: pi (OEIS A000796), e (A001113), log 2 (A002162), log 10 (A002392);
  // DLMF 4.2/4.28 for the definitions.
  it.each([
    ['pi', () => pi(P), '3.1415926535897932384626433832795028841971693993751'],
    ['log 2', () => ln2(P), '6.9314718055994530941723212145817656807550013436026e-1'],
    ['e', () => exp(fromInt(1), P), '2.7182818284590452353602874713526624977572470937000'],
    ['log 10', () => log(fromInt(10), P), '2.3025850929940456840179914546843642076011014886288'],
  ])('%s', (_name, f, want) => {
    expect(at50(f())).toBe(want);
  });

  it('agrees with mpmath (an independent library) on a table of arguments', () => {
    const args = ['-37.5', '-1', '-1e-12', '0.001', '0.5', '2', '10.25', '80'];
    let ref: string[];
    try {
      const py =
        'from mpmath import mp\nmp.dps=70\nimport sys\n' +
        `for a in ${JSON.stringify(args)}:\n x=mp.mpf(a)\n` +
        ' print(mp.nstr(mp.exp(x),50), mp.nstr(mp.cosh(x),50), mp.nstr(mp.sinh(x),50), mp.nstr(mp.tanh(x),50), mp.nstr(mp.log(abs(x)),50), mp.nstr(mp.power(abs(x), mp.mpf(1)/3),50))';
      ref = execFileSync('python3', ['-c', py], { encoding: 'utf8' }).trim().split('\n');
    } catch {
      console.warn('python3 with mpmath not available: cross-check skipped');
      return;
    }
    args.forEach((a, i) => {
      const x = num(a);
      const ax = num(a.replace('-', ''));
      const got = [
        exp(x, P),
        cosh(x, P),
        sinh(x, P),
        tanh(x, P),
        log(ax, P),
        powReal(ax, div(fromInt(1), fromInt(3), P + 20), P),
      ];
      const want = ref[i]!.split(' ');
      got.forEach((g, j) =>
        expect(formatDecimal(g, 45), `${a} #${j}`).toBe(formatDecimal(num(want[j]!), 45)),
      );
    });
  });
});

describe('decimal text and honest digits', () => {
  it('formats in scientific notation with the given significant digits', () => {
    expect(formatDecimal(num('0.0198943678864869169711104704'), 27)).toBe(
      '1.98943678864869169711104704e-2',
    );
    expect(formatDecimal(num('9.9999'), 3)).toBe('1.00e1');
    expect(formatDecimal(num('-0.25'), 1)).toBe('-3e-1');
    expect(formatError(3.04e-30)).toBe('3.1e-30');
  });

  it('shows only digits that both ends of the error interval share', () => {
    const v = { value: num('0.123449999'), error: 4e-6 };
    expect(shownDigits(v, 30)).toBe(5);
    expect(toNumericJson(v, 30)).toEqual({ real: '1.2345e-1', error: '4e-6' });
    // a value near a rounding boundary loses the digit it cannot decide
    const w = { value: num('0.123455'), error: 2e-6 };
    expect(toNumericJson(w, 30).real).toBe('1.235e-1');
    // nothing determined: "0" with an error covering the value
    expect(toNumericJson({ value: num('3e-10'), error: 1e-9 }, 30)).toEqual({
      real: '0',
      error: '1e-9',
    });
    expect(determinedDigits(num('0.25'), 1e-30, 20)).toBe(20);
  });

  it('never changes a shown digit when the error shrinks (property over random values)', () => {
    let seed = 12345;
    const rnd = (): number => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    for (let i = 0; i < 300; i++) {
      const truth = num(`${rnd()}${Math.floor(rnd() * 1e12)}e${Math.floor(rnd() * 20) - 10}`);
      const e1 = 10 ** (-5 - 20 * rnd());
      const e2 = e1 * 10 ** (-1 - 5 * rnd());
      const noisy = (e: number): Real => add(truth, fromNumber(e * (2 * rnd() - 1)), P);
      const c = { value: noisy(e1), error: e1 };
      const coarse = toNumericJson(c, 40);
      const fine = { value: noisy(e2), error: e2 };
      const d = shownDigits(c, 40);
      if (coarse.real === '0') continue;
      // the coarse digits are the correct rounding of the truth, so the fine value rounds to them
      expect(formatDecimal(truth, d)).toBe(coarse.real);
      expect(formatDecimal(fine.value, d)).toBe(coarse.real);
    }
  });
});
