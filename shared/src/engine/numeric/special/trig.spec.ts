import { describe, expect, it } from 'vitest';
import { EngineError } from '../../errors.js';
import { parseDecimal } from '../decimal.js';
import { pi } from '../elementary.js';
import { add, bitsFor, div, fromInt, mul, ONE, Real, sub } from '../real.js';
import {
  expectDigits,
  expectSame,
  hasMpmath,
  mpmath,
  NO_MPMATH,
  py,
} from './mpmath-reference.test.js';
import { acos, asin, atan, atan2, cos, sin, sinPi, tan } from './trig.js';

const P = bitsFor(40);
const r = (t: string): Real => parseDecimal(t, P);

describe('trig: published values', () => {
  // from memory (A&S table 4.6 gives the first digits), confirmed by mpmath below
  const table: [string, (x: Real, p: number) => Real, string, string][] = [
    ['sin 1', sin, '1', '0.84147098480789650665250232163029899962256306079837'],
    ['cos 1', cos, '1', '0.54030230586813971740093660744297660373231042061792'],
    ['tan 1', tan, '1', '1.5574077246549022305069748074583601730872507723815'],
    ['atan 1 = pi/4', atan, '1', '0.78539816339744830961566084581987572104929234984378'],
    // the classic hard reduction case for binary arithmetic: sin(10^22), from memory
    ['sin 1e22', sin, '1e22', '-0.85220084976718880177270589375302936826176944859260'],
  ];
  it.each(table)('%s', (_name, f, x, want) => {
    expectDigits(f(r(x), P), want, 40);
  });

  it('Machin: 16 atan(1/5) - 4 atan(1/239) = pi', () => {
    const a = atan(div(ONE, fromInt(5), P), P);
    const b = atan(div(ONE, fromInt(239), P), P);
    expectSame(sub(mul(fromInt(16), a, P), mul(fromInt(4), b, P), P), pi(P), 40);
  });

  it('identities: sin^2 + cos^2 = 1, tan = sin / cos, atan(tan x) = x', () => {
    for (const t of ['0.1', '-0.7', '1.3', '2.9', '-17.25', '123456.789']) {
      const x = r(t);
      const s = sin(x, P);
      const c = cos(x, P);
      expectSame(add(mul(s, s, P), mul(c, c, P), P), ONE, 40);
      expectSame(tan(x, P), div(s, c, P), 39);
    }
    expectSame(atan(tan(r('1.2'), P), P), r('1.2'), 39);
    expectSame(asin(sin(r('0.4'), P), P), r('0.4'), 39);
    expectSame(acos(cos(r('2.5'), P), P), r('2.5'), 39);
  });

  it('sin(pi x) is exact-zero at integers and relative next to them', () => {
    expect(sinPi(fromInt(7), P).m).toBe(0n);
    const x = new Real((7n << 100n) + 1n, -100); // 7 + 2^-100
    expectSame(sinPi(x, P), mul(pi(P), new Real(-1n, -100), P), 38);
  });

  it('atan2 covers the quadrants; (0, 0) is an error', () => {
    expectSame(atan2(ONE, fromInt(-1), P), mul(pi(P), new Real(3n, -2), P), 40);
    expectSame(atan2(fromInt(-1), fromInt(-1), P), mul(pi(P), new Real(-3n, -2), P), 40);
    expect(() => atan2(fromInt(0), fromInt(0), P)).toThrow(EngineError);
  });
});

describe.skipIf(!hasMpmath)('trig: cross-check against mpmath at 40 digits', () => {
  it('matches on a table of arguments', () => {
    const args = ['0.3', '-2.71828', '1e-25', '3.14159265358979', '1e10', '-123.456', '0.785398'];
    const xs = args.map(r);
    const fns: [string, (x: Real, p: number) => Real][] = [
      ['sin', sin],
      ['cos', cos],
      ['tan', tan],
      ['atan', atan],
    ];
    const exprs = fns.flatMap(([n]) => xs.map((x) => `${n}(${py(x)})`));
    const want = mpmath(exprs, 45);
    let i = 0;
    for (const [, f] of fns) for (const x of xs) expectDigits(f(x, P), want[i++]!, 40);
  });
});
if (!hasMpmath) describe('trig: mpmath', () => it.skip(NO_MPMATH, () => undefined));
