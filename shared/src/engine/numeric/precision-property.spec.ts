import { describe, expect, it } from 'vitest';
import { compute } from '../compute.js';
import { parseDecimal } from './decimal.js';
import type { NumericValueJson } from './estimate.js';
import { abs, magnitude, sub } from './real.js';

const P = 400;

/**
 * The shown text of `low` is the correct rounding of the finer value `high`: the finer value
 * lies within half a unit of the last shown digit of `low` (plus the finer value's own error).
 */
function consistent(low: NumericValueJson, high: NumericValueJson): boolean {
  if (low.real === '0') return true;
  const m = /^[+-]?\d+(?:\.(\d*))?(?:e([+-]?\d+))?$/.exec(low.real)!;
  // decimal position of the last shown digit
  const last = Number(m[2] ?? '0') - (m[1] ?? '').length;
  const halfUnit = 0.5 * 10 ** last;
  const d = abs(sub(parseDecimal(low.real, P), parseDecimal(high.real, P), P));
  if (d.m === 0n) return true;
  return 2 ** magnitude(d) <= 2 * (halfUnit + Number(high.error));
}

describe('a finer precision never changes a shown digit (property)', () => {
  const cases: [string, object][] = [
    [
      'the line kernel',
      {
        statistics: 'fermion',
        nMax: 6,
        weights: {
          kind: 'kernel',
          expression: '1/(2*pi) / sqrt(2*cosh(x/2)) / (2*cosh((x-y)/2)) / sqrt(2*cosh(y/2))',
          from: null,
          to: null,
          periodic: false,
        },
      },
    ],
    [
      'a Gaussian kernel on an interval, bosons',
      {
        statistics: 'boson',
        nMax: 5,
        weights: {
          kind: 'kernel',
          expression: 'exp(-(x - y)^2) / 3',
          from: '-1',
          to: '1',
          periodic: false,
        },
      },
    ],
    [
      'a spectrum at q = 1/7',
      {
        statistics: 'fermion',
        nMax: 6,
        at: { q: '1/7' },
        weights: {
          kind: 'spectrum',
          expression: 'q^(p + 1/2)/(1 + q^(p + 1/2))',
          from: '0',
          to: null,
        },
      },
    ],
  ];
  it.each(cases)('%s at 9, 13 and 18 digits', { timeout: 120_000 }, (_name, gas) => {
    const runs = [9, 13, 18].map((precision) =>
      compute({ format: 'traceloom.gas/1', variable: 'q', classTable: 0, precision, ...gas }),
    );
    for (let k = 0; k + 1 < runs.length; k++) {
      const a = runs[k]!.canonical;
      const b = runs[k + 1]!.canonical;
      for (let N = 0; N < a.length; N++) {
        const va = a[N]!.value as unknown as NumericValueJson;
        const vb = b[N]!.value as unknown as NumericValueJson;
        expect(consistent(va, vb), `N = ${N}: ${va.real} then ${vb.real} ± ${vb.error}`).toBe(true);
      }
    }
  });
});
