import { describe, it } from 'vitest';
import { parseDecimal } from '../decimal.js';
import { bitsFor, Real } from '../real.js';
import { airyAi } from './airy.js';
import { ellipticE, ellipticK, nomeOfModulus } from './elliptic.js';
import { gamma } from './gamma.js';
import { expectDigits, hasMpmath, mpmath, NO_MPMATH, py } from './mpmath-reference.test.js';
import { theta } from './theta.js';
import { atan, sin, tan } from './trig.js';
import { zeta } from './zeta.js';

const DIGITS = 110;
const P = bitsFor(DIGITS);
const r = (t: string): Real => parseDecimal(t, P);

describe.skipIf(!hasMpmath)('special functions at 110 digits against mpmath', () => {
  it('match on one table', () => {
    const cases: [string, () => Real, string][] = [
      ['sin 1e100', () => sin(r('1e100'), P), `sin(${py(r('1e100'))})`],
      ['tan 1.57', () => tan(r('1.57'), P), `tan(${py(r('1.57'))})`],
      ['atan 0.37', () => atan(r('0.37'), P), `atan(${py(r('0.37'))})`],
      ['gamma 0.2', () => gamma(r('0.2'), P), `gamma(${py(r('0.2'))})`],
      ['gamma -6.5', () => gamma(r('-6.5'), P), `gamma(${py(r('-6.5'))})`],
      ['zeta 1.3', () => zeta(r('1.3'), P), `zeta(${py(r('1.3'))})`],
      ['zeta -9.5', () => zeta(r('-9.5'), P), `zeta(${py(r('-9.5'))})`],
      ['Ai 4.5', () => airyAi(r('4.5'), P), `airyai(${py(r('4.5'))})`],
      ['Ai -12.5', () => airyAi(r('-12.5'), P), `airyai(${py(r('-12.5'))})`],
      ['Ai 45', () => airyAi(r('45'), P), `airyai(${py(r('45'))})`],
      ['K 0.9', () => ellipticK(r('0.9'), P), `ellipk(${py(r('0.9'))}**2)`],
      ['E 0.9', () => ellipticE(r('0.9'), P), `ellipe(${py(r('0.9'))}**2)`],
      ['q 0.9', () => nomeOfModulus(r('0.9'), P), `qfrom(k=${py(r('0.9'))})`],
      [
        'theta_2',
        () => theta(2, r('0.3'), r('0.45'), P),
        `jtheta(2, ${py(r('0.3'))}, ${py(r('0.45'))})`,
      ],
    ];
    const want = mpmath(
      cases.map(([, , e]) => e),
      DIGITS + 5,
    );
    // "Ai -12.5" oscillates: absolute on the scale of its amplitude
    cases.forEach(([name, f], i) =>
      expectDigits(f(), want[i]!, DIGITS, name === 'Ai -12.5' ? 0.3 : 0),
    );
  }, 30_000);
});
if (!hasMpmath) describe('high precision: mpmath', () => it.skip(NO_MPMATH, () => undefined));
