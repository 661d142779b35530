import type { Role } from '@traceloom/shared/api';
import request from 'supertest';
import type { User } from '../db/entities/index.js';
import {
  approve,
  draftOf,
  finishedRunOf,
  inReview,
  lockedDataset,
  RED_SPEC,
} from './dataset-fixtures.js';
import { TRAP_SPEC } from './gas-fixtures.js';
import { invitationKey } from './invitation-fixtures.js';
import type { MatrixCall } from './matrix-fixtures.js';
import { insertStudy, insertUser, tokenFor, type TestApp } from './test-app.js';

/**
 * Access of the dataset, review, audit and mailbox routes. Writes to a dataset are open to every
 * role at the route level (a locked dataset answers 409 to everyone, admin included); who may do
 * what is checked by the handler and shows below as 403 for the other roles.
 */
export function datasetAccess(
  all: readonly Role[],
  editors: readonly Role[],
): Record<string, 'public' | readonly Role[]> {
  return {
    'POST /runs/:id/datasets': editors,
    'GET /datasets': all,
    'POST /datasets/import': all,
    'GET /datasets/:id': all,
    'PATCH /datasets/:id': all,
    'DELETE /datasets/:id': all,
    'POST /datasets/:id/review-requests': all,
    'POST /datasets/:id/comments': all,
    'POST /datasets/:id/reviews': all,
    'POST /datasets/:id/waivers': all,
    'POST /datasets/:id/lock': all,
    'GET /datasets/:id/lock-preview': all,
    'POST /datasets/:id/withdraw': all,
    'POST /datasets/:id/verify': all,
    'GET /datasets/:id/export': all,
    'GET /review-requests': all,
    'GET /public/datasets/:hash': 'public',
    'GET /public/datasets/:hash/export': 'public',
    'GET /public/datasets/:hash/citation': 'public',
    'GET /audit': ['steward', 'admin'],
    'GET /dev/mailbox': ['admin'],
    'POST /invitations/accept': 'public',
  };
}

/**
 * Matrix fixtures for those routes: the call an actor of each role makes and what they must get
 * (the success status, or 403 where the contract gives that role no part in the action).
 */
