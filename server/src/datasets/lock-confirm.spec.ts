import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { api, approve, draftOf, inReview, warmWorkers } from '../testing/dataset-fixtures.js';
import { finishedRun } from '../testing/gas-fixtures.js';
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
let studyId: string;
let runId: string;

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author');
  reviewer = await insertUser(t, 'reviewer');
  steward = await insertUser(t, 'steward');
  studyId = await insertStudy(t, author, [reviewer, steward]);
  await warmWorkers(t, author);
  runId = await finishedRun(t, await tokenFor(t, author), studyId);
});
afterAll(() => t.close());

const summary = async (id: string) =>
  (
    (await api(t, steward, 'get', `/datasets?studyId=${studyId}`, undefined, 200)) as Array<{
      id: string;
      approved: boolean;
      readyToLock: boolean;
    }>
  ).find((d) => d.id === id)!;

describe('approved, ready to lock, and the confirmed lock', () => {
  it('flags an approved dataset in the list and on its page, only once approved', async () => {
    const id = await draftOf(t, author, runId);
    expect(await summary(id)).toMatchObject({ approved: false, readyToLock: false });
    await inReview(t, author, id, reviewer);
    expect(await summary(id)).toMatchObject({ approved: false, readyToLock: false });
    await approve(t, reviewer, id);
    expect(await summary(id)).toMatchObject({ approved: true, readyToLock: true });
    const page = await api(t, steward, 'get', `/datasets/${id}`, undefined, 200);
    expect(page).toMatchObject({ state: 'in_review', approved: true, readyToLock: true });
    await api(
      t,
      reviewer,
      'post',
      `/datasets/${id}/reviews`,
      { verdict: 'changes', comment: 'N = 2?' },
      201,
    );
    expect(await summary(id)).toMatchObject({ approved: false, readyToLock: false });
  });

  it('previews the hash-to-be, and locking with the confirmation gives exactly that hash', async () => {
    const id = await draftOf(t, author, runId);
    await inReview(t, author, id, reviewer);
    await approve(t, reviewer, id);
    await api(t, author, 'get', `/datasets/${id}/lock-preview`, undefined, 403);
    const preview = await api(t, steward, 'get', `/datasets/${id}/lock-preview`, undefined, 200);
    expect(preview.hash).toMatch(/^[0-9a-f]{64}$/);
    expect(preview.freezes.join('\n')).toMatch(/canonical table Z\(0\)\.\.Z\(\d+\)/);
    expect(preview.freezes.join('\n')).toContain('1 review and 0 comments');
    const wrong = { lockedAt: preview.lockedAt, hash: '0'.repeat(64) };
    const refused = await api(t, steward, 'post', `/datasets/${id}/lock`, wrong, 409);
    expect(refused.error.code).toBe('changed');
    const old = { lockedAt: '2020-01-01T00:00:00.000Z', hash: preview.hash };
    const stale = await api(t, steward, 'post', `/datasets/${id}/lock`, old, 400);
    expect(stale.error.field).toBe('lockedAt');
    const body = { lockedAt: preview.lockedAt, hash: preview.hash };
    const { hash } = await api(t, steward, 'post', `/datasets/${id}/lock`, body, 200);
    expect(hash).toBe(preview.hash);
    // The hash is the SHA-256 of the stored canonical text (FIPS 180-4 through node:crypto).
    const exported = await api(t, steward, 'get', `/datasets/${id}`, undefined, 200);
    expect(exported).toMatchObject({
      state: 'locked',
      hash: preview.hash,
      lockedAt: preview.lockedAt,
    });
    const row = await t.dataSource.query(`SELECT "canonical" FROM "dataset" WHERE "id" = ?`, [id]);
    expect(createHash('sha256').update(row[0].canonical).digest('hex')).toBe(preview.hash);
  });

  it('a review after the preview changes the hash: the confirmed lock is refused', async () => {
    const id = await draftOf(t, author, runId);
    await inReview(t, author, id, reviewer);
    await approve(t, reviewer, id);
    const preview = await api(t, steward, 'get', `/datasets/${id}/lock-preview`, undefined, 200);
    await api(t, steward, 'post', `/datasets/${id}/comments`, { body: 'Late remark.' }, 201);
    const body = { lockedAt: preview.lockedAt, hash: preview.hash };
    const refused = await api(t, steward, 'post', `/datasets/${id}/lock`, body, 409);
    expect(refused.error.code).toBe('changed');
    expect(await summary(id)).toMatchObject({ readyToLock: true });
  });
});
