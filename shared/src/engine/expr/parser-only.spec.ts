import full from 'mathjs/lib/browser/math.js';
import { describe, expect, it } from 'vitest';
import lean from './parser-only.js';

/** An instance as sandbox.ts makes it: literals read as decimals, the same six overrides. */
function instance(m: { create: typeof full.create; all: typeof full.all }) {
  const math = m.create(m.all as typeof full.all);
  math.config({ number: 'BigNumber', precision: 64 });
  const parse = math.parse;
  math.import({ evaluate: () => 'disabled', parse: () => 'disabled' }, { override: true });
  return { math, parse };
}

const fullMath = instance(full);
const leanMath = instance(lean as unknown as typeof full);

// expressions of every node kind the engine reads (and some it refuses, which must still parse
// to the same tree so that the refusal names the same thing)
const EXPRESSIONS = [
  '1/(2*pi) / sqrt(2*cosh(x/2)) / (2*cosh((x-y)/2)) / sqrt(2*cosh(y/2))',
  '0.1 + 1e-3 - 2.5e+10 * 3!^2',
  '2x + 3 q^2 (1 - q)^-1',
  '-q^2^3 / -(1 + q)',
  'sum(q^(k^2), k, 1, inf) * prod(1 - q^k, k, 1, 10)',
  'theta_3(0.5, 1/10) + K(1/sqrt(2)) - E(0.3) + Ai(-1) + gamma(1/3) + zeta(3)',
  'x > 0 ? exp(-x) : log(1 + x)',
  'a[1] + b.c',
  '[1, 2; 3, 4]',
  '1:3',
  '{a: 1}',
  'f(x) = x^2',
  'y = 3; y + 1',
  'q == 1 and not (p != 2)',
  '"text"',
  'Infinity - NaN + true + null',
  '5 cm + 0x1F',
];

describe('the command line expression parser (parser-only.ts)', () => {
  it.each(EXPRESSIONS)('parses %s to the tree of the full mathjs build', (text) => {
    // toJSON names each node class and its fields; BigNumber literals keep their decimal text
    const a = JSON.stringify(fullMath.parse(text));
    const b = JSON.stringify(leanMath.parse(text));
    expect(b).toBe(a);
    expect(b.length).toBeGreaterThan(10);
  });

  it('reads number literals as BigNumbers of the same precision', () => {
    const a = fullMath.parse('0.1') as unknown as {
      value: { toString(): string; isBigNumber?: boolean };
    };
    const b = leanMath.parse('0.1') as unknown as {
      value: { toString(): string; isBigNumber?: boolean };
    };
    expect(b.value.isBigNumber).toBe(true);
    expect(b.value.toString()).toBe(a.value.toString());
  });

  it('refuses bad syntax with the message of the full build', () => {
    for (const text of ['1 +', '(1 + 2', 'sin(,)', '2 ** 3']) {
      const message = (p: (t: string) => unknown): string => {
        try {
          p(text);
          return 'no error';
        } catch (e) {
          return (e as Error).message;
        }
      };
      expect(message(leanMath.parse)).toBe(message(fullMath.parse));
      expect(message(leanMath.parse)).not.toBe('no error');
    }
  });

  it('keeps the overrides sandbox.ts installs', () => {
    const m = leanMath.math as unknown as Record<string, () => unknown>;
    expect(m['evaluate']!()).toBe('disabled');
    expect(m['parse']!()).toBe('disabled');
  });
});
