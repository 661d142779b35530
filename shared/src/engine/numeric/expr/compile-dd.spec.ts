import { describe, expect, it } from 'vitest';
import { ddFromReal, ddToReal, R } from '../kernel/double-double.js';
import { abs, fromNumber, magnitude, sub } from '../real.js';
import { compileNumeric } from './compile.js';
import { compileFast } from './compile-dd.js';

// The reference is the Real evaluator at 200 bits, itself checked against mpmath to 45 digits
// (specials.spec.ts, elementary tests). 2^-96 leaves a few bits for the cancellation of a
// difference such as log(1 + x^2) sinh(y) - tanh(x y) near 0.
const CASES: [string, number[][]][] = [
  [
    '1/(2*pi) / sqrt(2*cosh(x/2)) / (2*cosh((x-y)/2)) / sqrt(2*cosh(y/2))',
    [
      [0.3, -1.7],
      [44.5, 43.25],
      [-80, 3],
      [1e-3, 2e-3],
    ],
  ],
  [
    'exp(-(x^2 + y^2)/2) / sqrt(pi)',
    [
      [0.5, 0.25],
      [-3.75, 2.5],
    ],
  ],
  [
    'log(1 + x^2) * sinh(y) - tanh(x*y)',
    [
      [0.001, 0.0003],
      [2.5, -0.4],
      [0.7, 3.9],
    ],
  ],
  [
    'abs(x - y)^3 + (x + y)^(-2) + e^x + x^0.37',
    [
      [1.25, 0.5],
      [3.5, 7.125],
    ],
  ],
  [
    'sinh(x) / x + 1/(1 + exp(x - y))',
    [
      [1e-9, 0.1],
      [0.49, -0.49],
      [0.51, 20],
    ],
  ],
];

// exp and cosh of a sum of one-variable parts are taken as products of memoised factors
// (separable.ts), with the whole argument's exponential where a factor leaves the float range
CASES.push(
  [
    'exp(x - y) + cosh(3*(x + y)/2 - 1) - exp(-(2*x - y/3))',
    [
      [0.3, -1.7],
      [12.5, 11.75],
      [-20, 3],
    ],
  ],
  [
    '1/cosh((x - y)/2) * exp((x - y)/4)',
    [
      [1500, 1499.5],
      [-1500, -1498],
      [700, 690],
    ],
  ],
);

describe('double-double evaluation of elementary expressions', () => {
  for (const [text, points] of CASES)
    it(`${text} agrees with the Real evaluator to 2^-96`, () => {
      const fast = compileFast(text, ['x', 'y'])!;
      expect(fast).not.toBeNull();
      const slow = compileNumeric(text, { names: ['x', 'y'], prec: 200, field: 'k' });
      const v = new Float64Array(4);
      const out = new Float64Array(2);
      for (const [x, y] of points) {
        ddFromReal(fromNumber(x!));
        v[0] = R[0];
        v[1] = R[1];
        ddFromReal(fromNumber(y!));
        v[2] = R[0];
        v[3] = R[1];
        fast.evaluate(v, out);
        const ref = slow([fromNumber(x!), fromNumber(y!)]);
        const d = abs(sub(ddToReal(out[0]!, out[1]!), ref, 220));
        if (d.m !== 0n) expect(magnitude(d) - magnitude(ref)).toBeLessThanOrEqual(-96);
      }
    });

  it('leaves what it does not know to the Real evaluator', () => {
    expect(compileFast('gamma(x) + y', ['x', 'y'])).toBeNull();
    expect(compileFast('sum(1/k^2, k, 1, inf) * x', ['x', 'y'])).toBeNull();
    expect(compileFast('x + z', ['x', 'y'])).toBeNull();
  });

  it('marks poles and domain errors as NaN instead of a value', () => {
    const out = new Float64Array(2);
    for (const text of ['1/(x - y)', 'log(x - y)', 'sqrt(y - x - 1)', '(x - y)^(-2)']) {
      compileFast(text, ['x', 'y'])!.evaluate(new Float64Array([1, 0, 1, 0]), out);
      expect(Number.isNaN(out[0])).toBe(true);
    }
  });
});
