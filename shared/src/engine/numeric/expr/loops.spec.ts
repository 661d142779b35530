import { describe, expect, it } from 'vitest';
import { EngineCancelled } from '../../errors.js';
import type { Truncation } from '../../expr/evaluate.js';
import { formatDecimal } from '../decimal.js';
import { bitsFor, fromFraction, fromInt, Real } from '../real.js';
import { expectDigits } from '../special/mpmath-reference.test.js';
import { compileNumeric, evaluateNumeric } from './compile.js';

const PREC = bitsFor(60);
const field = 'weights.expression';
const TENTH = fromFraction(1n, 10n, PREC + 64);

function at(text: string, names: string[], values: Real[], truncations?: Truncation[]): Real {
  return evaluateNumeric(text, {
    names,
    values,
    prec: PREC,
    field,
    ...(truncations ? { truncations } : {}),
  });
}

/** sum_k s(k) 10^-e(k) as an exact decimal text with `digits` digits after the point. */
function decimalSeries(terms: [sign: 1 | -1, exponent: number][], digits: number): string {
  let n = 0n;
  for (const [s, e] of terms) if (e <= digits) n += BigInt(s) * 10n ** BigInt(digits - e);
  const t = n.toString().padStart(digits + 1, '0');
  return `${t.slice(0, -digits)}.${t.slice(-digits)}`;
}

describe('finite sums and products', () => {
  it.each([
    // worked by hand
    ['sum(k, k, 1, L)', 5050],
    ['sum(k^2, k, -3, 3)', 28],
    ['prod(k, k, 1, 6)', 720],
    ['sum(sum(1, j, 1, k), k, 1, 10)', 55],
    ['sum(1, k, 5, 4)', 0], // empty
    ['prod(2, k, 5, 4)', 1],
  ])('%s = %d (L = 100)', (text, want) => {
    expect(at(text, ['L'], [fromInt(100)])).toEqual(fromInt(want));
  });

  it('qpoch with finite n: (1/2; 1/3)_3 = 85/216, (1/2; 1/3)_(-2) = 4/7 (DLMF 17.2.1, 17.2.3)', () => {
    expectDigits(
      at('qpoch(1/2, 1/3, 3)', [], []),
      formatDecimal(fromFraction(85n, 216n, 300), 70),
      58,
    );
    expectDigits(
      at('qpoch(1/2, 1/3, -2)', [], []),
      formatDecimal(fromFraction(4n, 7n, 300), 70),
      58,
    );
    expect(at('qpoch(5, q, 0)', ['q'], [TENTH])).toEqual(fromInt(1));
  });
});

describe('infinite sums and products (stopped by the 2^-(prec+4) rule)', () => {
  it('sum(q^k, k, 0, inf) at q = 1/10 is 10/9 to 40 digits and records its terms', () => {
    const tr: Truncation[] = [];
    const got = at('sum(q^k, k, 0, inf)', ['q'], [TENTH], tr);
    expect(formatDecimal(got, 40)).toBe('1.' + '1'.repeat(39));
    expect(tr).toHaveLength(1);
    expect(tr[0]!.what).toBe('sum over k');
    // terms stop below 10^-62 of the sum: about 62 terms plus the quiet run
    expect(tr[0]!.terms).toBeGreaterThan(60);
    expect(tr[0]!.terms).toBeLessThan(75);
  });

  it('sum(1/k!, k, 0, inf) = e (DLMF 4.2.21)', () => {
    expectDigits(
      at('sum(1/k!, k, 0, inf)', [], []),
      '2.71828182845904523536028747135266249775724709369995957496697',
      58,
    );
  });

  // Euler's pentagonal number theorem (DLMF 27.14.3, 17.2 notation): (q; q)_inf =
  // sum_k (-1)^k q^(k(3k-1)/2); at q = 1/10 the right side is an exact decimal, summed here with
  // BigInt integers, independently of the evaluator
  const pentagonal = (digits: number): string => {
    const terms: [1 | -1, number][] = [];
    for (let k = -30; k <= 30; k++) terms.push([k % 2 === 0 ? 1 : -1, (k * (3 * k - 1)) / 2]);
    return decimalSeries(terms, digits);
  };

  it.each(['prod(1 - q^k, k, 1, inf)', 'qpoch(q, q, inf)'])(
    '%s at q = 1/10 equals the pentagonal-number series to 58 digits',
    (text) => {
      expectDigits(at(text, ['q'], [TENTH]), pentagonal(80), 58);
    },
  );

  it('a two-sided sum: sum(q^(k^2), k, -inf, inf) = 1 + 2 sum_{k>=1} q^(k^2) at q = 1/10 (DLMF 20.2.3)', () => {
    const terms: [1 | -1, number][] = [[1, 0]];
    for (let k = 1; k <= 10; k++) terms.push([1, k * k], [1, k * k]);
    expectDigits(at('sum(q^(k^2), k, -inf, inf)', ['q'], [TENTH]), decimalSeries(terms, 80), 58);
    const half: [1 | -1, number][] = [[1, 0]];
    for (let k = 1; k <= 10; k++) half.push([1, k * k]);
    expectDigits(at('sum(q^(k^2), k, -inf, 0)', ['q'], [TENTH]), decimalSeries(half, 80), 58);
  });

  it('leading zero terms do not end a sum: sum(binom(k, 3) q^k, k, 0, inf) = q^3/(1-q)^4 (negative binomial series, by hand)', () => {
    const want = formatDecimal(fromFraction(10n, 6561n, 400), 70); // (1/10)^3 / (9/10)^4 = 10/6561
    expectDigits(at('sum(binom(k, 3) * q^k, k, 0, inf)', ['q'], [TENTH]), want, 58);
  });

  it('a product stops at a zero factor', () => {
    expect(at('prod(1 - k/3, k, 0, inf)', [], [])).toEqual(fromInt(0));
  });

  it('keeps one truncation record per loop: the most terms any evaluation used', () => {
    const tr: Truncation[] = [];
    const f = compileNumeric('sum(q^k, k, 0, inf)', {
      names: ['q'],
      prec: PREC,
      field,
      truncations: tr,
    });
    f([fromFraction(1n, 1000n, PREC)]);
    f([TENTH]);
    f([fromFraction(1n, 1000n, PREC)]);
    expect(tr).toHaveLength(1);
    expect(tr[0]!.terms).toBeGreaterThan(60);
  });

  it('names the index at a pole inside a term', () => {
    expect(() => at('sum(1/(k - x), k, 0, 3)', ['x'], [fromInt(2)])).toThrow(
      'has a pole at x = 2, k = 2: division by zero',
    );
  });

  it('calls tick inside long loops and lets a cancellation through unchanged', () => {
    let ticks = 0;
    const f = compileNumeric('sum(x/k^2, k, 1, inf)', {
      names: ['x'],
      prec: PREC,
      field,
      tick: () => {
        if (++ticks === 50) throw new EngineCancelled();
      },
    });
    expect(() => f([fromInt(1)])).toThrow(EngineCancelled);
    expect(ticks).toBe(50);
  });
});
