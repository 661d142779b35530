import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Run, type User } from '../db/entities/index.js';
import { bearer, createGas, startRun, waitForRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

let t: TestApp;
let author: User;
let token: string;
let studyId: string;

// Fermions on c_p = q^|p| (p in Z): Z(N) starts at q^floor(N^2/4) (sum of the N lowest levels
// 0, 1, 1, 2, 2, ...; OEIS A002620), so at O(q^200) the rows N = 29..40 are not determined.
const RING = {
  format: 'traceloom.gas/1',
  title: 'ring',
  statistics: 'fermion',
  variable: 'q',
  order: '200',
  nMax: 40,
  classTable: 0,
  weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '0', from: null, to: null },
};

beforeAll(async () => {
  t = await createTestApp({
    runs: {
      threads: 2,
      wallClockMs: 2500,
      perUserCap: 4,
      maxOldGenerationSizeMb: 1024,
      previewMs: 1500,
    },
  });
  author = await insertUser(t, 'author');
  token = await tokenFor(t, author);
  studyId = await insertStudy(t, author);
  // under Vitest a fresh quick worker loads the engine from TypeScript source (seconds): warm it
  await request(t.app)
    .post('/api/compute/estimate')
    .set('Authorization', bearer(token))
    .send({ spec: { ...RING, nMax: 2 } });
}, 60_000);
afterAll(async () => {
  await t.close();
});

describe('honest rows through the API', () => {
  it('warns at run creation, and the result marks rows 29..40 not determined, not compared', async () => {
    const gasId = await createGas(t, token, studyId, RING);
    const start = await request(t.app)
      .post(`/api/gases/${gasId}/runs`)
      .set('Authorization', bearer(token))
      .send({});
    expect(start.status).toBe(202);
    expect(start.body.warnings.join(' ')).toMatch(
      /N = 29\.\.40 will not be determined at O\(q\^200\)/,
    );
    expect(start.body.warnings.join(' ')).toMatch(/at least O\(q\^401\)/);
    const run = await waitForRun(t, start.body.id);
    expect(run.status, run.error ?? '').toBe('done');
    const res = await request(t.app)
      .get(`/api/runs/${start.body.id}`)
      .set('Authorization', bearer(token));
    const rows = res.body.result.canonical as { N: number; determined: boolean; agrees: unknown }[];
    expect(rows.filter((r) => !r.determined).map((r) => r.N)).toEqual(
      Array.from({ length: 12 }, (_, i) => 29 + i),
    );
    expect(rows[35]).toMatchObject({ determined: false, agrees: null });
    expect(rows[28]).toMatchObject({ determined: true, agrees: true });
    expect(res.body.result.orderAdvice.orderNeeded).toBe('401');
  });

  it('a run read refuses a bad class query naming its field, before the run is looked up', async () => {
    const id = '6f1c2d3e-0000-4000-8000-00000000ffff';
    const ask = async (query: string) => {
      const res = await request(t.app)
        .get(`/api/runs/${id}?${query}`)
        .set('Authorization', bearer(token));
      expect(res.status).toBe(400);
      return res.body.error as { message: string; field: string };
    };
    expect(await ask('classes=x')).toMatchObject({
      field: 'classes',
      message: 'classes: must be a whole number N.',
    });
    expect(await ask('classes=3&classPage=-1')).toMatchObject({
      field: 'classPage',
      message: 'classPage: must be a whole number (a page index from 0).',
    });
    expect(await ask('classPage=1')).toMatchObject({
      field: 'classPage',
      message: 'classPage: needs classes=N as well.',
    });
    const absent = await request(t.app)
      .get(`/api/runs/${id}?classes=3`)
      .set('Authorization', bearer(token));
    expect(absent.status).toBe(404);
  });
});

describe('estimate before a run', () => {
  const heavy = {
    ...RING,
    order: '100',
    classTable: 40,
    weights: { ...RING.weights, offset: '1/2' },
  };
  it('POST /compute/estimate gives the cost and refuses a class table of 40 at O(q^100)', async () => {
    const res = await request(t.app)
      .post('/api/compute/estimate')
      .set('Authorization', bearer(token))
      .send({ spec: heavy });
    expect(res.status).toBe(200);
    // sum of p(1..40) = 215307 cycle types (OEIS A000070), 100 coefficients each
    expect(res.body.estimate).toMatchObject({ cycleTypes: 215307, classCoefficients: 21530700 });
    expect(res.body.refusal.field).toBe('classTable');
    expect(res.body.refusal.message).toMatch(/215,307 cycle types/);
  });
  it('the run of such a gas is refused with the estimate, and no run is stored', async () => {
    const gasId = await createGas(t, token, studyId, heavy);
    const before = await t.dataSource.getRepository(Run).count();
    const res = await request(t.app)
      .post(`/api/gases/${gasId}/runs`)
      .set('Authorization', bearer(token))
      .send({});
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'too_costly', field: 'classTable' });
    expect(res.body.error.message).toMatch(/MB/);
    expect(await t.dataSource.getRepository(Run).count()).toBe(before);
  });
  it('a bad spec is refused naming its field', async () => {
    const res = await request(t.app)
      .post('/api/compute/estimate')
      .set('Authorization', bearer(token))
      .send({ spec: { ...RING, nMax: 'many' } });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toMatch(/nMax/);
  });
});

describe('a later phase that fails keeps the finished routes', () => {
  it('the class table stops at the wall-clock limit; the canonical table stays, marked incomplete', async () => {
    // 12,000-odd cycle types x 60 coefficients: far beyond 2.5 s, while the recursion takes ms
    const slow = {
      ...RING,
      order: '60',
      nMax: 26,
      classTable: 26,
      weights: { ...RING.weights, offset: '1/2' },
    };
    const runId = await startRun(t, token, await createGas(t, token, studyId, slow));
    const run = await waitForRun(t, runId);
    expect(run.status).toBe('failed');
    const res = await request(t.app).get(`/api/runs/${runId}`).set('Authorization', bearer(token));
    expect(res.body.error).toMatch(/wall-clock limit/);
    const result = res.body.result;
    expect(result.canonical).toHaveLength(27);
    expect(result.canonical[4].routes).toEqual(['recursion', 'product']);
    expect(result.canonical[4].agrees).toBe(true);
    expect(result.incomplete.phase).toBe('classSum');
    expect(result.incomplete.reason).toMatch(/^the class table stopped after the wall-clock limit/);
    expect(result.incomplete.reason).toMatch(/cycle types$/);
  });
});
