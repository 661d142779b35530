import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, createGas, startRun, TRAP_SPEC, waitForRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

let t: TestApp;
let token: string;
let reviewerToken: string;
let outsiderToken: string;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp();
  const author = await insertUser(t, 'author');
  const reviewer = await insertUser(t, 'reviewer');
  token = await tokenFor(t, author);
  reviewerToken = await tokenFor(t, reviewer);
  outsiderToken = await tokenFor(t, await insertUser(t, 'author'));
  studyId = await insertStudy(t, author, [reviewer]);
});
afterAll(() => t.close());

const api = (method: 'get' | 'post' | 'put' | 'delete', path: string, who = token) =>
  request(t.app)[method](`/api${path}`).set('Authorization', bearer(who));

describe('gases', () => {
  it('keeps every version; a run keeps pointing at the version it ran', async () => {
    const gasId = await createGas(t, token, studyId);
    const runId = await startRun(t, token, gasId);
    await waitForRun(t, runId);
    const put = await api('put', `/gases/${gasId}`).send({
      spec: { ...TRAP_SPEC, title: 'trap, deeper', nMax: 6 },
    });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ version: 2, title: 'trap, deeper', spec: { nMax: 6 } });
    expect(put.body.versions.map((v: { version: number }) => v.version)).toEqual([1, 2]);
    const v1 = await api('get', `/gases/${gasId}/versions/1`);
    expect(v1.body.spec.nMax).toBe(TRAP_SPEC.nMax);
    const run = await api('get', `/runs/${runId}`);
    expect(run.body).toMatchObject({ gasVersion: 1, spec: { nMax: TRAP_SPEC.nMax }, studyId });
    const list = await api('get', `/studies/${studyId}/gases`);
    const row = list.body.find((g: { id: string }) => g.id === gasId);
    expect(row).toMatchObject({
      version: 2,
      statistics: 'fermion',
      weightsKind: 'formula',
      lastRun: { id: runId, status: 'done' },
    });
    expect((await api('get', `/gases/${gasId}/versions/3`)).status).toBe(404);
  });

  it('soft-deletes: gone from the list, still readable by id with its runs', async () => {
    const gasId = await createGas(t, token, studyId);
    expect((await api('delete', `/gases/${gasId}`)).status).toBe(204);
    const list = await api('get', `/studies/${studyId}/gases`);
    expect(list.body.map((g: { id: string }) => g.id)).not.toContain(gasId);
    expect((await api('get', `/gases/${gasId}`)).status).toBe(200);
    expect((await api('get', `/gases/${gasId}/runs`)).status).toBe(200);
    expect((await api('put', `/gases/${gasId}`).send({ spec: TRAP_SPEC })).status).toBe(404);
  });

  it('hides a study’s gases from people outside it, and keeps reviewers from editing', async () => {
    const gasId = await createGas(t, token, studyId);
    expect((await api('get', `/gases/${gasId}`, outsiderToken)).status).toBe(404);
    expect((await api('get', `/studies/${studyId}/gases`, outsiderToken)).status).toBe(404);
    expect(
      (await api('post', `/studies/${studyId}/gases`, outsiderToken).send({ spec: TRAP_SPEC }))
        .status,
    ).toBe(404);
    expect((await api('get', `/gases/${gasId}`, reviewerToken)).status).toBe(200);
    expect(
      (await api('put', `/gases/${gasId}`, reviewerToken).send({ spec: TRAP_SPEC })).status,
    ).toBe(403);
    expect((await api('post', `/gases/${gasId}/runs`, reviewerToken).send({})).status).toBe(403);
  });

  it.each([
    [{ ...TRAP_SPEC, nMax: 201 }, 'spec.nMax', 'N_max: ', 'at most 200'],
    [{ ...TRAP_SPEC, order: '20001' }, 'spec.order', 'Order: ', 'more than 20000 steps'],
    [
      { ...TRAP_SPEC, classTable: 41, nMax: 50 },
      'spec.classTable',
      'Class-table depth: ',
      'at most 40',
    ],
    [
      { ...TRAP_SPEC, weights: { kind: 'formula', expression: 'q'.repeat(4097) } },
      'spec.weights.expression',
      'Cycle-weight expression: ',
      '4096',
    ],
    [
      { ...TRAP_SPEC, weights: { kind: 'formula', expression: 'q^(L/2' } },
      'spec.weights.expression',
      'Cycle-weight expression: ',
      'cannot read',
    ],
    [
      { ...TRAP_SPEC, weights: { kind: 'values', values: Array(1001).fill('1') } },
      'spec.weights.values',
      'Cycle weights: ',
      'the limit is 1000',
    ],
    [{ ...TRAP_SPEC, format: 'other' }, 'spec.format', 'Gas: ', 'traceloom.gas/1'],
    [
      { ...TRAP_SPEC, statistics: undefined },
      'spec.statistics',
      'Statistics: ',
      'must be "fermion" or "boson"',
    ],
  ])(
    'refuses a bad spec with 400 naming the field and limit (%#)',
    async (spec, field, label, text) => {
      const res = await api('post', `/studies/${studyId}/gases`).send({ spec });
      expect(res.status).toBe(400);
      expect(res.body.error.field).toBe(field);
      // the message names the field as the gas form labels it, never by its internal path
      expect(res.body.error.message.startsWith(label)).toBe(true);
      expect(res.body.error.message).not.toContain('spec.');
      expect(res.body.error.message).toContain(text);
    },
  );
});

describe('POST /compute (preview)', () => {
  it('answers a small spec synchronously', async () => {
    const res = await api('post', '/compute').send({ spec: TRAP_SPEC });
    expect(res.status).toBe(200);
    expect(res.body.format).toBe('traceloom.result/1');
    // Z(1) of the trap = q^(1/2)/(1-q) = q^(1/2) + q^(3/2) + ... (geometric series).
    expect(res.body.canonical[1].value.terms.slice(0, 2)).toEqual([
      ['1/2', '1'],
      ['3/2', '1'],
    ]);
  });

  it.each([
    [{ nMax: 13 }, 'spec.nMax', 'at most 12'],
    [{ classTable: 9, nMax: 12 }, 'spec.classTable', 'at most 8'],
    [{ order: '201/2' }, 'spec.order', 'at most 200 steps'],
  ])('refuses beyond the preview caps: %j', async (patch, field, text) => {
    const res = await api('post', '/compute').send({ spec: { ...TRAP_SPEC, ...patch } });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe(field);
    expect(res.body.error.message).toContain(text);
  });

  it('answers 400 naming the field for an engine refusal', async () => {
    const res = await api('post', '/compute').send({
      spec: { ...TRAP_SPEC, weights: { kind: 'formula', expression: 'frobnicate(L)' } },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('spec.weights.expression');
  });
});
