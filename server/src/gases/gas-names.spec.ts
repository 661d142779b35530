import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { Gas } from '../db/entities/index.js';
import { bearer, TRAP_SPEC } from '../testing/gas-fixtures.js';
import { authorStudy, type AuthorStudy } from '../testing/author-study.js';
import { MAIN_PATH_PARSE_CHARS } from './gas-names.js';

// The probe stands aside: every refusal below must come from the cheap check on the main path.
const probe = vi.hoisted(() => vi.fn(async () => undefined));
vi.mock('./gas-probe.js', () => ({ assertSpecEvaluates: probe }));

let s: AuthorStudy;
beforeAll(async () => void (s = await authorStudy()));
afterAll(() => s.t.close());
beforeEach(() => probe.mockClear());

const create = (spec: object) =>
  request(s.t.app)
    .post(`/api/studies/${s.studyId}/gases`)
    .set('Authorization', bearer(s.token))
    .send({ spec });
const gasCount = () => s.t.dataSource.getRepository(Gas).count();

const formula = (expression: string) => ({
  ...TRAP_SPEC,
  weights: { kind: 'formula', expression },
});

/** Rank-2 Hermite kernel of numeric-datasets.spec.ts (numeric functions: exp, sqrt, pi). */
const KERNEL = {
  format: 'traceloom.gas/1',
  title: 'kernel',
  statistics: 'fermion',
  precision: 12,
  nMax: 2,
  weights: { kind: 'kernel', expression: '(1 + x*y)*exp(-(x^2+y^2)/2)/(2*sqrt(pi))' },
};

describe('the cheap check of names and syntax before a gas is stored', () => {
  it.each([
    [formula('q^L * frobnicate(L)'), 'spec.weights.expression', /unknown function frobnicate/],
    [formula('q^L * evaluate(L)'), 'spec.weights.expression', /function evaluate is disabled/],
    [formula('q^(L/2'), 'spec.weights.expression', /cannot read the expression/],
    [
      { ...TRAP_SPEC, grand: { kind: 'expression', expression: 'qpoch(-kappa*q, q, inf)*zz(q)' } },
      'spec.grand.expression',
      /unknown function zz/,
    ],
    [
      { ...KERNEL, weights: { ...KERNEL.weights, expression: 'exp(-x^2-y^2)*besselj(0, x*y)' } },
      'spec.weights.expression',
      /unknown function besselj/,
    ],
  ])('refuses %j without the probe, naming %s', async (spec, field, message) => {
    const before = await gasCount();
    const res = await create(spec);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.code).toBe('invalid_spec');
    expect(res.body.error.field).toBe(field);
    expect(res.body.error.message).toMatch(message);
    expect(probe).not.toHaveBeenCalled();
    expect(await gasCount()).toBe(before);
  });

  it('passes the functions of both languages on to the probe', async () => {
    const exact = formula('q^(L/2)/(1-q^L) + 0*binom(L, 2)*theta3(0, q)*exp(q)*pexp(q)');
    for (const spec of [TRAP_SPEC, exact, KERNEL]) {
      const res = await create(spec);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    expect(probe).toHaveBeenCalledTimes(3);
  });

  it('past the parse budget still finds an unknown function the scan flags', async () => {
    // 1000 cycle weights of 40 characters: more text than the main path parses.
    const values = Array.from({ length: 1000 }, (_, i) => `q^${i}*(1+q)^2*(1-q)^2*(1+q^2)*(1-q^3)`);
    expect(values.join('').length).toBeGreaterThan(MAIN_PATH_PARSE_CHARS);
    values[997] = 'q^2*gamma_q(3)';
    const spec = { ...TRAP_SPEC, weights: { kind: 'values', values } };
    const res = await create(spec);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.field).toBe('spec.weights.values.997');
    expect(res.body.error.message).toMatch(/unknown function gamma_q/);
    expect(probe).not.toHaveBeenCalled();
  });
});
