import { describe, expect, it } from 'vitest';
import { compute } from '../compute.js';
import type { NumericRowVerdict } from './checks.js';
import { exp } from './elementary.js';
import { div, fromInt, fromNumber, ldexp, mul, Real, sub, toNumber } from './real.js';
import { taylorByInterpolation } from './taylor.js';

const P = 260;

describe('Taylor coefficients by Chebyshev interpolation', () => {
  it('exp(2 x): c_N = 2^N / N! (common practice)', { timeout: 60_000 }, () => {
    const f = (x: Real) => ({ value: exp(mul(fromInt(2), x, P), P), error: 0 });
    const c = taylorByInterpolation(f, 12, fromNumber(1), P);
    let fact = 1;
    c.forEach((e, N) => {
      if (N > 0) fact *= N;
      const exact = 2 ** N / fact;
      expect(Math.abs(toNumber(e.value) - exact)).toBeLessThanOrEqual(1e-14 * exact);
      // the error estimate covers the true error (a Real check at 260 bits)
      const d = Math.abs(toNumber(sub(e.value, fromNumber(exact), P)));
      expect(d).toBeLessThanOrEqual(e.error + 1e-16 * exact);
    });
  });

  it('1/(1 - x/2) on [-1, 1]: c_N = 2^-N (a pole at 2)', { timeout: 60_000 }, () => {
    const f = (x: Real) => ({
      value: div(fromInt(1), sub(fromInt(1), ldexp(x, -1), P), P),
      error: 0,
    });
    const c = taylorByInterpolation(f, 10, fromNumber(1), P);
    c.forEach((e, N) => {
      const d = Math.abs(toNumber(sub(e.value, ldexp(fromInt(1), -N), P)));
      expect(d).toBeLessThanOrEqual(Math.max(e.error, 1e-30));
      expect(e.error).toBeLessThan(1e-8);
    });
  });
});

describe('numeric grand check of an expression in kappa', () => {
  // fermions with spectrum c_p = q^(p + 1/2), p = 0, 1, ...: Xi = prod_(n>=0) (1 + kappa q^(n+1/2))
  // exactly (Euler's product; the q-binomial theorem gives Z(N) = q^(N^2/2) / (q; q)_N)
  const gas = {
    format: 'traceloom.gas/1',
    statistics: 'fermion',
    variable: 'q',
    precision: 20,
    nMax: 5,
    classTable: 0,
    at: { q: '1/10' },
    weights: { kind: 'spectrum', expression: 'q^(p + 1/2)', offset: '0', from: '0', to: null },
  };

  it(
    'the product form agrees on every row, within the stated tolerance',
    { timeout: 60_000 },
    () => {
      const r = compute({
        ...gas,
        grand: { kind: 'expression', expression: 'prod(1 + kappa*q^(n + 1/2), n, 0, inf)' },
      });
      const rows = r.grandCheck as NumericRowVerdict[];
      expect(rows).toHaveLength(6);
      for (const row of rows) {
        expect(row.agrees).toBe(true);
        expect(Number(row.tolerance)).toBeLessThan(1e-18);
      }
    },
  );

  it('a wrong grand function fails where it differs', { timeout: 60_000 }, () => {
    const r = compute({
      ...gas,
      grand: {
        kind: 'expression',
        expression: 'prod(1 + kappa*q^(n + 1/2), n, 0, inf) * (1 + kappa^3/10^12)',
      },
    });
    const rows = r.grandCheck as NumericRowVerdict[];
    expect(rows.slice(0, 3).every((row) => row.agrees)).toBe(true);
    expect(rows[3]!.agrees).toBe(false);
  });

  it('bosons: 1 / prod (1 - kappa q^(n+1/2))', { timeout: 60_000 }, () => {
    const r = compute({
      ...gas,
      statistics: 'boson',
      grand: { kind: 'expression', expression: '1/prod(1 - kappa*q^(n + 1/2), n, 0, inf)' },
    });
    for (const row of r.grandCheck as NumericRowVerdict[]) expect(row.agrees).toBe(true);
  });
});
