import request from 'supertest';
import type { User } from '../db/entities/index.js';
import { bearer, createGas, finishedRun, startRun, TRAP_SPEC, waitForRun } from './gas-fixtures.js';
import { tokenFor, type TestApp } from './test-app.js';

/**
 * The trap with a reference row that is wrong on purpose: Z(1) = q^(1/2) + q^(3/2) + ... (the
 * one-particle trace of the trap, common practice), stated here with coefficient 2, so the
 * reference check is red at N = 1 and green at N = 0.
 */
export const RED_SPEC = {
  ...TRAP_SPEC,
  title: 'trap with a wrong reference row',
  reference: {
    normalization: '1',
    rows: [
      { N: 0, value: '1' },
      { N: 1, value: '2*q^(1/2) + O(q^2)' },
    ],
  },
} as const;

/** A finished run of `spec` in `studyId`, started by the token's user. */
export async function finishedRunOf(
  t: TestApp,
  token: string,
  studyId: string,
  spec: object,
): Promise<string> {
  const runId = await startRun(t, token, await createGas(t, token, studyId, spec));
  const run = await waitForRun(t, runId);
  if (run.status !== 'done') throw new Error(`run ended ${run.status}: ${run.error}`);
  return runId;
}

/** Calls the API as `user` and insists on `status`; returns the body. */
export async function api(
  t: TestApp,
  user: Pick<User, 'id'>,
  method: 'get' | 'post' | 'patch' | 'delete',
  path: string,
  body: object | undefined,
  status: number,
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- each test reads the answer it asked for
): Promise<any> {
  let req = request(t.app)
    [method](`/api${path}`)
    .set('Authorization', bearer(await tokenFor(t, user)));
  if (body !== undefined) req = req.send(body);
  const res = await req;
  if (res.status !== status) {
    throw new Error(
      `${method.toUpperCase()} ${path} answered ${res.status}, not ${status}: ${JSON.stringify(res.body)}`,
    );
  }
  return res.body;
}

/** A draft dataset of `runId`, created by `creator`; returns its id. */
export async function draftOf(
  t: TestApp,
  creator: User,
  runId: string,
  title = 'Trap, first look',
): Promise<string> {
  return (await api(t, creator, 'post', `/runs/${runId}/datasets`, { title }, 201)).id;
}

/** Puts the dataset in review with `reviewer` asked, as `requester`. */
export async function inReview(
  t: TestApp,
  requester: User,
  datasetId: string,
  reviewer: User,
): Promise<void> {
  await api(
    t,
    requester,
    'post',
    `/datasets/${datasetId}/review-requests`,
    { reviewerIds: [reviewer.id] },
    200,
  );
}

/** Approves as `reviewer` (who must have been asked). */
export async function approve(t: TestApp, reviewer: User, datasetId: string): Promise<void> {
  await api(
    t,
    reviewer,
    'post',
    `/datasets/${datasetId}/reviews`,
    { verdict: 'approve', comment: 'Reproduced.' },
    201,
  );
}

/** Takes a green run's dataset all the way to locked; returns `{id, hash}`. */
export async function lockedDataset(
  t: TestApp,
  people: { author: User; reviewer: User; steward: User },
  studyId: string,
): Promise<{ id: string; hash: string; runId: string }> {
  const runId = await finishedRun(t, await tokenFor(t, people.author), studyId);
  const id = await draftOf(t, people.author, runId);
  await inReview(t, people.author, id, people.reviewer);
  await approve(t, people.reviewer, id);
  const { hash } = await api(t, people.steward, 'post', `/datasets/${id}/lock`, undefined, 200);
  return { id, hash, runId };
}

/**
 * Waits until the app's quick worker answers a small compute (at most `timeoutMs`). Gas creation
 * tries the spec within a 1 s budget, which a cold worker under tsx on a loaded machine can
 * miss; tests of later features warm it first so they test their own feature.
 */
export async function warmWorkers(
  t: TestApp,
  user: Pick<User, 'id'>,
  timeoutMs = 60_000,
): Promise<void> {
  const token = await tokenFor(t, user);
  const until = Date.now() + timeoutMs;
  for (;;) {
    const res = await request(t.app)
      .post('/api/compute')
      .set('Authorization', bearer(token))
      .send({ spec: TRAP_SPEC });
    if (res.status === 200) return;
    if (Date.now() > until) throw new Error(`the compute preview still answers ${res.status}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}
