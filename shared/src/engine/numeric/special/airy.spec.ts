import { describe, expect, it } from 'vitest';
import { parseDecimal } from '../decimal.js';
import {
  bitsFor,
  div,
  fromFraction,
  fromInt,
  ldexp,
  magnitude,
  mul,
  neg,
  ONE,
  Real,
  sign,
  sub,
  ZERO,
} from '../real.js';
import { powReal } from '../elementary.js';
import { airyAi, airyAiPrimeZero, airyAiZero } from './airy.js';
import { gamma } from './gamma.js';
import {
  expectDigits,
  expectSame,
  hasMpmath,
  mpmath,
  NO_MPMATH,
  py,
} from './mpmath-reference.test.js';

const P = bitsFor(40);
const r = (t: string): Real => parseDecimal(t, P);

describe('Airy Ai: published values', () => {
  it('Ai(0) = 3^(-2/3) / Gamma(2/3) (DLMF 9.2.3)', () => {
    // digits as quoted in the brief (from memory); mpmath below
    const want = '0.355028053887817239260063186004183176397979174199177573';
    expectDigits(airyAi(ZERO, P), want, 40);
    const viaGamma = div(
      powReal(fromInt(3), fromFraction(-2n, 3n, P), P),
      gamma(fromFraction(2n, 3n, P + 8), P),
      P,
    );
    expectSame(airyAiZero(P), viaGamma, 40);
  });

  it("Ai'(0) = -1 / (3^(1/3) Gamma(1/3)) (DLMF 9.2.4), as a slope of the series", () => {
    const viaGamma = neg(
      div(
        ONE,
        mul(
          powReal(fromInt(3), fromFraction(1n, 3n, P), P),
          gamma(fromFraction(1n, 3n, P + 8), P),
          P,
        ),
        P,
      ),
    );
    expectSame(airyAiPrimeZero(P), viaGamma, 40);
    // from memory: -0.25881940379280679840518356018920396347909113835493..., mpmath below
    expectDigits(airyAiPrimeZero(P), '-0.2588194037928067984051835601892039634790911383549', 40);
    // (Ai(h) - Ai(-h)) / 2h = Ai'(0) + h^2 Ai(0)/6 + ..., with h = 2^-70 (error ~ 2^-144)
    const h = new Real(1n, -70);
    const wide = P + 90;
    const diff = sub(airyAi(h, wide), airyAi(neg(h), wide), wide);
    expectSame(ldexp(diff, 69), airyAiPrimeZero(P), 40);
  });

  it('the first zero a_1 = -2.338107410459767038489197252446735440638... (DLMF 9.9 table)', () => {
    // from memory; |Ai(a_1)| must be below 10^-38 (absolute accuracy next to a zero)
    const v = airyAi(r('-2.338107410459767038489197252446735440638'), P);
    expect(magnitude(v)).toBeLessThan(-126);
  });
});

describe.skipIf(!hasMpmath)('Airy Ai: cross-check against mpmath at 40 digits', () => {
  it('matches on a table of arguments in [-50, 50]', () => {
    const args = [
      '0.5',
      '1',
      '-1',
      '2.5',
      '-5.3',
      '7.7',
      '-10',
      '18',
      '20.5',
      '-20',
      '35',
      '-35.1',
    ];
    args.push('50', '-50', '-2.3381074104597670384891972524467');
    const xs = args.map(r);
    const want = mpmath(
      xs.map((x) => `airyai(${py(x)})`),
      45,
    );
    xs.forEach((x, i) => {
      // on x < 0 the accuracy is on the scale of the oscillation, |x|^(-1/4) / sqrt(pi)
      const floor = sign(x) < 0 ? 0.5 * Math.abs(Number(args[i])) ** -0.25 : 0;
      expectDigits(airyAi(x, P), want[i]!, 40, floor);
    });
  });

  it('the quoted constants', () => {
    const [a0, a1] = mpmath(['airyai(0)', 'airyai(0, 1)'], 45);
    expectDigits(airyAi(ZERO, P), a0!, 40);
    expectDigits(airyAiPrimeZero(P), a1!, 40);
  });
});
if (!hasMpmath) describe('airy: mpmath', () => it.skip(NO_MPMATH, () => undefined));