export function datasetMatrix(
  app: () => TestApp,
  admin: () => User,
): Record<string, (actor: User) => Promise<MatrixCall>> {
  /** A study the actor may use, with a fresh reviewer and steward as members. */
  const setup = async (actor: User, spec: object = TRAP_SPEC) => {
    const reviewer = await insertUser(app(), 'reviewer');
    const steward = await insertUser(app(), 'steward');
    const owner = actor.role === 'reviewer' ? await insertUser(app(), 'author') : actor;
    const members = [reviewer, steward, ...(actor.role === 'reviewer' ? [actor] : [])];
    const studyId = await insertStudy(app(), owner, members);
    const runId = await finishedRunOf(app(), await tokenFor(app(), admin()), studyId, spec);
    return { studyId, runId, reviewer, steward };
  };
  const draft = async (actor: User, creatorIsActor: boolean, spec?: object) => {
    const s = await setup(actor, spec);
    const creator = creatorIsActor && actor.role !== 'reviewer' ? actor : admin();
    return { ...s, id: await draftOf(app(), creator, s.runId) };
  };
  let shared: Promise<{ id: string; hash: string }> | null = null;
  const locked = () => {
    shared ??= (async () => {
      const author = await insertUser(app(), 'author');
      const reviewer = await insertUser(app(), 'reviewer');
      const steward = await insertUser(app(), 'steward');
      const studyId = await insertStudy(app(), author, [reviewer, steward]);
      return lockedDataset(app(), { author, reviewer, steward }, studyId);
    })();
    return shared;
  };
  const exportOf = async (hash: string) =>
    JSON.parse(
      (await request(app().app).get(`/api/public/datasets/${hash}/export`)).text,
    ) as object;
  const only = (actor: User, roles: Role[], ok: number) => (roles.includes(actor.role) ? ok : 403);
  return {
    'POST /runs/:id/datasets': async (actor) => {
      const { runId } = await setup(actor);
      return { path: `/runs/${runId}/datasets`, body: { title: 'Trap table' }, status: 201 };
    },
    'GET /datasets': async (actor) => ({
      path: `/datasets?studyId=${(await setup(actor)).studyId}`,
      status: 200,
    }),
    'POST /datasets/import': async () => ({
      path: '/datasets/import',
      body: await exportOf((await locked()).hash),
      status: 200,
    }),
    'GET /datasets/:id': async (actor) => ({
      path: `/datasets/${(await draft(actor, false)).id}`,
      status: 200,
    }),
    'PATCH /datasets/:id': async (actor) => ({
      path: `/datasets/${(await draft(actor, true)).id}`,
      body: { title: 'Renamed table' },
      status: only(actor, ['author', 'steward', 'admin'], 200),
    }),
    'DELETE /datasets/:id': async (actor) => ({
      path: `/datasets/${(await draft(actor, true)).id}`,
      status: only(actor, ['author', 'steward', 'admin'], 204),
    }),
    'POST /datasets/:id/review-requests': async (actor) => {
      const d = await draft(actor, true);
      return {
        path: `/datasets/${d.id}/review-requests`,
        body: { reviewerIds: [d.reviewer.id] },
        status: only(actor, ['author', 'steward', 'admin'], 200),
      };
    },
    'POST /datasets/:id/comments': async (actor) => ({
      path: `/datasets/${(await draft(actor, false)).id}/comments`,
      body: { body: 'Row 2 looks right.', N: 2 },
      status: 201,
    }),
    'POST /datasets/:id/reviews': async (actor) => {
      const d = await draft(actor, false);
      const asked = actor.role === 'reviewer' || actor.role === 'steward' ? actor : d.reviewer;
      await inReview(app(), admin(), d.id, asked);
      return {
        path: `/datasets/${d.id}/reviews`,
        body: { verdict: 'approve', comment: 'Agrees with my table.' },
        status: only(actor, ['reviewer', 'steward'], 201),
      };
    },
    'POST /datasets/:id/waivers': async (actor) => ({
      path: `/datasets/${(await draft(actor, false, RED_SPEC)).id}/waivers`,
      body: { check: 'reference', N: 1, reason: 'The reference row has a known misprint.' },
      status: only(actor, ['steward'], 201),
    }),
    'POST /datasets/:id/lock': async (actor) => {
      const d = await draft(actor, false);
      await inReview(app(), admin(), d.id, d.reviewer);
      await approve(app(), d.reviewer, d.id);
      return { path: `/datasets/${d.id}/lock`, status: only(actor, ['steward'], 200) };
    },
    'GET /datasets/:id/lock-preview': async (actor) => {
      const d = await draft(actor, false);
      await inReview(app(), admin(), d.id, d.reviewer);
      await approve(app(), d.reviewer, d.id);
      return { path: `/datasets/${d.id}/lock-preview`, status: only(actor, ['steward'], 200) };
    },
    'POST /datasets/:id/withdraw': async (actor) => ({
      path: `/datasets/${(await draft(actor, false)).id}/withdraw`,
      status: only(actor, ['steward'], 200),
    }),
    'POST /datasets/:id/verify': async (actor) => ({
      path: `/datasets/${(await draft(actor, false)).id}/verify`,
      status: 200,
    }),
    'GET /datasets/:id/export': async (actor) => ({
      path: `/datasets/${(await draft(actor, false)).id}/export?format=csv`,
      status: 200,
    }),
    'GET /review-requests': async () => ({ path: '/review-requests', status: 200 }),
    'GET /public/datasets/:hash': async () => ({
      path: `/public/datasets/${(await locked()).hash}`,
      status: 200,
    }),
    'GET /public/datasets/:hash/export': async () => ({
      path: `/public/datasets/${(await locked()).hash}/export?format=latex`,
      status: 200,
    }),
    'GET /public/datasets/:hash/citation': async () => ({
      path: `/public/datasets/${(await locked()).hash}/citation?format=bibtex`,
      status: 200,
    }),
    'GET /audit': async () => ({ path: '/audit?targetType=dataset&limit=50', status: 200 }),
    'GET /dev/mailbox': async () => ({ path: '/dev/mailbox', status: 200 }),
    'POST /invitations/accept': async () => {
      const email = `welcome-${Date.now()}-${Math.random().toString(36).slice(2)}@example.test`;
      return {
        path: '/invitations/accept',
        body: { key: await invitationKey(app(), admin(), email), password: 'a good long password' },
        status: 204,
      };
    },
  };
}
