import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { numericCells } from '@traceloom/shared/format';
import { agreeWithinError } from '../compute/numeric-values.js';
import {
  api,
  approve,
  draftOf,
  finishedRunOf,
  inReview,
  warmWorkers,
} from '../testing/dataset-fixtures.js';
import { bearer } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

/** The harmonic trap at q = 1/10: Z(N) = q^(N^2/2)/(q;q)_N (Andrews 1976, Cor. 2.2). */
const NUMERIC_TRAP = {
  format: 'traceloom.gas/1',
  title: 'trap at q = 1/10',
  statistics: 'fermion',
  variable: 'q',
  precision: 20,
  at: { q: '1/10' },
  nMax: 4,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
} as const;

// mpmath 1.3 (independent): q^(N^2/2)/qp(q,q,N) at q = 1/10, mp.dps = 50
const MPMATH = [
  '1',
  '0.3513641844631532591109881716036353926355',
  '0.01122334455667789001122334455667789001122',
  '0.00003552685862257745210978535824750360387008',
  '0.00000001123570270608431214615289812933034045269',
];

let t: TestApp;
let author: User;
let reviewer: User;
let steward: User;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author', { displayName: 'Ines Okafor' });
  reviewer = await insertUser(t, 'reviewer', { displayName: 'Tomas Varga' });
  steward = await insertUser(t, 'steward', { displayName: 'Mei Lindqvist' });
  studyId = await insertStudy(t, author, [reviewer, steward]);
  await warmWorkers(t, author);
});
afterAll(() => t.close());

const numericRun = async (): Promise<string> =>
  finishedRunOf(t, await tokenFor(t, author), studyId, NUMERIC_TRAP);

