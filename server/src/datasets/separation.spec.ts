import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DatasetReviewRequest, type User } from '../db/entities/index.js';
import { api, approve, draftOf, inReview, warmWorkers } from '../testing/dataset-fixtures.js';
import { finishedRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

// Separation of duties (issue finding 8): one steward asked themself for a review, approved it
// and locked the author's dataset. Each step of that replay is refused now.
let t: TestApp;
let author: User;
let steward: User;
let otherSteward: User;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author');
  steward = await insertUser(t, 'steward');
  otherSteward = await insertUser(t, 'steward');
  studyId = await insertStudy(t, author, [steward, otherSteward]);
  await warmWorkers(t, author);
});
afterAll(() => t.close());

async function freshDraft(): Promise<string> {
  return draftOf(t, author, await finishedRun(t, await tokenFor(t, author), studyId));
}

describe('separation of duties', () => {
  it('refuses a review request a steward addresses to themself, naming the field', async () => {
    const id = await freshDraft();
    const body = await api(
      t,
      steward,
      'post',
      `/datasets/${id}/review-requests`,
      { reviewerIds: [otherSteward.id, steward.id] },
      400,
    );
    expect(body.error).toMatchObject({ code: 'invalid_input', field: 'reviewerIds.1' });
    expect(body.error.message).toMatch(/^reviewerIds\.1: you cannot ask yourself/);
    const after = await api(t, author, 'get', `/datasets/${id}`, undefined, 200);
    expect(after.state).toBe('draft');
  });

  it('refuses a verdict on a request the reviewer made of themself (a row from before)', async () => {
    const id = await freshDraft();
    await inReview(t, author, id, otherSteward);
    // A self-made request as an older server could have stored it.
    await t.dataSource.getRepository(DatasetReviewRequest).insert({
      dataset: { id },
      reviewer: { id: steward.id },
      requestedBy: { id: steward.id },
      createdAt: new Date().toISOString(),
    });
    const body = await api(
      t,
      steward,
      'post',
      `/datasets/${id}/reviews`,
      { verdict: 'approve', comment: 'Fine by me.' },
      403,
    );
    expect(body.error.message).toMatch(/asked for this review yourself/);
  });

  it('refuses the lock by the steward who approved; another steward may lock', async () => {
    const id = await freshDraft();
    await inReview(t, author, id, steward);
    await approve(t, steward, id);
    const seen = await api(t, steward, 'get', `/datasets/${id}`, undefined, 200);
    expect(seen.can.lock).toBe(false);
    expect(seen.lockBlockers).toContain('you approved it, so another steward must lock it');
    expect(seen.lockBlockers).toContain('no other reviewer has approved it yet');
    const refused = await api(t, steward, 'post', `/datasets/${id}/lock`, undefined, 403);
    expect(refused.error.code).toBe('approved_by_you');
    const still = await api(t, author, 'get', `/datasets/${id}`, undefined, 200);
    expect(still.state).toBe('in_review');

    const other = await api(t, otherSteward, 'get', `/datasets/${id}`, undefined, 200);
    expect(other.can.lock).toBe(true);
    expect(other.lockBlockers).toEqual([]);
    const { hash } = await api(t, otherSteward, 'post', `/datasets/${id}/lock`, undefined, 200);
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
  });
});
