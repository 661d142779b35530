import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { Comparison, ReferenceTable } from '../db/entities/index.js';
import { api, approve, draftOf, inReview, warmWorkers } from '../testing/dataset-fixtures.js';
import { bearer, finishedRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

let t: TestApp;
let author: User;
let reviewer: User;
let steward: User;
let other: User;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author');
  reviewer = await insertUser(t, 'reviewer');
  steward = await insertUser(t, 'steward');
  other = await insertUser(t, 'reviewer');
  studyId = await insertStudy(t, author, [reviewer, steward, other]);
  await warmWorkers(t, author);
}, 120_000);
afterAll(() => t.close());

/** Z_1 of the trap, q^(1/2)/(1-q), as a geometric series (common practice): an agreeing table. */
const AGREEING_CSV = Buffer.from('N,value\n0,1\n1,"q^(1/2) + q^(3/2) + q^(5/2) + O(q^3)"\n');

async function uploadAs(user: User): Promise<string> {
  const res = await request(t.app)
    .post(`/api/studies/${studyId}/references`)
    .set('Authorization', bearer(await tokenFor(t, user)))
    .attach('file', AGREEING_CSV, 'table.csv');
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

async function compare(runId: string, referenceId: string): Promise<string> {
  const res = await api(t, author, 'post', `/runs/${runId}/comparisons`, { referenceId }, 201);
  return res.id as string;
}

describe('a reference table page: edit, delete, comparisons', () => {
  it('edits title, normalization and note; refuses an unknown symbol on its field', async () => {
    const id = await uploadAs(reviewer);
    const edited = await api(
      t,
      reviewer,
      'patch',
      `/references/${id}`,
      { title: 'Table 3 of the note', normalization: 'q^(-N/2)', note: 'checked twice' },
      200,
    );
    expect(edited).toMatchObject({
      title: 'Table 3 of the note',
      normalization: 'q^(-N/2)',
      note: 'checked twice',
    });
    const bad = await request(t.app)
      .patch(`/api/references/${id}`)
      .set('Authorization', bearer(await tokenFor(t, reviewer)))
      .send({ normalization: 'x^N' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('normalization');
    expect(bad.body.error.message).toMatch(/^normalization: unknown symbol x/);
    const stored = await t.dataSource.getRepository(ReferenceTable).findOneByOrFail({ id });
    expect(stored.normalization).toBe('q^(-N/2)');
  });

  it('lets only the uploader or an editing role change a table', async () => {
    const id = await uploadAs(reviewer);
    const res = await request(t.app)
      .delete(`/api/references/${id}`)
      .set('Authorization', bearer(await tokenFor(t, other)));
    expect(res.status).toBe(403);
    await api(t, author, 'patch', `/references/${id}`, { title: 'By the owner' }, 200);
  });

  it('lists comparisons with their runs, and deletes a table no locked dataset cites', async () => {
    const runId = await finishedRun(t, await tokenFor(t, author), studyId);
    const id = await uploadAs(author);
    const comparisonId = await compare(runId, id);
    const list = await api(t, reviewer, 'get', `/references/${id}/comparisons`, undefined, 200);
    expect(list).toHaveLength(1);
    expect(list[0]).toMatchObject({ id: comparisonId, runId, gasVersion: 1 });
    expect(list[0].summary).toEqual({ agreeing: 2, total: 2 });
    expect(typeof list[0].gasTitle).toBe('string');
    // A draft dataset does not hold the table: deleting it removes its comparisons too.
    await draftOf(t, author, runId);
    await api(t, author, 'delete', `/references/${id}`, undefined, 204);
    expect(await t.dataSource.getRepository(Comparison).countBy({ id: comparisonId })).toBe(0);
    await api(t, author, 'get', `/references/${id}`, undefined, 404);
  }, 120_000);

  it('refuses to edit or delete a table a locked dataset cites, naming the dataset', async () => {
    const runId = await finishedRun(t, await tokenFor(t, author), studyId);
    const id = await uploadAs(author);
    await compare(runId, id);
    const datasetId = await draftOf(t, author, runId);
    await inReview(t, author, datasetId, reviewer);
    await approve(t, reviewer, datasetId);
    await api(t, steward, 'post', `/datasets/${datasetId}/lock`, undefined, 200);
    for (const [method, body] of [
      ['delete', undefined],
      ['patch', { title: 'New name' }],
    ] as const) {
      const res = await request(t.app)
        [method](`/api/references/${id}`)
        .set('Authorization', bearer(await tokenFor(t, author)))
        .send(body as object);
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('reference_in_locked_dataset');
      expect(res.body.error.message).toMatch(/the locked dataset “.+” \(version 1\) cite/);
    }
    expect(await t.dataSource.getRepository(ReferenceTable).countBy({ id })).toBe(1);
  }, 180_000);
});
