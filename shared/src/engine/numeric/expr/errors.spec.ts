import { describe, expect, it } from 'vitest';
import { EngineError } from '../../errors.js';
import { DISABLED_FUNCTIONS } from '../../expr/sandbox.js';
import { MAX_TERMS } from '../../limits.js';
import { bitsFor, fromFraction, fromInt, Real } from '../real.js';
import { compileNumeric } from './compile.js';

const PREC = bitsFor(30);
const field = 'weights.expression';

/** The EngineError thrown by `run`, with its field checked. */
function caught(run: () => unknown): EngineError {
  try {
    run();
  } catch (e) {
    expect(e).toBeInstanceOf(EngineError);
    expect((e as EngineError).field).toBe(field);
    return e as EngineError;
  }
  throw new Error('expected an EngineError');
}

const compile = (text: string, names = ['x', 'y']) =>
  compileNumeric(text, { names, prec: PREC, field });

describe('errors when compiling (with the field)', () => {
  it.each([
    ['z + x', 'unknown symbol z'],
    ['foo(x)', 'unknown function foo'],
    ['O(x^3)', 'O(...) has no meaning in numeric mode'],
    ['1 + kappa*x', 'kappa has no meaning in numeric mode'],
    ['inf', 'inf is only allowed as a bound'],
    ['sum(x, 2, 1, 3)', 'sum: the second argument must be a new index name'],
    ['sum(x, x, 1, 3)', 'sum: the second argument must be a new index name'],
    ['prod(sum(k, k, 1, 2), k, 1, 3)', 'sum: the second argument must be a new index name'],
    ['sum(pi, pi, 1, 3)', 'sum: the second argument must be a new index name'],
    ['sum(x, k, inf, 3)', 'sum: bounds must run upwards'],
    ['qpoch(x, y, -inf)', 'qpoch: n must be an integer or inf'],
    ['sqrt(x, y)', 'sqrt takes 1 argument, got 2'],
    ['binom(x)', 'binom takes 2 arguments, got 1'],
    ['sum(x, k, 1)', 'sum takes 4 arguments, got 3'],
    ['[1, 2]', 'array syntax is not supported'],
    ['x == y', 'operator == is not supported'],
    ['"text"', 'only numbers are allowed as constants'],
    ['x +', 'cannot read the expression'],
    ['', 'expression is empty'],
  ])('%s: %s', (text, message) => {
    expect(caught(() => compile(text)).message).toContain(message);
  });

  it.each(DISABLED_FUNCTIONS)('%s is disabled', (name) => {
    expect(caught(() => compile(`${name}("1")`)).message).toBe(`function ${name} is disabled`);
  });
});

describe('errors at a point (with the field and the point)', () => {
  const half = fromFraction(1n, 2n, PREC);
  it.each([
    ['1/(x - y)', [half, half], 'has a pole at x = 0.5, y = 0.5: division by zero'],
    ['log(x - 0.5)', [half, half], 'has a pole at x = 0.5, y = 0.5: log of 0'],
    ['log(-x)', [half, half], 'is not defined at x = 0.5, y = 0.5: log of a negative number'],
    ['sqrt(x - 1)', [half, half], 'is not defined at x = 0.5, y = 0.5: sqrt of a negative number'],
    [
      '(-x)^y',
      [half, half],
      'is not defined at x = 0.5, y = 0.5: a negative number to a non-integer',
    ],
    ['(x - y)^(-1)', [half, half], 'has a pole at x = 0.5, y = 0.5: 0 to a negative power'],
    ['(x - y)^(-y)', [half, half], 'has a pole at x = 0.5, y = 0.5: 0 to a negative power'],
    ['exp(x * 10^7)', [half, half], 'overflows at x = 0.5, y = 0.5'],
    ['cosh(x * 10^7)', [half, half], 'overflows at x = 0.5, y = 0.5'],
    ['2^(2^30) * x', [half, half], 'overflows at x = 0.5, y = 0.5'],
    [
      'factorial(x)',
      [half, half],
      'is not defined at x = 0.5, y = 0.5: factorial takes an integer',
    ],
    ['sum(k, k, 1, x)', [half, half], 'sum: the upper bound must be an integer'],
    ['sum(1, k, 1, x)', [fromInt(10 ** 6), half], `sum over k: more than ${MAX_TERMS} terms`],
    [
      'qpoch(y, x, inf)',
      [fromInt(2), half],
      'qpoch does not converge at x = 2, y = 0.5: qpoch(a, x, inf) needs |x| < 1',
    ],
    ['qpoch(y, x, -1)', [fromInt(0), half], 'has a pole at x = 0, y = 0.5'],
    ['1/(x - x)', [fromFraction(1n, 3n * 10n ** 9n, PREC), half], 'has a pole at x = 3.33333e-10'],
  ] as [string, Real[], string][])('%s', (text, values, message) => {
    const f = compile(text);
    expect(caught(() => f(values)).message).toContain(message);
  });

  it('division by zero in a constant part fails at call time, not when compiling', () => {
    const f = compile('x + 1/0');
    expect(caught(() => f([fromInt(1), fromInt(2)])).message).toBe(
      'has a pole at x = 1, y = 2: division by zero',
    );
  });

  it('a slowly converging sum fails honestly: sum(1/k^2, k, 1, inf) does not meet 2^-(prec+4)', () => {
    const f = compileNumeric('sum(1/k^2, k, 1, inf) + L', { names: ['L'], prec: PREC, field });
    expect(caught(() => f([fromInt(1)])).message).toBe(
      `sum over k does not converge at L = 1: its terms are not yet below 2^-${PREC + 4} of the sum after ${MAX_TERMS} terms`,
    );
  });

  it('a product whose factors do not tend to 1 fails the same way', () => {
    const f = compile('prod(1 + x/k, k, 1, inf)');
    expect(caught(() => f([fromInt(1), fromInt(1)])).message).toMatch(
      /prod over k does not converge at x = 1, y = 1: its factors minus 1 are not yet below 2\^-\d+ after 100000 terms/,
    );
  });

  it('a call with the wrong number of values is a programming error (RangeError)', () => {
    expect(() => compile('x')([fromInt(1)])).toThrow(RangeError);
  });
});