describe('a numeric gas from creation to a verified, locked dataset', () => {
  it('runs, shows Z(N) within its error of the exact values, locks and verifies', async () => {
    const runId = await numericRun();
    const run = await api(t, author, 'get', `/runs/${runId}`, undefined, 200);
    const canonical = run.result.canonical as Array<{
      N: number;
      value: { real: string; error: string };
    }>;
    expect(canonical).toHaveLength(5);
    for (const row of canonical) {
      // the exact value (40 digits) lies within the stated error and the rounding of the last digit
      expect(agreeWithinError(row.value, { real: MPMATH[row.N]!, error: '1e-45' })).toBe(true);
      expect(
        row.value.real
          .replace(/[eE].*$/, '')
          .replace(/[-.]/g, '')
          .replace(/^0+/, '').length,
      ).toBeLessThanOrEqual(20);
    }
    expect(run.result.numeric).toMatchObject({ precision: 20 });

    const id = await draftOf(t, author, runId, 'Trap at q = 1/10');
    const draft = await api(t, author, 'get', `/datasets/${id}`, undefined, 200);
    expect(draft.snapshot.precision).toBe(20);
    expect(draft.snapshot.order).toBeNull();
    expect(draft.snapshot.known).toMatch(
      /^numeric at q = 1\/10, 20 digits requested, errors estimated by evaluating at two working precisions/,
    );
    expect(draft.snapshot.canonical[2].value).toEqual(canonical[2]!.value);
    await inReview(t, author, id, reviewer);
    await approve(t, reviewer, id);
    const { hash } = await api(t, steward, 'post', `/datasets/${id}/lock`, undefined, 200);
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
    const verify = await api(t, author, 'post', `/datasets/${id}/verify`, undefined, 200);
    expect(verify).toMatchObject({ ok: true, mismatches: [], hashOk: true });

    const csv = await request(t.app)
      .get(`/api/datasets/${id}/export?format=csv`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(csv.status).toBe(200);
    expect(csv.text).toMatch(/\nvalues,"numeric at q = 1\/10, 20 digits requested/);
    expect(csv.text).toContain(`\nN,Z(N),error,routes,route check\n0,`);
    const [real, error] = numericCells(canonical[2]!.value);
    expect(Number(real)).toBe(Number(canonical[2]!.value.real));
    expect(csv.text).toContain(`\n2,${real},${error},`);
    const tex = await request(t.app)
      .get(`/api/datasets/${id}/export?format=latex`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(tex.text).toMatch(/^Z\(2\) &= 0\.01122\\,33445/m);
    const matrix = await request(t.app)
      .get(`/api/datasets/${id}/export?format=matrix`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(matrix.status).toBe(400);
    expect(matrix.body.error.message).toMatch(/^format: a numeric table has no coefficient matrix/);
    expect(tex.text).toContain('% caution: Each error is an estimate, not a bound');
  });

  it.each([
    // one digit fewer shown (10/891 rounded to 19 digits): still the same number
    [
      'within the error',
      (v: { real: string; error: string }) => ({ ...v, real: '1.122334455667789001e-2' }),
      [],
    ],
    // the 10th digit changed: far beyond an error of ~1e-37
    [
      'beyond the error',
      (v: { real: string; error: string }) => ({
        ...v,
        real: v.real.replace(/^(\d\.\d{8})(\d)/, (_m, a, d) => `${a}${(Number(d) + 1) % 10}`),
      }),
      [/^canonical N = 2: differs beyond the combined error/],
    ],
  ])('verify compares a changed stored value %s', async (_label, change, expected) => {
    const id = await draftOf(t, author, await numericRun());
    const [{ snapshot }] = await t.dataSource.query(
      `SELECT "snapshot" FROM "dataset" WHERE "id" = ?`,
      [id],
    );
    const s = JSON.parse(snapshot);
    expect(s.result.canonical[2].value.real).toBe('1.1223344556677890011e-2'); // 10/891, 20 digits
    s.result.canonical[2].value = change(s.result.canonical[2].value);
    await t.dataSource.query(`UPDATE "dataset" SET "snapshot" = ? WHERE "id" = ?`, [
      JSON.stringify(s),
      id,
    ]);
    const verify = await api(t, author, 'post', `/datasets/${id}/verify`, undefined, 200);
    expect(verify.mismatches).toHaveLength(expected.length);
    expected.forEach((m, i) => expect(verify.mismatches[i]).toMatch(m));
    expect(verify.ok).toBe(expected.length === 0);
  });
});

describe('numeric gases: input checks, preview and probe', () => {
  it.each([
    [{ ...NUMERIC_TRAP, precision: 200 }, 'spec.precision', /at most 100 digits/],
    [{ ...NUMERIC_TRAP, precision: 4 }, 'spec.precision', /at least 8 digits/],
    [{ ...NUMERIC_TRAP, at: { x: '1/10' } }, 'spec.at.x', /fixes x, but the variable is q/],
    [
      {
        format: 'traceloom.gas/1',
        statistics: 'fermion',
        order: '4',
        nMax: 2,
        weights: { kind: 'kernel', expression: 'exp(-(x^2+y^2))' },
      },
      'spec.precision',
      /is required for a kernel/,
    ],
    [
      { ...NUMERIC_TRAP, weights: { kind: 'formula', expression: 'q^(L/2' } },
      'spec.weights.expression',
      /./,
    ],
  ])('gas creation refuses %j with 400 naming %s', async (spec, field, message) => {
    const res = await request(t.app)
      .post(`/api/studies/${studyId}/gases`)
      .set('Authorization', bearer(await tokenFor(t, author)))
      .send({ spec });
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.field).toBe(field);
    expect(res.body.error.message).toMatch(message);
  });

  it('previews a small numeric spec and refuses one beyond its limits, naming the field', async () => {
    const token = await tokenFor(t, author);
    const ok = await request(t.app)
      .post('/api/compute')
      .set('Authorization', bearer(token))
      .send({ spec: { ...NUMERIC_TRAP, precision: 10, nMax: 3 } });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    // Z(2) = 10/891 = 0.01122334455667789... (exact)
    expect(ok.body.canonical[2].value.real).toBe('1.122334456e-2');
    for (const [change, field] of [
      [{ precision: 30 }, 'spec.precision'],
      [{ nMax: 7 }, 'spec.nMax'],
    ] as const) {
      const res = await request(t.app)
        .post('/api/compute')
        .set('Authorization', bearer(token))
        .send({ spec: { ...NUMERIC_TRAP, ...change } });
      expect(res.status).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
  });
});

/**
 * A rank-2 kernel on the line from the first two Hermite functions: rho = (1 + x y) e^(-(x^2+y^2)/2)
 * / (2 sqrt(pi)) has eigenvalues 1/2 and 1/4 (int e^(-x^2) = sqrt(pi), int x^2 e^(-x^2) =
 * sqrt(pi)/2, DLMF 5.9.1 with Gamma(1/2) and Gamma(3/2)); so Z_L = 2^-L + 4^-L, and for fermions
 * Z(1) = 3/4, Z(2) = 1/8 (the elementary symmetric functions of the eigenvalues).
 */
const RANK2_KERNEL = {
  format: 'traceloom.gas/1',
  title: 'rank-2 Hermite kernel',
  statistics: 'fermion',
  precision: 12,
  nMax: 2,
  weights: { kind: 'kernel', expression: '(1 + x*y)*exp(-(x^2+y^2)/2)/(2*sqrt(pi))' },
} as const;

describe('a kernel gas', () => {
  it('runs by both routes, agrees with its exact spectrum, and verifies as a dataset', async () => {
    const runId = await finishedRunOf(t, await tokenFor(t, author), studyId, RANK2_KERNEL);
    const run = await api(t, author, 'get', `/runs/${runId}`, undefined, 200);
    const exact = ['1', '0.75', '0.125'];
    for (const row of run.result.canonical) {
      expect(row.routes).toEqual(['recursion', 'fredholm']);
      expect(row.agrees).toBe(true);
      expect(agreeWithinError(row.value, { real: exact[row.N]!, error: '0' })).toBe(true);
      expect(Number(row.value.error)).toBeLessThan(1e-12);
    }
    const weights = run.result.weights.map((w: { value: { real: string } }) =>
      Number(w.value.real),
    );
    expect(weights).toEqual([0.75, 0.3125]); // 1/2 + 1/4, 1/4 + 1/16
    const id = await draftOf(t, author, runId, 'Rank-2 kernel');
    const d = await api(t, author, 'get', `/datasets/${id}`, undefined, 200);
    expect(d.snapshot.known).toMatch(
      /^numeric, 12 digits requested, errors estimated by comparing resolutions of the kernel \(\d+, \d+ and \d+ points; trapezoid/,
    );
    const routes = d.checks.filter((r: { check: string }) => r.check === 'routes');
    expect(routes[1]).toMatchObject({
      label: 'Z(N) by Newton recursion, Fredholm determinant',
      status: 'passes',
      detail: 'the routes agree within their errors',
    });
    const verify = await api(t, author, 'post', `/datasets/${id}/verify`, undefined, 200);
    expect(verify).toMatchObject({ ok: true, mismatches: [] });
  });
});

describe('numeric grand check', () => {
  it('stores verdicts with their tolerance and shows them as dataset check rows', async () => {
    // Z(0..2) of the trap: 1, q^(1/2)/(1-q), q^2/((1-q)(1-q^2)) (Andrews 1976, Cor. 2.2); the
    // last one supplied wrong on purpose (q^2/(1-q) instead)
    const runId = await finishedRunOf(t, await tokenFor(t, author), studyId, {
      ...NUMERIC_TRAP,
      nMax: 2,
      grand: { kind: 'coefficients', values: ['1', 'q^(1/2)/(1-q)', 'q^2/(1-q)'] },
    });
    const c = await api(t, reviewer, 'post', `/runs/${runId}/comparisons`, { grand: true }, 201);
    expect(c.rows.map((r: { agrees: boolean }) => r.agrees)).toEqual([true, true, false]);
    expect(c.rows[1]).toEqual(
      expect.objectContaining({ N: 1, tolerance: expect.stringMatching(/e-\d+$/) }),
    );
    // q^2/(1-q) - q^2/((1-q)(1-q^2)) = -q^4/((1-q)(1-q^2)) = -1/8910 at q = 1/10
    // (the difference is stated to two digits, 1.1e-4 or 1.2e-4 for 1.1223e-4)
    expect(Number(c.rows[2].difference)).toBeGreaterThan(1.05e-4);
    expect(Number(c.rows[2].difference)).toBeLessThan(1.25e-4);
    const id = await draftOf(t, author, runId);
    const d = await api(t, author, 'get', `/datasets/${id}`, undefined, 200);
    const grand = d.checks.filter((r: { check: string }) => r.check === 'grand');
    expect(grand.map((r: { status: string }) => r.status)).toEqual(['passes', 'passes', 'fails']);
    expect(grand[1].detail).toMatch(/^agrees within \S+ \(difference \S+\)$/);
    expect(grand[2].detail).toMatch(
      /^differs by 1\.\de-4, beyond the tolerance \S+: computed 0\.011223344/,
    );
  });
});

describe('numeric reference tables', () => {
  const upload = async (csv: string) => {
    const res = await request(t.app)
      .post(`/api/studies/${studyId}/references`)
      .set('Authorization', bearer(await tokenFor(t, reviewer)))
      .attach('file', Buffer.from(csv), 'decimals.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.numeric).toBe(true);
    return res.body.id as string;
  };
  const compare = async (runId: string, referenceId: string) =>
    api(t, reviewer, 'post', `/runs/${runId}/comparisons`, { referenceId }, 201);

  it('compares within the combined tolerance: 12 printed digits agree, a wrong 12th digit does not', async () => {
    const runId = await numericRun();
    // mpmath values printed to 12 significant digits (each known to half a unit of its last digit)
    const good = await upload(
      ['N,value,note', '1,0.351364184463,', '2,0.0112233445567,', '3,3.55268586226e-5,'].join('\n'),
    );
    const rows = (await compare(runId, good)).rows;
    expect(rows.map((r: { agrees: boolean }) => r.agrees)).toEqual([true, true, true]);
    // tolerance = half a unit of the 12th digit + the run's error, e.g. 5e-13 for Z(1)
    expect(Number(rows[0].tolerance)).toBeGreaterThanOrEqual(5e-13);
    expect(Number(rows[0].tolerance)).toBeLessThan(5.1e-13);

    const bad = await upload(
      ['N,value,note', '1,0.351364184463,', '2,0.0112233445568,wrong last digit'].join('\n'),
    );
    const verdicts = (await compare(runId, bad)).rows;
    expect(verdicts[0]).toMatchObject({ N: 1, agrees: true });
    expect(verdicts[1]).toMatchObject({ N: 2, agrees: false });
    // |0.0112233445568 - 10/891| = 1.2e-15 > 5e-17 (half a unit of the 15th decimal place)
    expect(Number(verdicts[1].difference)).toBeGreaterThan(Number(verdicts[1].tolerance));
  });

  it('refuses to compare a table of decimals with a series run', async () => {
    const seriesRun = await finishedRunOf(t, await tokenFor(t, author), studyId, {
      ...NUMERIC_TRAP,
      precision: undefined,
      at: undefined,
      step: '1/2',
      order: '6',
    });
    const table = await upload(['N,value,note', '1,0.351364184463,'].join('\n'));
    const res = await request(t.app)
      .post(`/api/runs/${seriesRun}/comparisons`)
      .set('Authorization', bearer(await tokenFor(t, reviewer)))
      .send({ referenceId: table });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('referenceId');
  });
});
